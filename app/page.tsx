import Link from "next/link";
import { BrandMark } from "@/components/brand-mark";

const steps = [
  {
    title: "Proposers write the dossier",
    body: "A rich-text dossier with live orbit-check blocks: given values, claimed values, what the two-body engine recomputes, and a to-scale plot of the conic. Supporting files go straight to object storage.",
  },
  {
    title: "The server recomputes every claim",
    body: "At submission VisViva freezes a version and recomputes each period, Δv, sun-synchronous inclination, propellant budget, eclipse and contact time with the call's tolerance, and flags what does not hold.",
  },
  {
    title: "Reviewers score and raise review items",
    body: "Assigned, conflict-free reviewers read the frozen version beside the server's verdicts, score the rubric and anchor review items to the text they question.",
  },
  {
    title: "The chair decides",
    body: "Scores side by side, open review items by severity, orbit-check flags; then accept, revise or decline, with a decision letter that reaches the proposers by e-mail and as a PDF.",
  },
];

export default function LandingPage() {
  return (
    <div className="space-y-12">
      <section className="grid gap-8 rounded-sheet bg-ink-950 px-8 py-12 text-ink-50 md:grid-cols-[1fr_16rem]">
        <div className="space-y-4">
          <p className="text-sm font-semibold uppercase tracking-widest text-trajectory-400">Mission review boards</p>
          <h1 className="text-3xl font-bold leading-tight">Judge mission proposals on their engineering, not on arithmetic you have to redo.</h1>
          <p className="max-w-2xl text-lg text-ink-200">
            VisViva runs a design review board end to end — calls, dossiers, reviewer assignment, rubric scoring, review items and decision letters — and
            recomputes every orbit and Δv claim a dossier makes on the server.
          </p>
          <div className="flex gap-3 pt-2">
            <Link href="/sign-in" className="rounded-chip bg-trajectory-600 px-4 py-2 font-semibold text-white hover:bg-trajectory-700">
              Sign in to your board
            </Link>
            <Link href="/tools/orbit-check" className="rounded-chip border border-ink-500 px-4 py-2 font-semibold hover:border-trajectory-400">
              Try an orbit check
            </Link>
          </div>
        </div>
        <BrandMark className="hidden h-56 w-56 self-center text-trajectory-400 md:block" />
      </section>
      <section aria-labelledby="how" className="space-y-4">
        <h2 id="how" className="text-xl font-semibold">
          How a round runs
        </h2>
        <ol className="grid gap-4 md:grid-cols-2">
          {steps.map((step, index) => (
            <li key={step.title} className="rounded-panel border border-ink-200 bg-white p-5 shadow-panel">
              <p className="font-mono text-sm text-trajectory-600">{String(index + 1).padStart(2, "0")}</p>
              <h3 className="mt-1 text-lg font-semibold">{step.title}</h3>
              <p className="mt-2 text-ink-700">{step.body}</p>
            </li>
          ))}
        </ol>
      </section>
      <section className="rounded-panel border border-drift-500/40 bg-drift-100 p-5 text-sm text-ink-800">
        <h2 className="font-semibold">What the checks are, and are not</h2>
        <p className="mt-1">
          Orbit checks use the two-body (Kepler) problem with J2 secular rates where stated: screening estimates that catch inconsistent numbers, not a
          substitute for high-fidelity analysis. Debris mitigation and licensing rules are those of the operator&apos;s own authority.
        </p>
      </section>
    </div>
  );
}
