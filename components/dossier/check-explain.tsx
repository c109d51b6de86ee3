// What a verdict says, in words, wherever one is shown: each failing check as a sentence
// (claimed as written, recomputed, the bound applied and its basis, and the likely slip),
// and the line that says what "consistent" means under which tolerance policy.
import { allowanceText, checkSentence, rowHint, type ExplainedRow } from "@/lib/dossier/verdict-text";
import { CONSISTENT_MEANS, policySummary, quantityLabel } from "@/lib/orbit/labels";

export type { ExplainedRow };

const pct = (f: number) => {
  const p = f * 100;
  return `${p >= 10 ? p.toFixed(0) : p >= 0.1 ? p.toFixed(2) : p.toPrecision(1)} %`;
};

/** The verdict cell of a check row: within/outside, bound and basis, and the hint sentence. */
export function CheckRowDetail({ row }: { row: ExplainedRow }) {
  const allowance = allowanceText(row);
  const hint = rowHint(row);
  return (
    <span className="block space-y-0.5" data-check-quantity={row.quantity} data-check-ok={row.ok}>
      <span className="block font-semibold">
        {row.ok ? "within" : "outside"} {allowance ?? "tolerance"}
      </span>
      {typeof row.relativeError === "number" ? <span className="block text-2xs text-ink-600">{pct(row.relativeError)} off</span> : null}
      {hint ? (
        <span className="block text-2xs text-ink-800" data-hint={typeof row.hint === "object" && row.hint ? String((row.hint as { code?: unknown }).code) : ""}>
          Likely slip: {hint}
        </span>
      ) : null}
    </span>
  );
}

/** Failing checks of a stored verdict, each as a sentence with its hint. */
export function FailingChecks({ checks, className }: { checks: readonly ExplainedRow[] | undefined; className?: string }) {
  const failing = (checks ?? []).filter((c) => !c.ok);
  if (failing.length === 0) return null;
  return (
    <ul className={className ?? "mt-1 space-y-1 text-xs text-ink-700"}>
      {failing.map((c) => {
        const hint = rowHint(c);
        return (
          <li key={c.quantity} data-failing-check={c.quantity}>
            <span title={quantityLabel(c.quantity)}>{checkSentence(c)}.</span>
            {hint ? (
              <span className="block text-ink-800" data-hint="">
                Likely slip: {hint}
              </span>
            ) : null}
          </li>
        );
      })}
    </ul>
  );
}

/** The line beside every verdict: what "consistent" means, and the policy it was checked at. */
export function ConsistentMeaning({
  tolerance,
  className,
}: {
  tolerance?: { relative?: number; absolute?: Record<string, number | undefined> };
  className?: string;
}) {
  return (
    <p className={className ?? "text-2xs text-ink-600"} data-consistent-means="">
      {CONSISTENT_MEANS} {tolerance ? <span data-policy="">This call: {policySummary(tolerance)}.</span> : null}
    </p>
  );
}
