// The call's requirements judged on one claim: met / not met / not evaluated, in words first
// (colour and mark repeat the words, never replace them).
import { REQUIREMENT_STATUS_LABELS, rowBand, type RequirementOutcome, type RequirementRow, type RequirementStatus } from "@/lib/requirements/types";

const STYLE: Record<RequirementStatus, { className: string; mark: string }> = {
  met: { className: "bg-holds-100 text-holds-700 border-holds-500", mark: "✓" },
  notMet: { className: "bg-void-100 text-void-700 border-void-500", mark: "✗" },
  notEvaluated: { className: "bg-ink-50 text-ink-700 border-ink-300", mark: "–" },
};

export function RequirementBadge({ status }: { status: RequirementStatus }) {
  const s = STYLE[status];
  return (
    <span data-requirement={status} className={`inline-flex items-center gap-1 rounded-chip border px-2 py-0.5 text-xs font-semibold ${s.className}`}>
      <span aria-hidden className="font-mono">
        {s.mark}
      </span>
      Requirement {REQUIREMENT_STATUS_LABELS[status]}
    </span>
  );
}

/** A figure against its limit, e.g. "12.0 % (at least 10 %)". */
export function formatRow(row: RequirementRow): string {
  const f = (v: number) => {
    if (row.unit === "fraction") return `${Number((v * 100).toFixed(1))} %`;
    if (row.unit === "s") return `${Number((v / 60).toFixed(1))} min`;
    return `${Number(v.toPrecision(3))} ${row.unit}`;
  };
  const actual = row.actual === null ? "not computed" : f(row.actual);
  return `${actual} (${row.sense === "min" ? "at least" : "at most"} ${f(row.required)})`;
}

const BAND: Record<ReturnType<typeof rowBand>, { text: string; className: string }> = {
  below: { text: "below the requirement", className: "text-void-700" },
  close: { text: "within 5 points of the requirement", className: "text-drift-700" },
  clear: { text: "clear of the requirement", className: "text-holds-700" },
  unknown: { text: "not computed", className: "text-ink-600" },
};

export function RequirementRowLine({ row }: { row: RequirementRow }) {
  const band = rowBand(row);
  return (
    <li data-band={band} className={`text-xs ${BAND[band].className}`}>
      {row.label}: {formatRow(row)} — {BAND[band].text}
    </li>
  );
}

export function RequirementFlags({ outcomes, showRows = false }: { outcomes: readonly RequirementOutcome[] | undefined; showRows?: boolean }) {
  if (!outcomes || outcomes.length === 0) return null;
  return (
    <ul className="mt-2 space-y-1" aria-label="Call requirements">
      {outcomes.map((o) => (
        <li key={o.requirementId} data-requirement-outcome={o.status} className="text-xs text-ink-800">
          <RequirementBadge status={o.status} /> <span className="font-semibold">{o.title}</span>: {o.reason}
          {showRows && o.rows.length > 0 ? (
            <ul className="ml-4 mt-1 space-y-0.5">
              {o.rows.map((r) => (
                <RequirementRowLine key={r.label} row={r} />
              ))}
            </ul>
          ) : null}
        </li>
      ))}
    </ul>
  );
}
