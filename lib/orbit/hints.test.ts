/**
 * Hints of contract version 2. Every case is a published worked example given one deliberate
 * slip (the slip is named in the case); the figures were transcribed from memory of the books
 * and standards, so each source says "recalled from memory" where that applies. Each case
 * checks the verdict is inconsistent with the hint and without the hint search (a hint never
 * changes a status), and that the hint is the expected code.
 */
import { describe, expect, it } from "vitest";
import { evaluateClaim as evaluateInternal, DEFAULT_TOLERANCE, mergeTolerance } from "./check";
import { hintSentence, OTHER_CONSTANTS, SIDEREAL_DAY_S } from "./hints";
import { evaluateClaim, HINT_CODES, type HintCode, type ToleranceInput } from "./index";

// Curtis, Orbital Mechanics for Engineering Students: μ⊕ = 398 600 km³/s², R⊕ = 6378 km.
const CURTIS_EARTH = { name: "earth", mu: 398_600, radius: 6_378, j2: 0.001_082_63 };
// Vallado, Fundamentals of Astrodynamics and Applications: μ⊕ = 398 600.4418 km³/s², R⊕ = 6378.137 km.
const VALLADO_EARTH = { name: "earth", mu: 398_600.4418, radius: 6_378.137 };
const CURTIS_SUN = { name: "sun", mu: 1.327e11, radius: 696_000 };
const CURTIS_EARTH_HELIO = { name: "earth", mu: 398_600, radius: 6_378, orbitRadius: 149.6e6 };
const CURTIS_MARS_HELIO = { name: "mars", mu: 42_830, radius: 3_396, orbitRadius: 227.9e6 };

const CURTIS_4_3 = { kind: "stateVector", body: CURTIS_EARTH, given: { position: [-6_045, -3_490, 2_500], velocity: [-3.457, 6.618, 2.533] } };
const VALLADO_6_1 = { kind: "hohmann", body: VALLADO_EARTH, given: { initialAltitude: 191.344_11, finalAltitude: 35_781.348_57 } };
const CURTIS_J2 = { kind: "j2Rates", body: CURTIS_EARTH, given: { periapsisAltitude: 280, apoapsisAltitude: 400, inclination: 51.43 } };
const CGPM_ROCKET = { kind: "rocket", given: { specificImpulse: 300, initialMass: Math.E * 1000, finalMass: 1000 } };

interface HintCase {
  source: string;
  slip: string;
  claim: Record<string, unknown>;
  claimed: Record<string, unknown>;
  tolerance?: ToleranceInput;
  code: HintCode;
  fields?: Record<string, unknown>;
}

const CASES: HintCase[] = [
  // other-quantity
  {
    source: "Curtis, Example 4.3 (rp = 7284 km, ra = 10 290 km), recalled from memory",
    slip: "the perigee radius written as the apogee radius",
    claim: CURTIS_4_3,
    claimed: { apoapsisRadius: 7_284 },
    code: "other-quantity",
    fields: { quantity: "periapsisRadius" },
  },
  {
    source: "Vallado, Example 6-1 (Hohmann: Δv1 = 2.457038, Δv total = 3.935224 km/s), recalled from memory",
    slip: "the first burn written as the total",
    claim: VALLADO_6_1,
    claimed: { deltaVTotal: "2.457038" },
    code: "other-quantity",
    fields: { quantity: "deltaV1" },
  },
  {
    source: "Vallado, Example 2-1 (Kepler's equation, e = 0.4, M = 235.4°: E = 220.512074767522°), recalled from memory",
    slip: "the eccentric anomaly written as the true anomaly",
    claim: { kind: "kepler", given: { eccentricity: 0.4, meanAnomaly: 235.4 } },
    claimed: { trueAnomaly: "220.512074767522" },
    code: "other-quantity",
    fields: { quantity: "eccentricAnomaly" },
  },
  // altitude-radius
  {
    source: "Curtis, Example 4.3 (r = 7414 km from [-6045, -3490, 2500] km), recalled from memory",
    slip: "the altitude (1036 km) written for the radius",
    claim: CURTIS_4_3,
    claimed: { radius: "1036" },
    code: "altitude-radius",
  },
  {
    source: "Vallado, Example 6-1 (transfer semi-major axis 24 364.4845 km), recalled from memory",
    slip: "the mean of the two altitudes written for the semi-major axis",
    claim: VALLADO_6_1,
    claimed: { transferSemiMajorAxis: "17986.346" },
    code: "altitude-radius",
  },
  {
    source: "Curtis, Example 4.3 (rp = 7284 km), recalled from memory",
    slip: "the perigee altitude (905 km) written for the perigee radius",
    claim: CURTIS_4_3,
    claimed: { periapsisRadius: "905" },
    code: "altitude-radius",
  },
  // unit-scale
  {
    source: "Curtis, Example 3.1 (9600 km by 21 000 km radii: T = 18 834 s), recalled from memory",
    slip: "the period written in minutes (313.9)",
    claim: { kind: "timeOfFlight", body: CURTIS_EARTH, given: { periapsisRadius: 9_600, apoapsisRadius: 21_000, trueAnomalyFrom: 0, trueAnomalyTo: 120 } },
    claimed: { period: "313.9" },
    code: "unit-scale",
    fields: { factor: 60 },
  },
  {
    source: "Vallado, Example 6-1 (transfer time 5.256713 h), recalled from memory",
    slip: "the transfer time written in hours",
    claim: VALLADO_6_1,
    claimed: { transferTime: "5.256713" },
    code: "unit-scale",
    fields: { factor: 3600 },
  },
  {
    source: "Curtis, Example 8.3 (Earth to Mars: v∞ = 2.943 km/s), recalled from memory",
    slip: "v∞ written in m/s",
    claim: { kind: "interplanetaryHohmann", body: CURTIS_SUN, given: { from: CURTIS_EARTH_HELIO, to: CURTIS_MARS_HELIO, departureAltitude: 300 } },
    claimed: { departureExcessSpeed: 2_943 },
    code: "unit-scale",
    fields: { factor: 0.001 },
  },
  // degrees-radians
  {
    source: "Curtis, Example 3.2 (E = 3.4794 rad), recalled from memory",
    slip: "the eccentric anomaly left in radians",
    claim: { kind: "kepler", given: { eccentricity: 0.372_55, meanAnomaly: (3.6029 * 180) / Math.PI } },
    claimed: { eccentricAnomaly: "3.4794" },
    code: "degrees-radians",
  },
  {
    source: "Vallado, Example 2-3 (hyperbolic Kepler's equation, e = 2.4, M = 235.4°: H = 1.601376144 rad), recalled from memory",
    slip: "the hyperbolic anomaly left in radians",
    claim: { kind: "kepler", given: { eccentricity: 2.4, meanAnomaly: 235.4 } },
    claimed: { hyperbolicAnomaly: "1.601376144" },
    code: "degrees-radians",
  },
  {
    source: "Curtis, J2 example (280 km by 400 km, i = 51.43°: Ω̇ = −5.181°/day), recalled from memory",
    slip: "the nodal rate written in rad/day",
    claim: CURTIS_J2,
    claimed: { raanRate: "-0.09043" },
    code: "degrees-radians",
  },
  // solar-day
  {
    source: "Curtis, geostationary orbit example (r = 42 164 km, T = one sidereal day 86 164 s), recalled from memory",
    slip: "a solar day (86 400 s) claimed as the period",
    claim: { kind: "orbit", body: CURTIS_EARTH, given: { semiMajorAxis: 42_164, eccentricity: 0 } },
    claimed: { period: 86_400 },
    code: "solar-day",
  },
  {
    source: "Curtis, geostationary orbit example (one revolution per sidereal day), recalled from memory",
    slip: "one revolution per solar day claimed as the mean motion",
    claim: { kind: "orbit", body: CURTIS_EARTH, given: { semiMajorAxis: 42_164, eccentricity: 0 } },
    claimed: { meanMotionRevPerDay: "1.0000" },
    code: "solar-day",
  },
  {
    source: "Curtis, J2 example (Ω̇ = −5.181°/day), recalled from memory",
    slip: "the rate taken per sidereal day instead of per day of 86 400 s",
    claim: CURTIS_J2,
    claimed: { raanRate: "-5.167" },
    code: "solar-day",
  },
  // standard-gravity
  {
    source: "3rd CGPM (1901) standard gravity 9.80665 m/s²: mass ratio e at Isp 300 s gives Δv = 2.941995 km/s exactly",
    slip: "g0 taken as 9.81 m/s² (Δv = 2.943 km/s), checked at 0.001 %",
    claim: CGPM_ROCKET,
    claimed: { deltaV: "2.94300" },
    tolerance: { relative: 1e-5, absolute: { "km/s": 0 } },
    code: "standard-gravity",
  },
  {
    source: "3rd CGPM (1901) standard gravity: mass ratio e at Isp 300 s gives Δv = 2.941995 km/s exactly",
    slip: "g0 left out (Isp·ln e = 300, read as 300 m/s)",
    claim: CGPM_ROCKET,
    claimed: { deltaV: "0.3" },
    code: "standard-gravity",
  },
  {
    source: "3rd CGPM (1901) standard gravity: Δv = 2.941995 km/s at Isp 300 s needs m0 = e × mf exactly",
    slip: "g0 taken as 9.81 m/s² (m0 = 2717.35 kg for mf = 1000 kg), checked at 0.001 %",
    claim: { kind: "rocket", given: { specificImpulse: 300, finalMass: 1000, deltaV: 2.941_995 } },
    claimed: { initialMass: "2717.35" },
    tolerance: { relative: 1e-5, absolute: { kg: 0.01 } },
    code: "standard-gravity",
  },
  // sign
  {
    source: "Curtis, Example 3.5 (hyperbola, 300 km perigee altitude, e = 2.7696: a = rp/(1 − e) = −3773.7 km), recalled from memory",
    slip: "the semi-major axis given as positive",
    claim: { kind: "orbit", body: CURTIS_EARTH, given: { periapsisAltitude: 300, eccentricity: 2.7696 } },
    claimed: { semiMajorAxis: "3774" },
    code: "sign",
  },
  {
    source: "Curtis, J2 example (Ω̇ = −5.181°/day, a regression), recalled from memory",
    slip: "the sign of the nodal rate dropped",
    claim: CURTIS_J2,
    claimed: { raanRate: "5.181" },
    code: "sign",
  },
  {
    source: "Curtis, Example 4.7 (v = [-10.39, -4.772, 1.744] km/s), recalled from memory",
    slip: "the velocity written in the opposite direction",
    claim: {
      kind: "elements",
      body: CURTIS_EARTH,
      given: { semiLatusRectum: 80_000 ** 2 / 398_600, eccentricity: 1.4, inclination: 30, raan: 40, argPeriapsis: 60, trueAnomaly: 30 },
    },
    claimed: { velocity: ["10.39", "4.772", "-1.744"] },
    code: "sign",
  },
  // other-constants
  {
    source: "Curtis, sun-synchronous example (circular orbit with a 100 min period: altitude 758 km), recalled from memory",
    slip: "the altitude taken above Earth's mean radius 6371 km (766 km)",
    claim: { kind: "orbit", body: "earth", given: { period: 6_000, eccentricity: 0 } },
    claimed: { apoapsisAltitude: "766" },
    code: "other-constants",
    fields: { constant: "earth.radius", value: 6371 },
  },
  {
    source: "Vallado, Example 6-1 (transfer time 5.256713 h = 18 924 s), recalled from memory",
    slip: "the radii taken from Earth's mean radius 6371 km (18 916 s), checked at 0.01 %",
    claim: { ...VALLADO_6_1, body: "earth" },
    claimed: { transferTime: "18916" },
    tolerance: { relative: 1e-4 },
    code: "other-constants",
    fields: { constant: "earth.radius", value: 6371 },
  },
  {
    source: "Curtis, sun-synchronous example (100 min period: i = 98.43°), recalled from memory",
    slip: "the sun's rate taken as 360° per 365 days (i = 98.435°), checked to 0.001°",
    claim: { kind: "sunSynchronous", body: "earth", given: { period: 6_000 } },
    claimed: { inclination: "98.435" },
    tolerance: { absolute: { deg: 0.001 } },
    code: "other-constants",
    fields: { constant: "earth.year", value: 365 },
  },
];

describe("hints: published worked examples with one deliberate slip", () => {
  for (const c of CASES) {
    it(`${c.code}: ${c.source}; slip: ${c.slip}`, () => {
      const claim = { id: c.code, ...c.claim, claimed: c.claimed };
      const r = evaluateClaim(claim, c.tolerance);
      expect(r.messages.filter((m) => /must|not a plain|cannot/.test(m))).toEqual([]);
      expect(r.status).toBe("inconsistent");
      expect(r.checks).toHaveLength(1);
      const row = r.checks[0]!;
      expect(row.ok).toBe(false);
      expect(row.hint, JSON.stringify(row)).toBeDefined();
      expect(row.hint!.code).toBe(c.code);
      expect(row.hint!.message.length).toBeGreaterThan(20);
      if (c.fields) expect(row.hint).toMatchObject(c.fields);
      // The same claim without the hint search: same status, same row apart from the hint.
      const tol = mergeTolerance(DEFAULT_TOLERANCE, c.tolerance);
      const bare = evaluateInternal(claim, tol, 0, { hints: false });
      expect(bare.status).toBe(r.status);
      expect(bare.checks[0]).toEqual({ ...row, hint: undefined });
    });
  }

  it("covers every hint code with at least two cases", () => {
    for (const code of HINT_CODES) expect(CASES.filter((c) => c.code === code).length, code).toBeGreaterThanOrEqual(2);
  });

  it("a passing check never carries a hint, even when a hint would match", () => {
    // Curtis geostationary example: the sidereal-day period passes, and no hint is searched.
    const r = evaluateClaim({ kind: "orbit", body: CURTIS_EARTH, given: { semiMajorAxis: 42_164, eccentricity: 0 }, claimed: { period: 86_164 } });
    expect(r.status).toBe("consistent");
    expect(r.checks[0]!.hint).toBeUndefined();
  });

  it("a wrong value with no recognisable slip gets no hint", () => {
    // Vallado, Example 6-1 total 3.935224 km/s, claimed as 3.2 km/s: nothing explains it.
    const r = evaluateClaim({ ...VALLADO_6_1, claimed: { deltaVTotal: 3.2 } });
    expect(r.status).toBe("inconsistent");
    expect(r.checks[0]!.hint).toBeUndefined();
  });

  it("searches in the contract's order: other-quantity wins over altitude-radius", () => {
    // Curtis Example 4.3's perigee (7284 km radius, 906 km altitude) as an orbit claim: the orbit
    // kind computes the altitude itself, so the altitude written for the radius matches both
    // codes and the earlier one, other-quantity, is reported.
    const r = evaluateClaim({
      kind: "orbit",
      body: CURTIS_EARTH,
      given: { periapsisRadius: 7_284, apoapsisRadius: 10_290 },
      claimed: { periapsisRadius: 906 },
    });
    expect(r.checks[0]!.hint).toMatchObject({ code: "other-quantity", quantity: "periapsisAltitude" });
  });

  it("scale hints never apply to angles: an inclination off by a factor gets none of them", () => {
    // Curtis Example 4.3, i = 153.2°: 153.2/60 = 2.553 is below 2π, so only the radians reading is tried and it fails.
    const r = evaluateClaim({ ...CURTIS_4_3, claimed: { inclination: "2.553" } });
    expect(r.status).toBe("inconsistent");
    expect(r.checks[0]!.hint).toBeUndefined();
  });
});

describe("hint sentences for stored data", () => {
  it("shows a stored hint's message and names an unknown code plainly", () => {
    expect(hintSentence({ code: "unit-scale", message: "period agrees × 60" })).toBe("period agrees × 60");
    expect(hintSentence({ code: "zodiac", message: "whatever" })).toMatch(/does not know \(code "zodiac"\)/);
    expect(hintSentence(null)).toMatch(/No explanation/);
  });
});

describe("other constants", () => {
  it("each documented constant names its source", () => {
    expect(OTHER_CONSTANTS.length).toBeGreaterThanOrEqual(5);
    for (const c of OTHER_CONSTANTS) expect(c.source.length, c.label).toBeGreaterThan(20);
    expect(OTHER_CONSTANTS).toContainEqual(expect.objectContaining({ body: "earth", constant: "radius", value: 6371 }));
    expect(OTHER_CONSTANTS).toContainEqual(expect.objectContaining({ body: "earth", constant: "mu", value: 398_600 }));
    expect(OTHER_CONSTANTS).toContainEqual(expect.objectContaining({ body: "earth", constant: "year", value: 365.25 }));
  });

  it("the sidereal day is WGS-84's 2π/ω = 2π/7.292115e-5 rad/s = 86 164.1006 s (IERS gives 86 164.0905 s, recalled from memory)", () => {
    expect(SIDEREAL_DAY_S).toBeCloseTo(86_164.1006, 3);
    expect(Math.abs(SIDEREAL_DAY_S - 86_164.0905)).toBeLessThan(0.02);
  });
});
