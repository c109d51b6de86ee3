import { OrbitCheckConsoleLoader } from "@/components/orbit-check-console/orbit-check-console-loader";
import contractExample from "@/lib/orbit/examples/contract-example.json";
import invalidClaim from "@/lib/orbit/examples/invalid-claim.json";
import missionDossier from "@/lib/orbit/examples/mission-dossier.json";
import wrongClaim from "@/lib/orbit/examples/wrong-claim.json";

const examples = [
  { name: "an invented dossier's claims", request: missionDossier },
  { name: "the contract's example", request: contractExample },
  { name: "a claim off by more than the tolerance", request: wrongClaim },
  { name: "a claim that cannot be evaluated", request: invalidClaim },
].map((e) => ({ name: e.name, request: JSON.stringify(e.request, null, 2) }));

export const metadata = { title: "Orbit check" };

export default function OrbitCheckToolPage() {
  return (
    <div className="space-y-6">
      <header className="space-y-2">
        <h1 className="text-2xl font-semibold">Orbit check</h1>
        <p className="max-w-3xl text-ink-700">
          Paste an orbit-check request and see, claim by claim, what the engine recomputes and whether each claimed value holds within the tolerance. The same
          engine runs at <code className="font-mono text-sm">POST /api/v1/orbit-checks</code>, on the command line (
          <code className="font-mono text-sm">npm run --silent orbit-check &lt; request.json</code>) and on every dossier submission. Nothing you type here
          leaves your browser.
        </p>
      </header>
      <OrbitCheckConsoleLoader examples={examples} />
    </div>
  );
}
