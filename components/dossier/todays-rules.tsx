// A submitted version's stored record (labelled with the contract version that produced
// it) and, for chairs, the same blocks under today's rules, side by side. The record is
// never changed; the recomputation is only shown.
import Link from "next/link";
import type { Rerun } from "@/lib/dossier/rerun";
import { checkSentence, rowHint } from "@/lib/dossier/verdict-text";
import { kindLabel, policySummary, quantityName } from "@/lib/orbit/labels";
import { VerdictBadge } from "./verdict-badge";

/** "Recorded under orbit-check contract version 1 (checked at 1 %, angles 0.01°)". */
export function RecordLabel({
  contractVersions,
  tolerance,
}: {
  contractVersions: number[];
  tolerance: { relative?: number; absolute?: Record<string, number | undefined> } | null;
}) {
  if (contractVersions.length === 0) return null;
  const versions = [...new Set(contractVersions)].sort();
  return (
    <p className="text-xs text-ink-700" data-record-contract-version={versions.join(",")}>
      Verdicts recorded at submission under orbit-check contract version {versions.join(" and ")}
      {tolerance ? ` (${policySummary(tolerance)})` : ""}. The record is kept as it was.
    </p>
  );
}

export function TodaysRulesLink({ href, active }: { href: string; active: boolean }) {
  return active ? null : (
    <Link
      href={href}
      className="inline-block rounded-chip border border-trajectory-500 px-3 py-1 text-sm font-semibold text-trajectory-700 hover:bg-trajectory-100"
    >
      Run today&apos;s rules on this version
    </Link>
  );
}

export function TodaysRulesPanel({ rerun, closeHref }: { rerun: Rerun; closeHref: string }) {
  return (
    <section aria-labelledby="todays-rules-heading" id="todays-rules" className="rounded-panel border border-trajectory-500/50 bg-white p-4 shadow-panel">
      <div className="mb-2 flex flex-wrap items-start justify-between gap-2">
        <div>
          <h2 id="todays-rules-heading" className="text-lg font-semibold text-ink-900">
            Today&apos;s rules beside the record
          </h2>
          <p className="text-sm text-ink-600" data-todays-policy="">
            Recomputed now under contract version {rerun.contractVersion}, {policySummary(rerun.tolerance)} (the call&apos;s current policy). Nothing in the
            record changes.
          </p>
        </div>
        <Link href={closeHref} className="text-sm text-trajectory-700 underline">
          Hide today&apos;s rules
        </Link>
      </div>
      <p className="mb-2 text-sm font-semibold" data-todays-differing={rerun.differing}>
        {rerun.differing === 0 ? "No block would get a different verdict today." : `${rerun.differing} of ${rerun.blocks.length} blocks would differ today.`}
      </p>
      <table className="w-full text-left text-sm">
        <thead className="text-xs text-ink-600">
          <tr>
            <th scope="col" className="py-1">
              Block
            </th>
            <th scope="col">Record</th>
            <th scope="col">Today&apos;s rules</th>
            <th scope="col">Differences</th>
          </tr>
        </thead>
        <tbody>
          {rerun.blocks.map((b) => (
            <tr key={b.blockId} className="border-t border-ink-100 align-top" data-rerun-block={b.blockId}>
              <th scope="row" className="py-1 pr-2 font-normal">
                {b.label || kindLabel(b.kind)}
                <span className="block text-2xs text-ink-500">{kindLabel(b.kind)}</span>
              </th>
              <td className="pr-2" data-rerun-stored={b.storedStatus ?? "none"}>
                {b.storedStatus ? <VerdictBadge status={b.storedStatus} /> : "not recorded"}
                {b.storedContractVersion !== null ? <span className="block text-2xs text-ink-500">contract version {b.storedContractVersion}</span> : null}
              </td>
              <td className="pr-2" data-rerun-today={b.todayStatus}>
                <VerdictBadge status={b.todayStatus} />
              </td>
              <td className="text-xs">
                {b.changes.length === 0 ? (
                  <span className="text-ink-500">same</span>
                ) : (
                  <ul className="space-y-1">
                    {b.changes.map((c) => {
                      const hint = c.today ? rowHint(c.today) : null;
                      return (
                        <li key={c.quantity} data-rerun-change={c.quantity}>
                          <span className="font-semibold">{quantityName(c.quantity)}</span>: recorded{" "}
                          {c.stored ? (c.stored.ok ? "within" : "outside") : "not checked"}, today{" "}
                          {c.today ? (c.today.ok ? "within" : "outside") : "not checked"}.
                          {c.today ? <span className="block text-ink-700">{checkSentence(c.today)}.</span> : null}
                          {hint ? <span className="block text-ink-800">Likely slip: {hint}</span> : null}
                        </li>
                      );
                    })}
                  </ul>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
