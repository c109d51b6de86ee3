/**
 * The tolerance rule of contract version 2 (docs/contracts/orbit-checks.md, "Tolerance"):
 * a numeric quantity passes when its error is within the largest of the relative bound
 * times |computed| (never for angles), its unit's absolute bound and the precision allowance
 * of the written value. Angles (every quantity in deg) are compared by the difference
 * wrapped into [-180°, 180°].
 */
import { DEFAULT_ABSOLUTE_TOLERANCE, DEFAULT_RELATIVE_TOLERANCE } from "./quantities";
import { toleranceSchema, type Basis, type ToleranceInput } from "./schema";
import { wrapDeg180 } from "./vector";

/** Tolerance after defaults are applied. */
export interface Tolerance {
  relative: number;
  absolute: Record<string, number>;
}

export const DEFAULT_TOLERANCE: Tolerance = { relative: DEFAULT_RELATIVE_TOLERANCE, absolute: { ...DEFAULT_ABSOLUTE_TOLERANCE } };

/** Merges a (validated) tolerance input over a base tolerance. */
export function mergeTolerance(base: Tolerance, input?: { relative?: number; absolute?: Record<string, number> }): Tolerance {
  return {
    relative: input?.relative ?? base.relative,
    absolute: { ...base.absolute, ...(input?.absolute ?? {}) },
  };
}

export interface ToleranceIssue {
  /** The field, e.g. "tolerance.relative" or "tolerance.absolute.km". */
  path: string;
  message: string;
}

/**
 * Validates a tolerance policy (`{ relative?, absolute? }`, e.g. a call's policy) and merges it
 * over the defaults. Refuses negative or non-finite bounds and a relative bound of 0.5 or more,
 * naming the field.
 */
export function parseTolerancePolicy(
  input: unknown,
  base: Tolerance = DEFAULT_TOLERANCE,
  prefix = "tolerance",
): { ok: true; tolerance: Tolerance } | { ok: false; message: string; issues: ToleranceIssue[] } {
  if (input === undefined || input === null) return { ok: true, tolerance: base };
  const t = toleranceSchema.safeParse(input);
  if (t.success) return { ok: true, tolerance: mergeTolerance(base, t.data as ToleranceInput) };
  const issues = t.error.issues.map((i) => ({ path: [prefix, ...i.path.map(String)].join("."), message: i.message }));
  return { ok: false, issues, message: issues.map((i) => `${i.path}: ${i.message}`).join("; ") };
}

/** "checked at 0.1 %, angles 0.05°": the policy in words, for display beside verdicts. */
export function toleranceSummary(t: Tolerance): string {
  const pct = Number((t.relative * 100).toPrecision(6));
  const deg = t.absolute.deg ?? 0;
  return `checked at ${pct} %, angles ${Number(deg.toPrecision(6))}°`;
}

/** The unit whose quantities are angles (wrapped, absolute bound only). */
export const ANGLE_UNIT = "deg";

export interface Bound {
  allowance: number;
  basis: Exclude<Basis, "exact">;
}

/** The largest applicable bound for a value (ties go to relative, then absolute, then precision). */
export function boundFor(computedMagnitude: number, unit: string, precision: number, tolerance: Tolerance): Bound {
  const angle = unit === ANGLE_UNIT;
  let best: Bound = { allowance: angle ? -Infinity : tolerance.relative * Math.abs(computedMagnitude), basis: "relative" };
  const abs = tolerance.absolute[unit] ?? 0;
  if (abs > best.allowance || angle) best = { allowance: abs, basis: "absolute" };
  if (precision > best.allowance) best = { allowance: precision, basis: "precision" };
  return best;
}

/** Error of a claimed scalar: wrapped for angles. */
export function scalarError(claimed: number, computed: number, unit: string): number {
  return unit === ANGLE_UNIT ? Math.abs(wrapDeg180(claimed - computed)) : Math.abs(claimed - computed);
}

/** Whether a claimed scalar agrees with a computed one under a tolerance and a precision allowance. */
export function scalarAgrees(claimed: number, computed: number, unit: string, precision: number, tolerance: Tolerance): boolean {
  const err = scalarError(claimed, computed, unit);
  return err <= boundFor(computed, unit, precision, tolerance).allowance;
}

/** Whether a claimed vector agrees: length of the difference against the vector's bound. */
export function vectorAgrees(claimed: readonly number[], computed: readonly number[], unit: string, precision: number, tolerance: Tolerance): boolean {
  const err = Math.hypot(claimed[0]! - computed[0]!, claimed[1]! - computed[1]!, claimed[2]! - computed[2]!);
  const len = Math.hypot(computed[0]!, computed[1]!, computed[2]!);
  return err <= boundFor(len, unit, precision, tolerance).allowance;
}
