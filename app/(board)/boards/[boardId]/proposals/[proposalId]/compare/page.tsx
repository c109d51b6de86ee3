import type { Metadata } from "next";
import Link from "next/link";
import { PageTitle, Panel } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { compareVersions } from "@/lib/decisions";
import { proposalAccess } from "@/lib/dal/assignments";
import { compareQuery } from "@/lib/validation/decisions";
import type { ClaimComparison, QuantityRow } from "@/lib/decisions/compare";
import { ReassignButton } from "./_components/reassign-button";
import { CONSISTENT_MEANS, displayUnit, kindLabel, quantityLabel } from "@/lib/orbit/labels";

export const metadata: Metadata = { title: "Compare versions" };

const statusClass = { consistent: "bg-holds-100 text-holds-700", inconsistent: "bg-drift-100 text-drift-700", invalid: "bg-void-100 text-void-700" } as const;
const statusText = { consistent: "consistent", inconsistent: "inconsistent", invalid: "cannot be evaluated" } as const;
const changeText: Record<ClaimComparison["change"], string> = {
  added: "new in this version",
  removed: "removed",
  "verdict-changed": "verdict changed",
  "values-changed": "values changed",
  unchanged: "unchanged",
};
const num = (v: number | null | undefined) => (v === null || v === undefined ? "—" : Number.isInteger(v) ? String(v) : v.toPrecision(6));

function Verdict({ status }: { status: keyof typeof statusClass | undefined }) {
  if (!status) return <span className="text-ink-400">—</span>;
  return <span className={`rounded-chip px-2 py-0.5 text-xs font-semibold ${statusClass[status]}`}>{statusText[status]}</span>;
}

function Values({ side }: { side: QuantityRow["before"] }) {
  if (!side) return <span className="text-ink-400">—</span>;
  return (
    <span className="font-mono text-xs">
      claimed {num(side.claimed)} · server {num(side.computed)}
      {side.ok === false ? <span className="ml-1 text-drift-700">✗</span> : side.ok ? <span className="ml-1 text-holds-700">✓</span> : null}
      {side.hint ? (
        <span className="block font-sans text-ink-800" data-hint="">
          Likely slip: {side.hint}
        </span>
      ) : null}
    </span>
  );
}

/** One version's side of a claim: its verdict and each quantity's claimed and recomputed value. */
function ClaimSide({ claim, side, className }: { claim: ClaimComparison; side: "before" | "after"; className: string }) {
  return (
    <td className={className}>
      <Verdict status={claim[side]?.status} />
      <ul className="mt-1 space-y-0.5">
        {claim.quantities.map((q) => (
          <li key={q.quantity}>
            <span className="text-xs text-ink-600">{quantityLabel(q.quantity, displayUnit(q.unit))}:</span> <Values side={q[side]} />
          </li>
        ))}
      </ul>
    </td>
  );
}

export default async function ComparePage({
  params,
  searchParams,
}: {
  params: Promise<{ boardId: string; proposalId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { boardId, proposalId } = await params;
  const user = await pageUser(`/boards/${boardId}/proposals/${proposalId}/compare`);
  const access = await orNotFound(proposalAccess(user, boardId, proposalId));
  const raw = await searchParams;
  const latest = access.proposal.latestVersion;
  const parsed = compareQuery.safeParse({ from: raw.from ?? Math.max(1, latest - 1), to: raw.to ?? latest });
  if (latest < 1 || !parsed.success) {
    return (
      <div className="space-y-4">
        <PageTitle eyebrow="Compare versions" title={access.proposal.title} />
        <p className="text-ink-700">{latest < 1 ? "Nothing has been submitted yet." : "Give two version numbers, e.g. ?from=1&to=2."}</p>
      </div>
    );
  }
  const cmp = await orNotFound(compareVersions(user, boardId, proposalId, parsed.data.from, parsed.data.to));
  const reassignable = cmp.reviewers?.filter((r) => r.active && !r.onLaterVersion) ?? [];
  // Shown while the later version is open for review, even once everyone is assigned, so the
  // result of a reassignment stays on screen after the page refreshes.
  const canReassign = cmp.reviewers !== null && cmp.to.number === cmp.proposal.latestVersion && cmp.to.number > cmp.from.number && !cmp.to.decision;

  return (
    <div className="space-y-6">
      <PageTitle eyebrow="Compare versions" title={cmp.proposal.title}>
        <p className="text-sm">
          Version {cmp.from.number}
          {cmp.from.decision ? ` (${cmp.from.decision.outcomeLabel})` : ""} → version {cmp.to.number}
          {cmp.to.decision ? ` (${cmp.to.decision.outcomeLabel})` : ""} ·{" "}
          <Link className="text-trajectory-700 underline" href={`/boards/${boardId}/proposals/${proposalId}/decision`}>
            decision page
          </Link>
        </p>
        <nav aria-label="Versions" className="mt-2 flex flex-wrap gap-2 text-sm">
          {cmp.versions.slice(1).map((v) => (
            <Link
              key={v.number}
              className="rounded-chip border border-ink-200 px-2 py-0.5"
              href={`/boards/${boardId}/proposals/${proposalId}/compare?from=${v.number - 1}&to=${v.number}`}
            >
              {v.number - 1} → {v.number}
            </Link>
          ))}
        </nav>
      </PageTitle>

      <Panel
        title="Orbit claims side by side"
        description="Paired by block, then by label. Server values are two-body screening estimates, not a substitute for high-fidelity analysis."
      >
        <div className="overflow-x-auto">
          <table className="w-full text-left text-sm">
            <caption className="sr-only">Orbit claims of both versions</caption>
            <thead>
              <tr className="text-xs uppercase text-ink-500">
                <th className="py-1 pr-3">Claim</th>
                <th className="py-1 pr-3">Change</th>
                <th className="py-1 pr-3">Version {cmp.from.number}</th>
                <th className="py-1">Version {cmp.to.number}</th>
              </tr>
            </thead>
            <tbody>
              {cmp.claims.map((c, i) => (
                <tr key={`${c.before?.blockId ?? ""}-${c.after?.blockId ?? ""}-${i}`} className="border-t border-ink-100 align-top" data-testid="claim-row">
                  <td className="py-2 pr-3">
                    <span className="font-semibold text-ink-900">{c.label}</span> <span className="text-xs text-ink-500">({kindLabel(c.kind)})</span>
                  </td>
                  <td className="py-2 pr-3 text-ink-700">{changeText[c.change]}</td>
                  <ClaimSide claim={c} side="before" className="py-2 pr-3" />
                  <ClaimSide claim={c} side="after" className="py-2" />
                </tr>
              ))}
              {cmp.claims.length === 0 ? (
                <tr>
                  <td colSpan={4} className="py-2 text-ink-500">
                    Neither version states orbit claims.
                  </td>
                </tr>
              ) : null}
            </tbody>
          </table>
        </div>
        <p className="mt-3 text-xs text-ink-600" data-consistent-means="">
          {CONSISTENT_MEANS}
        </p>
      </Panel>

      <Panel
        title="Text changes"
        description={`${cmp.text.wordsAdded} word${cmp.text.wordsAdded === 1 ? "" : "s"} added, ${cmp.text.wordsRemoved} removed (word by word, on the plain text)`}
      >
        <div className="whitespace-pre-wrap rounded-panel border border-ink-200 bg-paper p-4 font-sans text-sm leading-6 text-ink-900" data-testid="text-diff">
          {cmp.text.changes.map((c, i) =>
            c.kind === "added" ? (
              <ins key={i} className="mx-px bg-holds-100 px-0.5 text-holds-700 no-underline">
                {c.text}
              </ins>
            ) : c.kind === "removed" ? (
              <del key={i} className="mx-px bg-void-100 px-0.5 text-void-700">
                {c.text}
              </del>
            ) : (
              <span key={i}>{c.text}</span>
            ),
          )}
        </div>
      </Panel>

      {cmp.reviewers ? (
        <Panel title="Reviewers" description={`Who reviewed version ${cmp.from.number}`}>
          <ul className="mb-4 text-sm">
            {cmp.reviewers.map((r) => (
              <li key={r.id}>
                {r.name} {r.onLaterVersion ? <span className="text-holds-700">— assigned to version {cmp.to.number}</span> : null}
                {!r.active ? <span className="text-ink-500"> — no longer a reviewer on this board</span> : null}
              </li>
            ))}
          </ul>
          {canReassign ? <ReassignButton boardId={boardId} proposalId={proposalId} names={reassignable.map((r) => r.name)} toVersion={cmp.to.number} /> : null}
        </Panel>
      ) : null}
    </div>
  );
}
