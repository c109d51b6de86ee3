/**
 * Property tests (fast-check) of the two-body physics: conservation laws, round trips,
 * Lambert consistency with propagation, and the known Hohmann vs bi-elliptic result.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { lambert } from "./lambert";
import { biElliptic, hohmann } from "./maneuvers";
import { propagate } from "./propagation";
import { elementsToState, stateToElements } from "./state-vectors";
import { cross, dot, norm, sub, type Vec3 } from "./vector";

const MU = 398_600.4418;
const deg = Math.PI / 180;

const energy = (r: Vec3, v: Vec3) => dot(v, v) / 2 - MU / norm(r);

/** Random conic states well above the surface: elliptic and hyperbolic. */
const stateArb = fc
  .record({
    rp: fc.double({ min: 6_600, max: 60_000, noNaN: true }),
    e: fc.oneof(fc.double({ min: 0, max: 0.9, noNaN: true }), fc.double({ min: 1.05, max: 5, noNaN: true })),
    i: fc.double({ min: 0, max: Math.PI, noNaN: true }),
    raan: fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
    w: fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
    nuFrac: fc.double({ min: -0.9, max: 0.9, noNaN: true }),
  })
  .map(({ rp, e, i, raan, w, nuFrac }) => {
    const p = rp * (1 + e);
    const nuMax = e < 1 ? Math.PI : Math.acos(-1 / e);
    return { p, e, i, raan, w, nu: nuFrac * nuMax, ...elementsToState(p, e, i, raan, w, nuFrac * nuMax, MU) };
  });

describe("universal-variable propagation", { timeout: 60_000 }, () => {
  it("conserves specific energy and angular momentum", () => {
    fc.assert(
      fc.property(stateArb, fc.double({ min: -200_000, max: 200_000, noNaN: true }), (s, dt) => {
        const out = propagate(s.position, s.velocity, dt, MU);
        const e0 = energy(s.position, s.velocity);
        const e1 = energy(out.position, out.velocity);
        const h0 = cross(s.position, s.velocity);
        const h1 = cross(out.position, out.velocity);
        const scaleE = Math.max(Math.abs(e0), MU / norm(s.position));
        expect(Math.abs(e1 - e0) / scaleE).toBeLessThan(1e-9);
        expect(norm(sub(h1, h0)) / norm(h0)).toBeLessThan(1e-9);
      }),
      { numRuns: 1500 },
    );
  });

  it("returns to the start after propagating forward then back", () => {
    fc.assert(
      fc.property(stateArb, fc.double({ min: 0, max: 50_000, noNaN: true }), (s, dt) => {
        const fwd = propagate(s.position, s.velocity, dt, MU);
        const back = propagate(fwd.position, fwd.velocity, -dt, MU);
        expect(norm(sub(back.position, s.position)) / norm(s.position)).toBeLessThan(1e-7);
      }),
      { numRuns: 800 },
    );
  });

  it("a whole period brings a closed orbit back to the same state", () => {
    fc.assert(
      fc.property(
        stateArb.filter((s) => s.e < 0.9),
        (s) => {
          const a = s.p / (1 - s.e * s.e);
          const T = 2 * Math.PI * Math.sqrt(a ** 3 / MU);
          const out = propagate(s.position, s.velocity, 3 * T, MU);
          expect(norm(sub(out.position, s.position)) / norm(s.position)).toBeLessThan(1e-8);
        },
      ),
      { numRuns: 300 },
    );
  });
});

/** States away from the cases where angles are undefined (circular, equatorial) or parabolic. */
const roundTripArb = fc
  .record({
    rp: fc.double({ min: 6_600, max: 60_000, noNaN: true }),
    e: fc.oneof(fc.double({ min: 0.01, max: 0.9, noNaN: true }), fc.double({ min: 1.05, max: 5, noNaN: true })),
    i: fc.double({ min: 1 * deg, max: 179 * deg, noNaN: true }),
    raan: fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
    w: fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
    nuFrac: fc.double({ min: -0.9, max: 0.9, noNaN: true }),
  })
  .map(({ rp, e, i, raan, w, nuFrac }) => {
    const p = rp * (1 + e);
    const nu = nuFrac * (e < 1 ? Math.PI : Math.acos(-1 / e));
    return { p, e, i, raan, w, nu, ...elementsToState(p, e, i, raan, w, nu, MU) };
  });

describe("elements → state → elements", { timeout: 60_000 }, () => {
  it("round trips p, e, i, Ω, ω and θ away from the undefined cases", () => {
    const wrap = (x: number) => Math.abs(Math.atan2(Math.sin(x), Math.cos(x)));
    fc.assert(
      fc.property(roundTripArb, (s) => {
        const el = stateToElements(s.position, s.velocity, MU);
        expect(Math.abs(el.p - s.p) / s.p).toBeLessThan(1e-10);
        expect(Math.abs(el.e - s.e)).toBeLessThan(1e-10);
        expect(Math.abs(el.i - s.i)).toBeLessThan(1e-9);
        expect(wrap(el.raan - s.raan)).toBeLessThan(1e-8);
        expect(wrap(el.argPeriapsis - s.w)).toBeLessThan(1e-7);
        expect(wrap(el.trueAnomaly - s.nu)).toBeLessThan(1e-7);
      }),
      { numRuns: 2000 },
    );
  });
});

describe("Lambert's problem", { timeout: 60_000 }, () => {
  const posArb = fc
    .record({
      r1: fc.double({ min: 6_700, max: 40_000, noNaN: true }),
      r2: fc.double({ min: 6_700, max: 40_000, noNaN: true }),
      dth: fc.oneof(fc.double({ min: 1e-4, max: Math.PI - 1e-4, noNaN: true }), fc.double({ min: Math.PI + 1e-4, max: 2 * Math.PI - 1e-4, noNaN: true })),
      tilt: fc.double({ min: -1.2, max: 1.2, noNaN: true }),
      tof: fc.double({ min: 300, max: 40_000, noNaN: true }),
    })
    .map(({ r1, r2, dth, tilt, tof }) => {
      const ct = Math.cos(tilt);
      const st = Math.sin(tilt);
      const p1: Vec3 = [r1, 0, 0];
      const p2: Vec3 = [r2 * Math.cos(dth), r2 * Math.sin(dth) * ct, r2 * Math.sin(dth) * st];
      return { p1, p2, tof };
    });

  it("a solution propagated for the time of flight reaches the second position (both directions)", () => {
    let solved = 0;
    fc.assert(
      fc.property(posArb, fc.constantFrom("prograde" as const, "retrograde" as const), ({ p1, p2, tof }, dir) => {
        let sol;
        try {
          sol = lambert(p1, p2, tof, MU, dir);
        } catch (e) {
          // Only the documented refusals are acceptable (too long for zero revolutions).
          expect(String(e)).toMatch(/revolution|too short/);
          return;
        }
        solved++;
        const out = propagate(p1, sol.velocity1, tof, MU);
        expect(norm(sub(out.position, p2)) / norm(p2)).toBeLessThan(1e-6);
        expect(norm(sub(out.velocity, sol.velocity2)) / norm(sol.velocity2)).toBeLessThan(1e-6);
        const h = cross(p1, sol.velocity1);
        if (dir === "prograde") expect(h[2]).toBeGreaterThanOrEqual(-1e-6 * norm(h));
        else expect(h[2]).toBeLessThanOrEqual(1e-6 * norm(h));
      }),
      { numRuns: 1500 },
    );
    expect(solved).toBeGreaterThan(1000);
  });

  it("stays accurate within a hundredth of a degree of 180° and of 0°", () => {
    for (const dthDeg of [179.99, 179.999, 180.01, 0.01, 359.99]) {
      const d = dthDeg * deg;
      const p1: Vec3 = [7_000, 0, 0];
      const p2: Vec3 = [12_000 * Math.cos(d), 12_000 * Math.sin(d), 0];
      const tof = dthDeg < 1 ? 60 : dthDeg > 359 ? 20_000 : 4_000;
      const sol = lambert(p1, p2, tof, MU, dthDeg > 180 ? "retrograde" : "prograde");
      const out = propagate(p1, sol.velocity1, tof, MU);
      expect(norm(sub(out.position, p2)) / 12_000).toBeLessThan(1e-6);
    }
  });

  it("refuses exactly 180° with a message about the undefined plane", () => {
    expect(() => lambert([7_000, 0, 0], [-9_000, 0, 0], 3_000, MU)).toThrow(/180°.*plane is undefined/);
  });
});

describe("Hohmann against bi-elliptic (radius ratio thresholds 11.94 and 15.58)", { timeout: 60_000 }, () => {
  it("below a ratio of 11.94 the Hohmann transfer is never worse than any bi-elliptic one", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 6_700, max: 50_000, noNaN: true }),
        fc.double({ min: 1.01, max: 11.9, noNaN: true }),
        fc.double({ min: 1, max: 1_000, noNaN: true }),
        (r1, ratio, k) => {
          const r2 = r1 * ratio;
          const h = hohmann(MU, r1, r2).deltaVTotal;
          const b = biElliptic(MU, r1, r2, r2 * k).deltaVTotal;
          expect(h).toBeLessThanOrEqual(b * (1 + 1e-12));
        },
      ),
      { numRuns: 3000 },
    );
  });

  it("above a ratio of 15.58 every bi-elliptic transfer beyond the final radius is cheaper", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 6_700, max: 50_000, noNaN: true }),
        fc.double({ min: 15.6, max: 500, noNaN: true }),
        fc.double({ min: 1.01, max: 1_000, noNaN: true }),
        (r1, ratio, k) => {
          const r2 = r1 * ratio;
          expect(biElliptic(MU, r1, r2, r2 * k).deltaVTotal).toBeLessThan(hohmann(MU, r1, r2).deltaVTotal);
        },
      ),
      { numRuns: 3000 },
    );
  });
});
