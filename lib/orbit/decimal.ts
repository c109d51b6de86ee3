/**
 * Claimed values as written: plain decimal strings ("3.9", "3.90", "86400", "8.64e4") and
 * their precision allowance, half a unit in the last written digit (contract version 2,
 * "Stated precision"). A JSON number counts as written in its shortest round-trip decimal
 * form, which is what JavaScript's Number → string conversion produces (ECMA-262,
 * Number::toString).
 */

/** A plain decimal: optional sign, digits with at most one point, optional exponent. */
const PLAIN_DECIMAL = /^([+-]?)(\d+)?(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/;

export interface ParsedDecimal {
  ok: true;
  /** The number the text denotes. */
  value: number;
  /** Half a unit in the last written digit, in the value's own unit. */
  allowance: number;
  /** The text as read (surrounding spaces removed). */
  text: string;
}

export interface DecimalError {
  ok: false;
  /** Why the text is not a plain decimal, for a message that names the field. */
  message: string;
}

/** 0.5 · 10^k computed without the rounding of 10 ** -k for negative k. */
function halfUnit(k: number): number {
  return k >= 0 ? 0.5 * 10 ** k : 0.5 / 10 ** -k;
}

/**
 * Parses a plain decimal string. Accepts "3.9", "-0.25", ".5", "86400", "8.64e4", "1E-3";
 * refuses units ("3.9 km/s"), empty text, hexadecimal ("0x10"), doubled signs ("--1"),
 * digit groups ("86 400", "86,400") and values that overflow ("1e400").
 */
export function parseDecimal(input: string): ParsedDecimal | DecimalError {
  const text = input.trim();
  if (text.length === 0) return { ok: false, message: "is empty; write a number such as 3.9" };
  if (text.length > 64) return { ok: false, message: "is longer than 64 characters; write a plain number such as 3.9" };
  const m = PLAIN_DECIMAL.exec(text);
  if (!m || (m[2] === undefined && (m[3] === undefined || m[3] === ""))) {
    const hint = /\d\s*[a-zA-Z°%/]/.test(text)
      ? "; remove the unit (the unit is fixed per quantity)"
      : /\d[\s,']\d/.test(text)
        ? "; write the digits without separators"
        : "";
    return { ok: false, message: `is not a plain decimal number (got ${JSON.stringify(text)})${hint}; write it like 3.9, 86400 or 8.64e4` };
  }
  const value = Number(text);
  if (!Number.isFinite(value)) return { ok: false, message: `is too large to be a number (got ${JSON.stringify(text)})` };
  const decimals = m[3]?.length ?? 0;
  const exponent = m[4] === undefined ? 0 : Number(m[4]);
  if (!Number.isFinite(exponent)) return { ok: false, message: `has an exponent out of range (got ${JSON.stringify(text)})` };
  return { ok: true, value, allowance: halfUnit(exponent - decimals), text };
}

/**
 * Parses a plain decimal string or throws an Error whose message names the field, e.g.
 * `claimed.period is not a plain decimal number (got "3.9 km/s"); remove the unit …`.
 */
export function parsePlainDecimal(input: string, field = "value"): number {
  const r = parseDecimal(input);
  if (!r.ok) throw new Error(`${field} ${r.message}`);
  return r.value;
}

/** Shortest round-trip decimal form of a finite number (JavaScript's own conversion). */
export function shortestDecimal(x: number): string {
  return String(x);
}

/**
 * Precision allowance of a written value: half a unit in its last written digit.
 * "3.9" → 0.05, "3.90" → 0.005, "86400" → 0.5, "8.64e4" → 50; the JSON number 3.9 → 0.05.
 * Returns null for text that is not a plain decimal or for non-finite numbers.
 */
export function precisionAllowance(written: string | number): number | null {
  if (typeof written === "number") {
    if (!Number.isFinite(written)) return null;
    const r = parseDecimal(shortestDecimal(written));
    return r.ok ? r.allowance : null;
  }
  const r = parseDecimal(written);
  return r.ok ? r.allowance : null;
}

/** Reads a claimed scalar (JSON number or plain decimal string) with its allowance. */
export function readClaimedNumber(value: unknown): { value: number; allowance: number } | { error: string } {
  if (typeof value === "number") {
    if (!Number.isFinite(value)) return { error: "must be a finite number" };
    return { value, allowance: precisionAllowance(value) ?? 0 };
  }
  if (typeof value === "string") {
    const r = parseDecimal(value);
    return r.ok ? { value: r.value, allowance: r.allowance } : { error: r.message };
  }
  return { error: `must be a number or a decimal string (got ${value === null ? "null" : Array.isArray(value) ? "an array" : typeof value})` };
}
