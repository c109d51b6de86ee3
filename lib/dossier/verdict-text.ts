/**
 * Verdicts in words, for every place one is shown (editor, pages, stored HTML, letters,
 * exports): a failing check as a sentence with the bound and basis it failed on, and the
 * likely slip. Pure; takes stored rows of any contract version (version 1 rows lack
 * allowance, basis and hint).
 */
import { NOTICE } from "@/lib/orbit/notice";
import { basisText, displayUnit, hintSentence, quantityName } from "@/lib/orbit/labels";

export interface ExplainedRow {
  quantity: string;
  claimed: unknown;
  computed: unknown;
  unit: string;
  relativeError?: number | null;
  ok: boolean;
  allowance?: unknown;
  basis?: unknown;
  hint?: unknown;
}

function formatNumber(value: unknown): string {
  if (typeof value === "number") return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(6)));
  if (Array.isArray(value)) return `[${value.map(formatNumber).join(", ")}]`;
  return String(value);
}

/** "±0.05 km (precision as written)"; null for version 1 rows. */
export function allowanceText(row: ExplainedRow): string | null {
  const basis = basisText(row.basis);
  if (typeof row.allowance !== "number" || !Number.isFinite(row.allowance)) return basis ? `the ${basis}` : null;
  const u = displayUnit(row.unit);
  return `±${formatNumber(row.allowance)}${u ? ` ${u}` : ""}${basis ? ` (${basis})` : ""}`;
}

/** "Orbital period: claimed 5790 s, recomputed 5800.2 s, outside ±3 s (precision as written)" */
export function checkSentence(row: ExplainedRow): string {
  const u = displayUnit(row.unit);
  const withUnit = (v: unknown) => `${formatNumber(v)}${u ? ` ${u}` : ""}`;
  return `${quantityName(row.quantity)}: claimed ${withUnit(row.claimed)}, recomputed ${withUnit(row.computed)}, ${row.ok ? "within" : "outside"} ${allowanceText(row) ?? "tolerance"}`;
}

/** The likely slip of a failing row as a sentence, or null. */
export function rowHint(row: ExplainedRow): string | null {
  return row.ok ? null : hintSentence(row.hint, undefined, row.unit);
}

/** Rows of a stored result, whatever its shape. */
export function storedRows(result: unknown): ExplainedRow[] {
  const checks = typeof result === "object" && result !== null ? (result as { checks?: unknown }).checks : undefined;
  if (!Array.isArray(checks)) return [];
  return checks.filter(
    (c): c is ExplainedRow =>
      typeof c === "object" && c !== null && typeof (c as ExplainedRow).quantity === "string" && typeof (c as ExplainedRow).ok === "boolean",
  );
}

/** Each failing check of a stored result as one sentence with its hint: for letters and exports. */
export function failingSentences(result: unknown): string[] {
  return storedRows(result)
    .filter((r) => !r.ok)
    .map((r) => {
      const hint = rowHint(r);
      return `${checkSentence(r)}.${hint ? ` Likely slip: ${hint}` : ""}`;
    });
}

/**
 * The orbit-check contract's notice (version 2 puts it on every response): two-body
 * screening estimates, not flight-qualified analysis; the mission's own flight dynamics,
 * mission assurance and licensing authority govern. Taken from the engine itself, so
 * letters, e-mails and exports carry the same words as the API.
 */
export function orbitCheckNotice(): string {
  return NOTICE;
}
