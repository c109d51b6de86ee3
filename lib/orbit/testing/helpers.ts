/** Shared helpers for the engine's tests (not part of the public API). */
import { expect } from "vitest";
import { evaluateClaim, quantityInfo } from "../index";
import type { ClaimResult } from "../schema";

/** Absolute tolerances switched off, so only the stated relative tolerance applies. */
export const NO_ABSOLUTE = { km: 0, "km/s": 0, deg: 0, s: 0, kg: 0, "deg/day": 0, "1": 0 };

/**
 * Evaluates a claim whose `claimed` holds a book's published answers and asserts that every
 * one is reproduced within `relative` (and, for values that are zero or angles near zero,
 * within the optional absolute bounds).
 */
export function expectBook(claim: Record<string, unknown>, relative: number, absolute: Record<string, number> = {}): ClaimResult {
  // Contract version 2 bounds angles (deg) absolutely only. A book prints an angle to a number
  // of significant digits, so its relative precision becomes the absolute bound of its
  // smallest printed angle (never looser than the relative rule was for each angle).
  let deg = absolute.deg;
  if (deg === undefined) {
    const angles = Object.entries((claim.claimed as Record<string, unknown>) ?? {})
      .filter(([q, v]) => quantityInfo(q)?.unit === "deg" && typeof v === "number" && v !== 0)
      .map(([, v]) => relative * Math.abs(v as number));
    if (angles.length > 0) deg = Math.min(...angles);
  }
  const r = evaluateClaim({ ...claim, tolerance: { relative, absolute: { ...NO_ABSOLUTE, ...absolute, ...(deg === undefined ? {} : { deg }) } } });
  const claimed = Object.keys((claim.claimed as Record<string, unknown>) ?? {});
  expect(
    r.messages.filter((m) => m.includes("cannot derive") || m.includes("must be")),
    JSON.stringify(r.messages),
  ).toEqual([]);
  expect(r.checks.map((c) => c.quantity).sort()).toEqual(claimed.sort());
  for (const c of r.checks) expect(c.ok, `${c.quantity}: claimed ${JSON.stringify(c.claimed)} computed ${JSON.stringify(c.computed)}`).toBe(true);
  expect(r.status).toBe("consistent");
  return r;
}

export function relErr(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}
