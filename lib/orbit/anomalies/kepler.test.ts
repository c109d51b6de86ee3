/**
 * Kepler's equation in all three forms, cross-checked against the `astronomia` library
 * (a general-purpose port of Meeus' algorithms) and against the residual of the equation.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { kepler2b, kepler3, trueAnomaly as astroTrueAnomaly } from "astronomia/kepler";
import {
  eccentricFromTrue,
  hyperbolicFromTrue,
  meanFromEccentric,
  meanFromHyperbolic,
  parabolicMeanAnomaly,
  solveBarker,
  solveKeplerElliptic,
  solveKeplerHyperbolic,
  trueFromEccentric,
  trueFromHyperbolic,
} from "./kepler";

/** Deterministic generator so a failure reproduces. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296;
  };
}

describe("elliptic Kepler's equation against astronomia", { timeout: 60_000 }, () => {
  const rand = lcg(20240611);
  const N = 20_000;
  const cases = Array.from({ length: N }, (_, i) => {
    // e spread over 0..0.99 with the high end sampled densely.
    const e = i < N / 2 ? 0.99 * rand() : 0.99 * (1 - rand() ** 3);
    const M = (rand() * 2 - 1) * Math.PI;
    return { e, M };
  });

  it(`agrees with astronomia's bisection solver (kepler3) to 1e-12 rad on ${N} generated inputs, e in [0, 0.99]`, () => {
    let worst = 0;
    for (const { e, M } of cases) {
      const ours = solveKeplerElliptic(M, e);
      const theirs = kepler3(e, M);
      worst = Math.max(worst, Math.abs(ours - theirs));
    }
    expect(worst).toBeLessThan(1e-12);
  });

  it("agrees with astronomia's limited Newton solver (kepler2b, 12 places) to 1e-11 rad", () => {
    let worst = 0;
    for (const { e, M } of cases.slice(0, 5000)) {
      worst = Math.max(worst, Math.abs(solveKeplerElliptic(M, e) - kepler2b(e, M, 12)));
    }
    expect(worst).toBeLessThan(1e-11);
  });

  it("agrees with astronomia's true anomaly from E", () => {
    for (const { e, M } of cases.slice(0, 2000)) {
      const E = solveKeplerElliptic(M, e);
      expect(trueFromEccentric(E, e)).toBeCloseTo(astroTrueAnomaly(E, e), 9);
    }
  });

  it("leaves a residual of M − (E − e sin E) below 1e-12 rad for every e < 0.99 and any M", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 0.99, noNaN: true }), fc.double({ min: -50, max: 50, noNaN: true }), (e, M) => {
        const E = solveKeplerElliptic(M, e);
        return Math.abs(E - e * Math.sin(E) - M) < 1e-12;
      }),
      { numRuns: 5000 },
    );
  });

  it("stays accurate very close to the parabola (e up to 0.999999)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.99, max: 0.999999, noNaN: true }), fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }), (e, M) => {
        const E = solveKeplerElliptic(M, e);
        return Math.abs(E - e * Math.sin(E) - M) < 1e-12;
      }),
      { numRuns: 3000 },
    );
  });

  it("closed form (Markley 1995 starter, one correction) holds on a grid of hard cases: e → 1, tiny M, M = ±π, many revolutions", () => {
    for (const e of [0, 1e-9, 0.1, 0.5, 0.9, 0.99, 0.999_999, 1 - 1e-9, 1 - 1e-12])
      for (const M of [0, 1e-300, 1e-12, 1e-6, 1e-3, 0.1, 1, 2, 3, Math.PI - 1e-12, Math.PI, -Math.PI, 7, -100, 1e4]) {
        const E = solveKeplerElliptic(M, e);
        expect(Number.isFinite(E), `e=${e} M=${M}`).toBe(true);
        // Relative to |M| for many revolutions, where M itself carries only 16 digits.
        expect(Math.abs(E - e * Math.sin(E) - M) / Math.max(1, Math.abs(M)), `e=${e} M=${M}`).toBeLessThan(1e-14);
      }
  });

  it("is exact at the apses: M = 0 gives E = 0 and M = π gives E = π", () => {
    expect(solveKeplerElliptic(0, 0.7)).toBe(0);
    expect(solveKeplerElliptic(Math.PI, 0.7)).toBeCloseTo(Math.PI, 14);
    expect(solveKeplerElliptic(4 * Math.PI + 0.3, 0)).toBeCloseTo(4 * Math.PI + 0.3, 12);
  });

  it("true ↔ eccentric anomaly round trip keeps the revolution", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 0.999, noNaN: true }), fc.double({ min: -20, max: 20, noNaN: true }), (e, th) => {
        const E = eccentricFromTrue(th, e);
        return Math.abs(trueFromEccentric(E, e) - th) < 1e-9;
      }),
      { numRuns: 2000 },
    );
  });
});

describe("hyperbolic Kepler's equation", { timeout: 60_000 }, () => {
  it("solves M = e sinh H − H to a relative residual of 1e-13 for e in (1, 50], |M| up to 1e4", () => {
    fc.assert(
      fc.property(fc.double({ min: 1.000001, max: 50, noNaN: true }), fc.double({ min: -1e4, max: 1e4, noNaN: true }), (e, M) => {
        const H = solveKeplerHyperbolic(M, e);
        return Math.abs(meanFromHyperbolic(H, e) - M) <= 1e-12 * Math.max(1, Math.abs(M));
      }),
      { numRuns: 3000 },
    );
  });

  it("true ↔ hyperbolic anomaly round trip inside the asymptotes", () => {
    fc.assert(
      fc.property(fc.double({ min: 1.01, max: 20, noNaN: true }), fc.double({ min: -0.99, max: 0.99, noNaN: true }), (e, frac) => {
        const th = frac * Math.acos(-1 / e);
        return Math.abs(trueFromHyperbolic(hyperbolicFromTrue(th, e), e) - th) < 1e-9;
      }),
      { numRuns: 2000 },
    );
  });

  it("refuses a true anomaly beyond the asymptote", () => {
    expect(() => hyperbolicFromTrue(2.6, 1.2)).toThrow(/asymptote/);
  });
});

describe("Barker's equation (parabola)", { timeout: 60_000 }, () => {
  it("inverts the forward equation for any mean anomaly", () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (Mp) => {
        const th = solveBarker(Mp);
        return Math.abs(parabolicMeanAnomaly(th) - Mp) <= 1e-9 * Math.max(1, Math.abs(Mp));
      }),
      { numRuns: 3000 },
    );
  });

  it("gives 90° where M_p = ½ + ⅙ = 2/3 (tan 45° = 1)", () => {
    expect((solveBarker(2 / 3) * 180) / Math.PI).toBeCloseTo(90, 12);
  });

  it("elliptic mean anomaly from eccentric anomaly is Kepler's equation", () => {
    expect(meanFromEccentric(1, 0.5)).toBeCloseTo(1 - 0.5 * Math.sin(1), 15);
  });
});
