/**
 * Cross-checks against `satellite.js` (the SGP4 library of the npm registry), for element sets
 * we write ourselves for an invented satellite, always with satellite.js's own WGS-72
 * constants as body overrides:
 * - the period the engine derives from the semi-major axis against the period of
 *   satellite.js's (Brouwer) mean motion;
 * - the engine's first-order J2 secular rates (j2Rates) against the secular rates SGP4 sets
 *   up at initialisation, which add the J2² and J4 terms on top of the same first-order term;
 * - the nodal drift of a sun-synchronous orbit from the engine, propagated by SGP4 for a
 *   year, against the mean sun's 360° per year.
 */
import { describe, expect, it } from "vitest";
import { constants, sgp4, twoline2satrec, type SatRec } from "satellite.js";
import { evaluateClaim } from "./index";
import { period } from "./conics";

function checksum(line: string): number {
  let s = 0;
  for (const ch of line) {
    if (ch >= "0" && ch <= "9") s += Number(ch);
    else if (ch === "-") s += 1;
  }
  return s % 10;
}

const f = (x: number, width: number, decimals: number) => x.toFixed(decimals).padStart(width, " ");

/** A two-line element set for the invented satellite 99001 ("VV-TEST"), epoch 2024 day 1.5. */
function makeTle(incl: number, raan: number, ecc: number, argp: number, meanAnomaly: number, revPerDay: number): [string, string] {
  const l1 = "1 99001U 24001A   24001.50000000  .00000000  00000-0  00000-0 0  999";
  const eccText = Math.round(ecc * 1e7)
    .toString()
    .padStart(7, "0");
  const l2 =
    "2 99001 " + f(incl, 8, 4) + " " + f(raan, 8, 4) + " " + eccText + " " + f(argp, 8, 4) + " " + f(meanAnomaly, 8, 4) + " " + f(revPerDay, 11, 8) + "    1";
  return [l1 + checksum(l1), l2 + checksum(l2)];
}

function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296;
  };
}

describe("period from mean motion, against satellite.js", { timeout: 60_000 }, () => {
  const rand = lcg(7);
  const sets = Array.from({ length: 2000 }, () => {
    const revPerDay = 1.0 + rand() * 15; // from beyond GEO to very low LEO
    return makeTle(rand() * 180, rand() * 360, rand() * 0.2, rand() * 360, rand() * 360, revPerDay);
  });
  const WGS72 = { name: "earth", mu: constants.mu, radius: constants.earthRadius };

  it("writes well-formed element sets", () => {
    for (const [l1, l2] of sets.slice(0, 20)) {
      expect(l1).toHaveLength(69);
      expect(l2).toHaveLength(69);
    }
  });

  it("matches satellite.js's un-Kozai'd mean motion period to 1e-12 on 2000 element sets", () => {
    let worst = 0;
    let compared = 0;
    for (const [l1, l2] of sets) {
      const sat = twoline2satrec(l1, l2);
      // satellite.js flags sets whose perigee is inside the Earth (error 6); those are skipped.
      if (sat.error !== 0) continue;
      compared++;
      const theirs = ((2 * Math.PI) / sat.no) * 60; // no is rad/min
      const ours = period(WGS72.mu, sat.a * WGS72.radius); // a is in earth radii
      worst = Math.max(worst, Math.abs(ours - theirs) / theirs);
    }
    expect(compared).toBeGreaterThan(1500);
    expect(worst).toBeLessThan(1e-12);
  });

  it("the orbit kind reproduces it through the public API with satellite.js's constants as overrides", () => {
    for (const [l1, l2] of sets.slice(0, 300)) {
      const sat = twoline2satrec(l1, l2);
      const a = sat.a * WGS72.radius;
      if (a * (1 - sat.ecco) < WGS72.radius) continue;
      const r = evaluateClaim({
        kind: "orbit",
        body: WGS72,
        given: { semiMajorAxis: a, eccentricity: sat.ecco },
        claimed: { period: ((2 * Math.PI) / sat.no) * 60 },
        tolerance: { relative: 1e-10, absolute: { s: 0 } },
      });
      expect(r.status).toBe("consistent");
    }
  });

  it("differs from the element set's Kozai mean motion only by the small J2 correction (< 0.2 %)", () => {
    for (const [l1, l2] of sets) {
      const sat = twoline2satrec(l1, l2);
      const revPerDay = Number(l2.slice(52, 63));
      const fromTle = 86_400 / revPerDay;
      const ours = period(WGS72.mu, sat.a * WGS72.radius);
      expect(Math.abs(ours - fromTle) / fromTle).toBeLessThan(2e-3);
    }
  });
});

const WGS72_J2 = { name: "earth", mu: constants.mu, radius: constants.earthRadius, j2: constants.j2 };
const RAD_PER_MIN_TO_DEG_PER_DAY = (180 / Math.PI) * 1440;

/** Right ascension of the ascending node (deg) from an SGP4 state: the node line is ẑ × h. */
function raanOf(sat: SatRec, minutes: number): number {
  const state = sgp4(sat, minutes);
  if (!state) throw new Error(`SGP4 failed at ${minutes} min (error ${sat.error})`);
  const r = state.position;
  const v = state.velocity;
  const hx = r.y * v.z - r.z * v.y;
  const hy = r.z * v.x - r.x * v.z;
  return (Math.atan2(hx, -hy) * 180) / Math.PI;
}

/** Unwrapped change of an angle sampled often enough that each step is under 180°. */
function unwrappedChange(samples: number[]): number {
  let total = 0;
  for (let k = 1; k < samples.length; k++) {
    let step = samples[k]! - samples[k - 1]!;
    while (step > 180) step -= 360;
    while (step < -180) step += 360;
    total += step;
  }
  return total;
}

describe("J2 secular rates, against satellite.js's SGP4", { timeout: 60_000 }, () => {
  const rand = lcg(11);
  // Near-Earth element sets only (SGP4's deep-space branch adds lunisolar rates): 11 to 16
  // revolutions a day, eccentricity up to 0.05, any inclination.
  const sets = Array.from({ length: 1500 }, () => makeTle(rand() * 180, rand() * 360, rand() * 0.05, rand() * 360, rand() * 360, 11 + rand() * 5));

  it("equal SGP4's initial secular node and perigee rates to within its J2² and J4 terms", () => {
    let compared = 0;
    let worstNode = 0;
    let worstPerigee = 0;
    for (const [l1, l2] of sets) {
      const sat = twoline2satrec(l1, l2);
      const a = sat.a * constants.earthRadius;
      // Decayed or below-surface perigees are the engine's `invalid` (and SGP4's error) cases.
      if (sat.error !== 0 || sat.method !== "n" || a * (1 - sat.ecco) < constants.earthRadius + 100) continue;
      const result = evaluateClaim({
        kind: "j2Rates",
        body: WGS72_J2,
        given: { semiMajorAxis: a, eccentricity: sat.ecco, inclination: (sat.inclo * 180) / Math.PI },
        claimed: { raanRate: sat.nodedot * RAD_PER_MIN_TO_DEG_PER_DAY },
      });
      expect(result.status).not.toBe("invalid");
      compared++;
      // The size of the first-order effect, (3/2) n J2 (R/p)², in deg/day: the differences
      // are measured against it because the rates themselves pass through zero (i = 90°, 63.4°).
      const p = sat.a * (1 - sat.ecco * sat.ecco);
      const scale = 1.5 * sat.no * constants.j2 * (1 / p) ** 2 * RAD_PER_MIN_TO_DEG_PER_DAY;
      const ours = result.computed as { raanRate: number; argPeriapsisRate: number };
      worstNode = Math.max(worstNode, Math.abs(ours.raanRate - sat.nodedot * RAD_PER_MIN_TO_DEG_PER_DAY) / scale);
      worstPerigee = Math.max(worstPerigee, Math.abs(ours.argPeriapsisRate - sat.argpdot * RAD_PER_MIN_TO_DEG_PER_DAY) / scale);
    }
    expect(compared).toBeGreaterThan(1000);
    // SGP4's extra terms are of order J2·(R/p)² and J4/J2·(R/p)² relative to the first-order
    // term, times polynomials in cos i: at most about 0.8 % of it (equatorial orbits) for the
    // node, a few percent for the perigee. A sign or factor error in ours would show as ~1.
    expect(worstNode).toBeLessThan(1e-2);
    expect(worstPerigee).toBeLessThan(3e-2);
  });

  it("a sun-synchronous inclination from the engine makes SGP4's node follow the mean sun for a year", () => {
    for (const altitude of [500, 700, 900]) {
      const a = constants.earthRadius + altitude;
      const sso = evaluateClaim({ kind: "sunSynchronous", body: WGS72_J2, given: { altitude }, claimed: {} });
      expect(sso.status).not.toBe("invalid");
      const inclination = (sso.computed as { inclination: number }).inclination;
      // Mean motion for the element set from the same semi-major axis (un-Kozai'd; SGP4
      // recovers almost the same a from it).
      const revPerDay = 86_400 / period(constants.mu, a);
      const [l1, l2] = makeTle(inclination, 40, 0.0001, 90, 0, revPerDay);
      const sat = twoline2satrec(l1, l2);
      expect(sat.error).toBe(0);
      const samples: number[] = [];
      for (let day = 0; day <= 365.25; day += 0.25) samples.push(raanOf(sat, day * 1440));
      const drift = unwrappedChange(samples);
      // 360° per tropical year, less the quarter-day sampling tail; SGP4's higher-order
      // terms and the un-Kozai step move it by about 0.2 %.
      expect(Math.abs(drift - (360 / 365.24219) * 365.25) / 360).toBeLessThan(5e-3);
    }
  });
});
