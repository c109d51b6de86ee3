/**
 * Values as proposers write them: a decimal string in a unit of their choice (a period in
 * minutes, an altitude in metres), kept as typed in the orbit-check block and converted
 * here to the contract's unit. The written precision (half a unit in the last written
 * digit, as the orbit-check contract version 2 defines it) is scaled by the same factor.
 * Pure: the editor and the server use the same conversion.
 */

/** Units people may type in, per contract unit, with the factor to the contract unit. */
export const UNIT_CHOICES: Readonly<Record<string, readonly { unit: string; factor: number }[]>> = {
  s: [
    { unit: "s", factor: 1 },
    { unit: "min", factor: 60 },
    { unit: "h", factor: 3600 },
    { unit: "day", factor: 86400 },
  ],
  km: [
    { unit: "km", factor: 1 },
    { unit: "m", factor: 0.001 },
  ],
  "km/s": [
    { unit: "km/s", factor: 1 },
    { unit: "m/s", factor: 0.001 },
  ],
  deg: [
    { unit: "deg", factor: 1 },
    { unit: "rad", factor: 180 / Math.PI },
  ],
};

/** Units offered for a contract unit (just the contract unit when there is no choice). */
export function unitChoices(contractUnit: string): readonly { unit: string; factor: number }[] {
  return UNIT_CHOICES[contractUnit] ?? [{ unit: contractUnit, factor: 1 }];
}

export function unitFactor(contractUnit: string, unit: string | undefined): number | null {
  if (!unit || unit === contractUnit) return 1;
  return UNIT_CHOICES[contractUnit]?.find((c) => c.unit === unit)?.factor ?? null;
}

/** The message shown on a field whose text is not a number. */
export const NOT_A_NUMBER = "not a number; use a point for decimals";

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

export type ParsedDecimal = { ok: true; value: number; allowance: number; text: string } | { ok: false; message: string };

/**
 * Parses what a person typed: "5790", "96.5", "-0.25", "8.64e4", with spaces between digit
 * groups allowed ("86 400"). A comma, letters, units or an overflow are not numbers.
 * `allowance` is half a unit in the last written digit.
 */
export function parseDecimal(raw: string): ParsedDecimal {
  const text = raw.trim().replace(/(\d)[\s\u00a0\u202f]+(?=\d)/g, "$1");
  if (text === "") return { ok: false, message: "empty" };
  if (!DECIMAL.test(text)) return { ok: false, message: NOT_A_NUMBER };
  const value = Number(text);
  if (!Number.isFinite(value)) return { ok: false, message: "too large to be a number here" };
  const [mantissa, exp] = text.replace(/^[+-]/, "").split(/[eE]/) as [string, string | undefined];
  const decimals = mantissa.includes(".") ? mantissa.split(".")[1]!.length : 0;
  const allowance = 0.5 * 10 ** (Number(exp ?? 0) - decimals);
  return { ok: true, value, allowance, text };
}

/** A value as typed: the text and the unit chosen beside it. */
export interface WrittenValue {
  text: string;
  unit: string;
  /** The board station the value was copied from (link budget's minimum elevation). */
  station?: string;
}

export interface ConvertedValue {
  /** The value in the contract's unit. */
  value: number;
  /** The written precision, scaled to the contract's unit. */
  allowance: number;
  /**
   * The decimal string sent as the claimed value: the typed text itself in the contract's
   * unit; otherwise the converted value written to a precision whose half-unit is the
   * largest that does not exceed the scaled allowance (never looser than what was written).
   */
  claimedText: string;
  factor: number;
}

export function convertWritten(written: WrittenValue, contractUnit: string): ConvertedValue | { error: string } {
  const parsed = parseDecimal(written.text);
  if (!parsed.ok) return { error: parsed.message };
  const factor = unitFactor(contractUnit, written.unit);
  if (factor === null)
    return {
      error: `choose a unit (${unitChoices(contractUnit)
        .map((c) => c.unit)
        .join(", ")})`,
    };
  if (factor === 1) return { value: parsed.value, allowance: parsed.allowance, claimedText: parsed.text, factor };
  const value = parsed.value * factor;
  const allowance = parsed.allowance * factor;
  return { value, allowance, claimedText: decimalWithAllowance(value, allowance), factor };
}

/** `value` written so that half a unit in its last digit is at most `allowance`. */
export function decimalWithAllowance(value: number, allowance: number): string {
  const k = Math.floor(Math.log10(allowance / 0.5) + 1e-9);
  if (k < 0) {
    const digits = Math.min(-k, 15);
    return value.toFixed(digits);
  }
  if (k === 0) return Math.round(value).toFixed(0);
  const mantissa = Math.round(value / 10 ** k);
  return `${mantissa}e${k}`;
}

/** "5790 s": a converted value for display. */
export function formatConverted(value: number, unit: string): string {
  const v = Number(value.toPrecision(8));
  return `${v}${unit && unit !== "1" ? ` ${unit}` : ""}`;
}
