/**
 * Properties of contract version 2's verdicts (fast-check): fewer written digits, angles
 * wrapped by whole turns, and hints that never change a status.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { DEFAULT_TOLERANCE, evaluateClaim as evaluateInternal, mergeTolerance } from "./check";
import { precisionAllowance } from "./decimal";
import { evaluateClaim } from "./index";

const orbitClaim = (altitude: number, period: string) => ({ kind: "orbit", body: "earth", given: { altitude }, claimed: { period } });
const periodAt = (altitude: number) => evaluateClaim({ kind: "orbit", body: "earth", given: { altitude } }).computed.period as number;

/** A decimal string of `value` with `digits` significant digits, in plain or exponent form. */
const written = (value: number, digits: number) => value.toPrecision(digits);

describe("fewer written digits", { timeout: 60_000 }, () => {
  it("the recomputed value, correctly rounded to any number of significant digits, is consistent", () => {
    fc.assert(
      fc.property(fc.double({ min: 200, max: 40_000, noNaN: true }), fc.integer({ min: 1, max: 15 }), (altitude, digits) => {
        const T = periodAt(altitude);
        const r = evaluateClaim(orbitClaim(altitude, written(T, digits)));
        expect(r.status).toBe("consistent");
      }),
      { numRuns: 500 },
    );
  });

  it("dropping digits never shrinks the allowance, and never fails a claim whose error leaves room for the rounding", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 200, max: 40_000, noNaN: true }),
        fc.double({ min: -0.002, max: 0.002, noNaN: true }),
        fc.integer({ min: 2, max: 12 }),
        fc.integer({ min: 1, max: 11 }),
        (altitude, offset, d, drop) => {
          const k = Math.max(1, d - drop);
          const T = periodAt(altitude);
          const long = written(T * (1 + offset), d);
          const short = Number(long).toPrecision(k);
          const aLong = precisionAllowance(long)!;
          const aShort = precisionAllowance(short)!;
          expect(aShort).toBeGreaterThanOrEqual(aLong);
          const before = evaluateClaim(orbitClaim(altitude, long));
          const after = evaluateClaim(orbitClaim(altitude, short));
          const row = before.checks[0]!;
          // Rounding moves the value by at most the shorter form's allowance (plus double-precision representation).
          expect(Math.abs(Number(short) - Number(long))).toBeLessThanOrEqual(aShort + Math.abs(Number(long)) * 4 * Number.EPSILON);
          if (row.ok && row.absoluteError! + aShort + Math.abs(T) * 8 * Number.EPSILON <= row.allowance!) expect(after.status).toBe("consistent");
          // Once the written digits are coarse enough to cover the error, the claim passes on precision.
          if (Math.abs(Number(short) - T) + Math.abs(T) * 8 * Number.EPSILON <= aShort) expect(after.status).toBe("consistent");
        },
      ),
      { numRuns: 1000 },
    );
  });
});

describe("angles wrapped by whole turns", { timeout: 60_000 }, () => {
  it("an angle off by k·360° + δ gets the same verdict as δ", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 0.99, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        fc.integer({ min: -400_000, max: 400_000 }),
        fc.integer({ min: -4, max: 4 }),
        fc.constantFrom(0.01, 0.05, 1),
        (e, meanAnomaly, deltaTenThousandths, k, degBound) => {
          const base = { kind: "kepler", given: { eccentricity: e, meanAnomaly }, tolerance: { absolute: { deg: degBound } } };
          const nu = evaluateClaim(base).computed.trueAnomaly as number;
          // Claimed values as four-decimal strings built from integers, so both carry the same digits.
          const m = Math.round(nu * 1e4) + deltaTenThousandths;
          const text = (units: number) => (units < 0 ? "-" : "") + (Math.abs(units) / 1e4).toFixed(4);
          const a = evaluateClaim({ ...base, claimed: { trueAnomaly: text(m) } });
          const b = evaluateClaim({ ...base, claimed: { trueAnomaly: text(m + k * 360 * 1e4) } });
          const err = a.checks[0]!.absoluteError!;
          fc.pre(Math.abs(err - a.checks[0]!.allowance!) > 1e-6);
          expect(b.status).toBe(a.status);
          expect(b.checks[0]!.absoluteError!).toBeCloseTo(err, 6);
          expect(b.checks[0]!.basis).toBe(a.checks[0]!.basis);
        },
      ),
      { numRuns: 1000 },
    );
  });
});

describe("hints never change a status", { timeout: 60_000 }, () => {
  const slips = [1, 1000, 0.001, 60, 1 / 60, 3600, 86_400, -1, 1.002_74, 0.997_27, Math.PI / 180, 1.05, 0.5];
  const claims = fc.oneof(
    fc.record({
      kind: fc.constant("orbit"),
      given: fc.record({
        periapsisAltitude: fc.double({ min: 200, max: 2_000, noNaN: true }),
        apoapsisAltitude: fc.double({ min: 2_000, max: 40_000, noNaN: true }),
      }),
      quantity: fc.constantFrom("period", "semiMajorAxis", "apoapsisRadius", "periapsisAltitude", "meanMotionRevPerDay", "apoapsisSpeed"),
    }),
    fc.record({
      kind: fc.constant("hohmann"),
      given: fc.record({
        initialAltitude: fc.double({ min: 200, max: 2_000, noNaN: true }),
        finalAltitude: fc.double({ min: 3_000, max: 40_000, noNaN: true }),
      }),
      quantity: fc.constantFrom("deltaV1", "deltaV2", "deltaVTotal", "transferTime", "transferSemiMajorAxis"),
    }),
    fc.record({
      kind: fc.constant("rocket"),
      given: fc.record({
        specificImpulse: fc.double({ min: 200, max: 450, noNaN: true }),
        initialMass: fc.double({ min: 1_000, max: 5_000, noNaN: true }),
        finalMass: fc.double({ min: 200, max: 900, noNaN: true }),
      }),
      quantity: fc.constantFrom("deltaV", "propellantMass", "massRatio"),
    }),
    fc.record({
      kind: fc.constant("sunSynchronous"),
      given: fc.record({ altitude: fc.double({ min: 300, max: 1_500, noNaN: true }) }),
      quantity: fc.constantFrom("inclination", "raanRate", "period"),
    }),
    fc.record({
      kind: fc.constant("kepler"),
      given: fc.record({ eccentricity: fc.double({ min: 0, max: 0.95, noNaN: true }), meanAnomaly: fc.double({ min: -360, max: 360, noNaN: true }) }),
      quantity: fc.constantFrom("eccentricAnomaly", "trueAnomaly"),
    }),
  );

  it("the status and every row are the same with and without the hint search", () => {
    fc.assert(
      fc.property(
        claims,
        fc.constantFrom(...slips),
        fc.integer({ min: 1, max: 8 }),
        fc.constantFrom(undefined, { relative: 1e-5 }, { relative: 0.01, absolute: { deg: 0.001 } }),
        (c, slip, digits, policy) => {
          const base = { id: "p", kind: c.kind, body: "earth", given: c.given };
          const computed = evaluateClaim(base).computed[c.quantity];
          fc.pre(typeof computed === "number");
          const claim = { ...base, claimed: { [c.quantity]: ((computed as number) * slip).toPrecision(digits) } };
          const tol = mergeTolerance(DEFAULT_TOLERANCE, policy);
          const withHints = evaluateInternal(claim, tol, 0);
          const without = evaluateInternal(claim, tol, 0, { hints: false });
          expect(withHints.status).toBe(without.status);
          expect(withHints.checks.map((r) => ({ ...r, hint: undefined }))).toEqual(without.checks);
          for (const r of withHints.checks) if (r.hint) expect(r.ok).toBe(false);
        },
      ),
      { numRuns: 1500 },
    );
  });
});
