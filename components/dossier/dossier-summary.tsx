// Beside the text: every claim with its verdict, and the Δv budget (maneuver claims against
// the propulsion claim, with the margin). Works for the live draft and for a stored version.
import { SCREENING_CAUTION } from "@/lib/orbit";
import type { DeltaVBudget } from "@/lib/dossier/claims";
import { kindLabel } from "@/lib/orbit/labels";
import { storedRows } from "@/lib/dossier/verdict-text";
import { ConsistentMeaning, FailingChecks } from "./check-explain";
import { VerdictBadge, type Verdict } from "./verdict-badge";

export interface SummaryItem {
  blockId: string;
  label: string;
  kind: string;
  status: Verdict;
  /** The check rows (live or stored), so failing ones read as sentences with their hint. */
  result?: unknown;
}

const kms = (v: number) => `${v.toFixed(3)} km/s`;

/** Margin against the call's: red below, amber within 5 points, green above, always with words. */
function marginBand(margin: number, required: number): { text: string; className: string } {
  const req = `${(required * 100).toFixed(0)} %`;
  if (margin < required) return { text: required > 0 ? `below the call's ${req}` : "negative: the budget does not close", className: "text-void-700" };
  if (margin - required <= 0.05) return { text: `within 5 points of ${req}`, className: "text-drift-700" };
  return { text: `above ${req}`, className: "text-holds-700" };
}

export function DossierSummary({
  items,
  budget,
  source,
  requiredMargin = 0,
  tolerance,
}: {
  items: SummaryItem[];
  budget: DeltaVBudget;
  source: "live" | "server";
  /** The call's minimum deterministic Δv margin (fraction); 0 without a requirement. */
  requiredMargin?: number;
  tolerance?: { relative?: number; absolute?: Record<string, number | undefined> };
}) {
  const band = budget.margin === null ? null : marginBand(budget.margin, requiredMargin);
  const counts = { consistent: 0, inconsistent: 0, invalid: 0 };
  for (const i of items) counts[i.status] += 1;
  return (
    <aside aria-labelledby="dossier-summary-heading" className="space-y-4 rounded-panel border border-ink-200 bg-white p-4 shadow-panel">
      <div>
        <h2 id="dossier-summary-heading" className="text-base font-semibold text-ink-900">
          {source === "live" ? "Claims (live check)" : "Claims (server check)"}
        </h2>
        <p className="text-xs text-ink-600">
          {items.length === 0
            ? "No orbit-check blocks yet."
            : `${counts.consistent} consistent, ${counts.inconsistent} inconsistent, ${counts.invalid} cannot be evaluated.`}
        </p>
      </div>
      {items.length > 0 ? (
        <ol className="space-y-1.5 text-sm">
          {items.map((i) => (
            <li key={i.blockId} data-summary-block-id={i.blockId}>
              <div className="flex items-start justify-between gap-2">
                <a href={`#orbit-check-${i.blockId}`} className="text-trajectory-700 hover:underline">
                  {i.label || `unnamed ${kindLabel(i.kind).toLowerCase()} block`}
                  <span className="ml-1 text-2xs text-ink-500">{kindLabel(i.kind)}</span>
                </a>
                <VerdictBadge status={i.status} />
              </div>
              {i.result !== undefined ? <FailingChecks checks={storedRows(i.result)} className="mt-0.5 space-y-0.5 text-2xs text-ink-700" /> : null}
            </li>
          ))}
        </ol>
      ) : null}
      <section aria-labelledby="dv-budget-heading">
        <h3 id="dv-budget-heading" className="text-sm font-semibold text-ink-900">
          Δv budget
        </h3>
        {budget.maneuvers.length === 0 && budget.available === null ? (
          <p className="text-xs text-ink-600">
            Add maneuver claims (Hohmann, bi-elliptic, plane change, escape) and a propulsion claim (rocket or Δv budget) to see the margin.
          </p>
        ) : (
          <table className="mt-1 w-full text-xs">
            <tbody>
              {budget.maneuvers.map((m) => (
                <tr key={m.blockId} className="border-b border-ink-100">
                  <th scope="row" className="py-0.5 text-left font-normal">
                    {m.label}
                  </th>
                  <td className="text-right font-mono">{kms(m.deltaV)}</td>
                </tr>
              ))}
              <tr className="border-b border-ink-200 font-semibold">
                <th scope="row" className="py-0.5 text-left">
                  Required (recomputed)
                </th>
                <td className="text-right font-mono">{kms(budget.required)}</td>
              </tr>
              <tr>
                <th scope="row" className="py-0.5 text-left font-normal">
                  Available{budget.propulsionLabel ? ` (${budget.propulsionLabel})` : ""}
                </th>
                <td className="text-right font-mono">{budget.available !== null ? kms(budget.available) : "no propulsion claim"}</td>
              </tr>
              <tr className="font-semibold">
                <th scope="row" className="py-0.5 text-left">
                  Margin
                </th>
                <td className={`text-right font-mono ${band?.className ?? ""}`} data-dv-margin>
                  {budget.margin !== null ? `${(budget.margin * 100).toFixed(1)} %` : "—"}
                  {band ? <span className="block font-sans text-2xs">{band.text}</span> : null}
                </td>
              </tr>
            </tbody>
          </table>
        )}
      </section>
      {items.length > 0 ? <ConsistentMeaning tolerance={tolerance} /> : null}
      <p className="text-2xs text-ink-500">{SCREENING_CAUTION}</p>
    </aside>
  );
}
