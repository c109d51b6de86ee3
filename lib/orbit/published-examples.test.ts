/**
 * The engine against published worked examples and tables. Each case names its source and
 * passes that source's own constants as body overrides, then claims the published answers;
 * one test per published figure. Figures were transcribed from memory of the books (we did
 * not have the pages at hand while writing), so every one is marked "recalled from memory";
 * the tolerances reflect the number of digits the book prints.
 */
import { describe, expect, it } from "vitest";
import { evaluateClaim } from "./index";
import { expectBook } from "./testing/helpers";

// Curtis, Orbital Mechanics for Engineering Students: μ⊕ = 398 600 km³/s², R⊕ = 6378 km.
const CURTIS_EARTH = { name: "earth", mu: 398_600, radius: 6_378, j2: 0.001_082_63 };
// Vallado, Fundamentals of Astrodynamics and Applications: μ⊕ = 398 600.4418 km³/s², R⊕ = 6378.137 km.
const VALLADO_EARTH = { name: "earth", mu: 398_600.4418, radius: 6_378.137 };
// Curtis's heliocentric constants (Table A.1/A.2 style rounded values).
const CURTIS_SUN = { name: "sun", mu: 1.327e11, radius: 696_000 };
const CURTIS_EARTH_HELIO = { name: "earth", mu: 398_600, radius: 6_378, orbitRadius: 149.6e6 };
const CURTIS_MARS_HELIO = { name: "mars", mu: 42_830, radius: 3_396, orbitRadius: 227.9e6 };

interface BookCase {
  source: string;
  claim: Record<string, unknown>;
  claimed: Record<string, unknown>;
  relative: number;
  absolute?: Record<string, number>;
}

const CASES: BookCase[] = [
  {
    source: "Meeus, Astronomical Algorithms, Example 30.a (e = 0.1, M = 5°), recalled from memory",
    claim: { kind: "kepler", body: "earth", given: { eccentricity: 0.1, meanAnomaly: 5 } },
    claimed: { eccentricAnomaly: 5.554_589 },
    relative: 1e-7,
  },
  {
    source: "Meeus, Astronomical Algorithms, ch. 30 worked case e = 0.99, M = 2° (example letter not recalled), recalled from memory",
    claim: { kind: "kepler", body: "earth", given: { eccentricity: 0.99, meanAnomaly: 2 } },
    claimed: { eccentricAnomaly: 32.361_007 },
    relative: 1e-7,
  },
  {
    source: "Vallado, Example 2-1 (Kepler's equation, e = 0.4, M = 235.4°), recalled from memory",
    claim: { kind: "kepler", body: "earth", given: { eccentricity: 0.4, meanAnomaly: 235.4 } },
    claimed: { eccentricAnomaly: 220.512_074_767_522 },
    relative: 1e-12,
  },
  {
    source: "Vallado, Example 2-3 (hyperbolic Kepler's equation, e = 2.4, M = 235.4°, H = 1.601376144 rad), recalled from memory",
    claim: { kind: "kepler", body: "earth", given: { eccentricity: 2.4, meanAnomaly: 235.4 } },
    claimed: { hyperbolicAnomaly: (1.601_376_144 * 180) / Math.PI },
    relative: 1e-8,
  },
  {
    source: "Curtis, Example 3.2 (e = 0.37255, M = 3.6029 rad: E = 3.4794 rad, θ = 193.2°), recalled from memory",
    claim: { kind: "kepler", body: CURTIS_EARTH, given: { eccentricity: 0.372_55, meanAnomaly: (3.6029 * 180) / Math.PI } },
    claimed: { eccentricAnomaly: (3.4794 * 180) / Math.PI, trueAnomaly: 193.2 },
    relative: 1e-3,
  },
  {
    source: "Curtis, Example 3.1 (9600 km by 21 000 km radii, perigee to θ = 120°: t = 4077 s, T = 18 834 s), recalled from memory",
    claim: { kind: "timeOfFlight", body: CURTIS_EARTH, given: { periapsisRadius: 9_600, apoapsisRadius: 21_000, trueAnomalyFrom: 0, trueAnomalyTo: 120 } },
    claimed: { time: 4_077, period: 18_834 },
    relative: 2e-4,
  },
  {
    source: "Curtis, Example 3.4 (parabola with perigee speed 10 km/s, 6 h after perigee θ = 144.75°), recalled from memory",
    claim: {
      kind: "timeOfFlight",
      body: CURTIS_EARTH,
      given: { periapsisRadius: (2 * 398_600) / 100, eccentricity: 1, trueAnomalyFrom: 0, trueAnomalyTo: 144.75 },
    },
    claimed: { time: 6 * 3600 },
    relative: 1e-3,
  },
  {
    source: "Curtis, Example 3.5 (hyperbola, perigee speed 15 km/s at 300 km: h = 100 170 km²/s, e = 2.7696, r(100°) = 48 497 km), recalled from memory",
    claim: { kind: "orbit", body: CURTIS_EARTH, given: { periapsisAltitude: 300, eccentricity: 2.7696, trueAnomaly: 100 } },
    claimed: { specificAngularMomentum: 100_170, radius: 48_497, periapsisSpeed: 15 },
    relative: 1e-4,
  },
  {
    source: "Curtis, Example 4.3 (state vector [-6045, -3490, 2500] km, [-3.457, 6.618, 2.533] km/s to elements), recalled from memory",
    claim: { kind: "stateVector", body: CURTIS_EARTH, given: { position: [-6_045, -3_490, 2_500], velocity: [-3.457, 6.618, 2.533] } },
    claimed: {
      specificAngularMomentum: 58_310,
      inclination: 153.2,
      raan: 255.3,
      eccentricity: 0.1712,
      argPeriapsis: 20.07,
      trueAnomaly: 28.45,
      semiMajorAxis: 8_788,
      periapsisRadius: 7_284,
      apoapsisRadius: 10_290,
      period: 2.278 * 3600,
    },
    relative: 5e-4,
  },
  {
    source: "Curtis, Example 4.7 (h = 80 000 km²/s, e = 1.4, i = 30°, Ω = 40°, ω = 60°, θ = 30° to state vector), recalled from memory",
    claim: {
      kind: "elements",
      body: CURTIS_EARTH,
      given: { semiLatusRectum: 80_000 ** 2 / 398_600, eccentricity: 1.4, inclination: 30, raan: 40, argPeriapsis: 60, trueAnomaly: 30 },
    },
    claimed: { position: [-4_040, 4_815, 3_629], velocity: [-10.39, -4.772, 1.744] },
    relative: 5e-4,
  },
  {
    source: "Vallado, Example 2-5 (rv to classical elements), recalled from memory",
    claim: { kind: "stateVector", body: VALLADO_EARTH, given: { position: [6_524.834, 6_862.875, 6_448.296], velocity: [4.901_327, 5.533_756, -1.976_341] } },
    claimed: {
      semiLatusRectum: 11_067.79,
      semiMajorAxis: 36_127.343,
      eccentricity: 0.832_853,
      inclination: 87.87,
      raan: 227.898,
      argPeriapsis: 53.38,
      trueAnomaly: 92.335,
    },
    relative: 1e-4,
  },
  {
    source: "Vallado, Example 2-6 (classical elements to rv), recalled from memory",
    claim: {
      kind: "elements",
      body: VALLADO_EARTH,
      given: { semiLatusRectum: 11_067.79, eccentricity: 0.832_85, inclination: 87.87, raan: 227.89, argPeriapsis: 53.38, trueAnomaly: 92.335 },
    },
    claimed: { position: [6_525.344, 6_861.535, 6_449.125], velocity: [4.902_276, 5.533_124, -1.975_709] },
    relative: 1e-5,
  },
  {
    source: "Vallado, Example 2-4 (Kepler problem, 40 min propagation), recalled from memory",
    claim: {
      kind: "propagate",
      body: VALLADO_EARTH,
      given: { position: [1_131.34, -2_282.343, 6_672.423], velocity: [-5.643_05, 4.303_33, 2.428_79], time: 40 * 60 },
    },
    claimed: { position: [-4_219.752_7, 4_363.029_2, -3_958.766_6], velocity: [3.689_866, -1.916_735, -6.112_511] },
    relative: 1e-7,
  },
  {
    source: "Vallado, Example 6-1 (Hohmann, 191.34411 km to 35 781.34857 km altitude), recalled from memory",
    claim: { kind: "hohmann", body: VALLADO_EARTH, given: { initialAltitude: 191.344_11, finalAltitude: 35_781.348_57 } },
    claimed: { deltaV1: 2.457_038, deltaV2: 1.478_187, deltaVTotal: 3.935_224, transferTime: 5.256_713 * 3600 },
    relative: 1e-6,
  },
  {
    source: "Vallado, Example 6-2 (bi-elliptic, 191.34411 km to 376 310 km via 503 873 km), recalled from memory",
    claim: { kind: "biElliptic", body: VALLADO_EARTH, given: { initialAltitude: 191.344_11, finalAltitude: 376_310, intermediateAltitude: 503_873 } },
    claimed: { deltaV1: 3.156_233, deltaV2: 0.677_358, deltaV3: 0.070_466, deltaVTotal: 3.904_057, transferTime: 593.919 * 3600 },
    relative: 2e-6,
  },
  {
    source: "Vallado, Example 6-4 (inclination-only change of 15° at 5.892311 km/s: Δv = 1.5382 km/s), recalled from memory",
    claim: { kind: "planeChange", body: VALLADO_EARTH, given: { angle: 15, speed: 5.892_311 } },
    claimed: { deltaV: 1.5382 },
    relative: 1e-4,
  },
  {
    source: "Curtis, Example 5.2 (Lambert, 1 h between [5000, 10000, 2100] and [-14600, 2500, 7000] km), recalled from memory",
    claim: { kind: "lambert", body: CURTIS_EARTH, given: { position1: [5_000, 10_000, 2_100], position2: [-14_600, 2_500, 7_000], timeOfFlight: 3_600 } },
    claimed: { velocity1: [-5.9925, 1.9254, 3.2456], velocity2: [-3.3125, -4.1966, -0.385_29] },
    relative: 2e-5,
  },
  {
    source: "Vallado, Example 7-5 (Lambert, short way, 76 min), recalled from memory",
    claim: {
      kind: "lambert",
      body: VALLADO_EARTH,
      given: { position1: [15_945.34, 0, 0], position2: [12_214.838_99, 10_249.467_31, 0], timeOfFlight: 76 * 60 },
    },
    claimed: { velocity1: [2.058_913, 2.915_965, 0], velocity2: [-3.451_565, 0.910_315, 0] },
    relative: 1e-6,
  },
  {
    source: "Curtis, Example 8.3 (Earth departure to Mars from a 300 km parking orbit: v∞ = 2.943 km/s, Δv = 3.590 km/s), recalled from memory",
    claim: {
      kind: "interplanetaryHohmann",
      body: CURTIS_SUN,
      given: { from: CURTIS_EARTH_HELIO, to: CURTIS_MARS_HELIO, departureAltitude: 300 },
    },
    claimed: { departureExcessSpeed: 2.943, departureDeltaV: 3.59, transferTime: 258.8 * 86_400, arrivalExcessSpeed: 2.648 },
    relative: 5e-4,
  },
  {
    source: "Curtis, Example 8.3 departure hyperbola as an escape claim (v∞ = 2.943 km/s at 300 km: Δv = 3.590 km/s), recalled from memory",
    claim: { kind: "escape", body: CURTIS_EARTH, given: { parkingAltitude: 300, hyperbolicExcessSpeed: 2.943 } },
    claimed: { deltaV: 3.59, circularSpeed: 7.726 },
    relative: 2e-4,
  },
  {
    source: "Curtis, sun-synchronous example (circular orbit with a 100 min period: i = 98.43°, altitude 758 km), recalled from memory",
    claim: { kind: "sunSynchronous", body: CURTIS_EARTH, given: { period: 6_000 } },
    claimed: { inclination: 98.43 },
    relative: 1e-4,
  },
  {
    source: "Curtis, sun-synchronous example (circular orbit with a 100 min period: altitude 758 km), recalled from memory",
    claim: { kind: "orbit", body: CURTIS_EARTH, given: { period: 6_000, eccentricity: 0 } },
    claimed: { apoapsisAltitude: 758 },
    relative: 1e-3,
  },
  {
    source: "Curtis, J2 example (280 km by 400 km, i = 51.43°: Ω̇ = −5.181°/day, ω̇ = 3.920°/day), recalled from memory",
    claim: { kind: "j2Rates", body: CURTIS_EARTH, given: { periapsisAltitude: 280, apoapsisAltitude: 400, inclination: 51.43 } },
    claimed: { raanRate: -5.181, argPeriapsisRate: 3.92 },
    relative: 5e-4,
  },
  {
    source: "Curtis, Table A.2 sphere-of-influence radius of Earth (925 000 km), recalled from memory",
    claim: { kind: "sphereOfInfluence", body: { ...CURTIS_EARTH_HELIO, parentMu: 1.327e11 }, given: {} },
    claimed: { radius: 925_000 },
    relative: 1e-3,
  },
  {
    source: "Curtis, Table A.2 sphere-of-influence radius of Mars (577 000 km), recalled from memory",
    claim: { kind: "sphereOfInfluence", body: { ...CURTIS_MARS_HELIO, parentMu: 1.327e11 }, given: {} },
    claimed: { radius: 577_000 },
    relative: 2e-3,
  },
  {
    source: "Curtis, Table A.2 sphere-of-influence radius of Jupiter (48.2e6 km), recalled from memory",
    claim: { kind: "sphereOfInfluence", body: { name: "jupiter", mu: 126.686e6, radius: 71_490, orbitRadius: 778.6e6, parentMu: 1.327e11 }, given: {} },
    claimed: { radius: 48.2e6 },
    relative: 2e-3,
  },
  {
    source: "Curtis, Table A.2 sphere-of-influence radius of the Moon (66 100 km), recalled from memory",
    claim: { kind: "sphereOfInfluence", body: { name: "moon", mu: 4_903, radius: 1_737, orbitRadius: 384_400, parentMu: 398_600 }, given: {} },
    claimed: { radius: 66_100 },
    relative: 2e-3,
  },
  {
    source: "Curtis, geostationary orbit example (sidereal day 23 h 56 min 4 s: r = 42 164 km, altitude 35 786 km, v = 3.075 km/s), recalled from memory",
    claim: { kind: "orbit", body: CURTIS_EARTH, given: { period: 86_164, eccentricity: 0 } },
    claimed: { semiMajorAxis: 42_164, apoapsisAltitude: 35_786, periapsisSpeed: 3.075 },
    relative: 2e-4,
  },
  {
    source: "NASA GSFC Mars fact sheet, synodic period 779.94 days (recalled from memory), with the engine's default constants",
    claim: { kind: "interplanetaryHohmann", body: "sun", given: { from: "earth", to: "mars", departureAltitude: 300 } },
    claimed: { synodicPeriod: 779.94 * 86_400 },
    relative: 2e-3,
  },
  {
    source: "Standard gravity by definition (3rd CGPM, 1901): a mass ratio of e at Isp 300 s gives Δv = 300 × 9.80665 m/s² exactly",
    claim: { kind: "rocket", body: "earth", given: { specificImpulse: 300, initialMass: Math.E * 1000, finalMass: 1000 } },
    claimed: { deltaV: 2.941_995, massRatio: Math.E },
    relative: 1e-12,
  },
  {
    source: "Standard gravity by definition (3rd CGPM, 1901): a budget of 1.5 + 1.441995 km/s against mass ratio e at Isp 300 s leaves zero margin",
    claim: {
      kind: "deltaVBudget",
      body: "earth",
      given: {
        maneuvers: [
          { name: "transfer", deltaV: 1.5 },
          { name: "insertion", deltaV: 1.441_995 },
        ],
        specificImpulse: 300,
        initialMass: Math.E * 500,
        finalMass: 500,
      },
    },
    claimed: { deltaVRequired: 2.941_995, deltaVAvailable: 2.941_995, marginOk: true },
    relative: 1e-12,
  },
  {
    source: "Geostationary equinox eclipse, about 69–70 min in a cylindrical shadow (common practice figure of the trade)",
    claim: { kind: "eclipse", body: VALLADO_EARTH, given: { altitude: 35_786, betaAngle: 0 } },
    claimed: { eclipseDuration: 69.4 * 60 },
    relative: 3e-3,
  },
  {
    source: "Horizon geometry at zero elevation (common practice): slant range √(r² − R²) and central angle acos(R/r) for 500 km",
    claim: { kind: "groundContact", body: VALLADO_EARTH, given: { altitude: 500, minimumElevation: 0 } },
    claimed: {
      maxSlantRange: Math.sqrt(6_878.137 ** 2 - 6_378.137 ** 2),
      earthCentralAngle: (Math.acos(6_378.137 / 6_878.137) * 180) / Math.PI,
    },
    relative: 1e-12,
  },
];

describe("published worked examples and tables", () => {
  for (const c of CASES) {
    describe(c.source, () => {
      for (const [q, v] of Object.entries(c.claimed)) {
        it(`reproduces ${q}`, () => {
          expectBook({ id: q, ...c.claim, claimed: { [q]: v } }, c.relative, c.absolute);
        });
      }
    });
  }

  it("counts at least 40 published figures", () => {
    const n = CASES.reduce((s, c) => s + Object.keys(c.claimed).length, 0);
    expect(n).toBeGreaterThanOrEqual(40);
  });

  it("the contract's example request is consistent at its own 1 % tolerance with the engine's Earth defaults (WGS-84 μ and radius)", () => {
    const claim = {
      id: "c1",
      kind: "orbit",
      body: "earth",
      given: { periapsisAltitude: 500, apoapsisAltitude: 800 },
      claimed: { period: 5827, eccentricity: 0.0214 },
    };
    // Version 2's default of 0.1 % no longer lets 0.63 % through.
    expect(evaluateClaim(claim).status).toBe("inconsistent");
    const r = evaluateClaim(claim, { relative: 0.01 });
    expect(r.status).toBe("consistent");
    expect(r.computed.semiMajorAxis).toBeCloseTo(7028.137, 6);
    expect(r.computed.eccentricity).toBeCloseTo(0.021343, 6);
    expect(r.computed.period as number).toBeCloseTo(5863.69, 2);
    expect(r.checks).toHaveLength(2);
    expect(r.checks[0]).toMatchObject({ quantity: "period", claimed: 5827, unit: "s", ok: true });
    expect(r.checks[0]!.relativeError!).toBeCloseTo(0.0063, 4);
  });
});
