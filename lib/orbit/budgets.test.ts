/**
 * The budget kinds: lifetime, disposal, massBudget and deltaVBudget with phases.
 * Each check names its source; values recalled from memory say so.
 */
import { describe, expect, it } from "vitest";
import { checkOrbitClaims, evaluateClaim } from "./index";
import { density, EXPONENTIAL_ATMOSPHERE, tabulatedDensity } from "./atmosphere";
import { defaultBody } from "./constants";
import { decayOrbit } from "./decay";
import { GROWTH_ALLOWANCE, massBudget } from "./kinds/mass-budget";

const earth = defaultBody("earth");
const life = (given: Record<string, unknown>) => evaluateClaim({ kind: "lifetime", body: "earth", given });
const years = (given: Record<string, unknown>) => {
  const r = life(given);
  expect(r.status, r.messages.join("; ")).toBe("consistent");
  return r.computed.lifetimeYears as number;
};

describe("exponential atmosphere (Vallado's table from the U.S. Standard Atmosphere 1976 / CIRA-72, recalled from memory)", () => {
  it("returns the tabulated base densities at the base altitudes", () => {
    // Vallado, exponential atmospheric model: 400 km → 3.725e-12 kg/m³, 1000 km → 3.019e-15 kg/m³.
    expect(tabulatedDensity(400)).toBeCloseTo(3.725e-12, 20);
    expect(tabulatedDensity(1000)).toBeCloseTo(3.019e-15, 22);
    expect(tabulatedDensity(0)).toBe(1.225);
  });
  it("is continuous to within 3 % at every layer boundary (the table's own consistency)", () => {
    for (let i = 1; i < EXPONENTIAL_ATMOSPHERE.length; i++) {
      const [h] = EXPONENTIAL_ATMOSPHERE[i]!;
      const below = tabulatedDensity(h - 1e-9);
      expect(Math.abs(below / tabulatedDensity(h) - 1)).toBeLessThan(0.03);
    }
  });
  it("orders the solar activity levels low < mean < high above 120 km and leaves them equal below", () => {
    expect(density(400, "low")).toBeLessThan(density(400, "mean"));
    expect(density(400, "mean")).toBeLessThan(density(400, "high"));
    expect(density(100, "low")).toBe(density(100, "high"));
  });
});

describe("lifetime: published figures (recalled from memory, with wide bounds)", () => {
  it("a 1U CubeSat released at 400 km (1.33 kg, 0.01 m², Cd 2.2) re-enters within months to about two years", () => {
    // Common figure for CubeSats deployed from the International Space Station at about 400 km:
    // re-entry typically within a year or two (recalled from memory).
    const y = years({ altitude: 400, mass: 1.33, dragArea: 0.01, dragCoefficient: 2.2 });
    expect(y).toBeGreaterThan(0.2);
    expect(y).toBeLessThan(2);
  });
  it("a circular 600 km orbit with B = 100 kg/m² lasts a few decades (about the 25-year guideline)", () => {
    // Debris-mitigation literature: circular orbits near 600 km meet a 25-year lifetime for typical
    // ballistic coefficients, at mean solar activity (recalled from memory).
    const y = years({ altitude: 600, ballisticCoefficient: 100 });
    expect(y).toBeGreaterThan(10);
    expect(y).toBeLessThan(60);
  });
  it("a circular 800 km orbit lasts centuries", () => {
    // Same literature: from 800 km the natural lifetime is counted in centuries (recalled from memory).
    expect(years({ altitude: 800, ballisticCoefficient: 100 })).toBeGreaterThan(100);
  });
});

describe("lifetime: against the closed form for a circular orbit in one exponential layer", () => {
  it("matches t = B·∫dh/(√(μr)·ρ(h)) between 499 and 451 km (King-Hele's circular-orbit decay, integrated exactly)", () => {
    // da/dt = −√(μ a)·ρ/B for a circular orbit (King-Hele 1987; Vallado §9). Within the 450–500 km
    // layer ρ = ρ0·exp(−(h − 450)/H); integrate dt = B dh/(√(μ r) ρ) with Simpson's rule.
    const B = 80;
    const [h0, rho0, H] = EXPONENTIAL_ATMOSPHERE.find((r) => r[0] === 450)!;
    const f = (h: number) => (B * 1000) / (Math.sqrt(earth.mu * 1e9 * (earth.radius + h) * 1000) * rho0 * Math.exp(-(h - h0) / H));
    const n = 200;
    let s = 0;
    for (let i = 0; i <= n; i++) {
      const h = 451 + ((499 - 451) * i) / n;
      s += f(h) * (i === 0 || i === n ? 1 : i % 2 === 1 ? 4 : 2);
    }
    const expectedSeconds = (s * (499 - 451)) / n / 3;
    const d = decayOrbit({
      mu: earth.mu,
      radius: earth.radius,
      a: earth.radius + 499,
      e: 0,
      ballisticCoefficient: B,
      solarActivity: "mean",
      stopPerigeeAltitude: 451,
    });
    expect(Math.abs((d.lifetimeYears * 365.25 * 86400) / expectedSeconds - 1)).toBeLessThan(0.005);
  });
});

describe("lifetime: properties", () => {
  it("increases with altitude", () => {
    const ys = [300, 400, 500, 600, 700].map((h) => years({ altitude: h, ballisticCoefficient: 50 }));
    for (let i = 1; i < ys.length; i++) expect(ys[i]!).toBeGreaterThan(ys[i - 1]!);
  });
  it("increases with the ballistic coefficient", () => {
    const ys = [10, 30, 100, 300].map((B) => years({ altitude: 450, ballisticCoefficient: B }));
    for (let i = 1; i < ys.length; i++) expect(ys[i]!).toBeGreaterThan(ys[i - 1]!);
  });
  it("decreases with solar activity", () => {
    const [low, mean, high] = (["low", "mean", "high"] as const).map((s) => years({ altitude: 500, ballisticCoefficient: 50, solarActivity: s }));
    expect(low!).toBeGreaterThan(mean!);
    expect(mean!).toBeGreaterThan(high!);
  });
  it("returns about 50 decay samples from the start to re-entry, the perigee falling to 100 km", () => {
    const r = life({ periapsisAltitude: 350, apoapsisAltitude: 900, ballisticCoefficient: 40 });
    const p = r.computed.decayProfile as { years: number; periapsisAltitude: number; apoapsisAltitude: number }[];
    expect(p).toHaveLength(50);
    expect(p[0]!.periapsisAltitude).toBeCloseTo(350, 6);
    expect(p[0]!.apoapsisAltitude).toBeCloseTo(900, 6);
    expect(p[49]!.periapsisAltitude).toBeCloseTo(100, 6);
    expect(p[49]!.years).toBeCloseTo(r.computed.lifetimeYears as number, 9);
    for (let i = 1; i < p.length; i++) expect(p[i]!.apoapsisAltitude).toBeLessThanOrEqual(p[i - 1]!.apoapsisAltitude + 1e-9);
  });
});

describe("lifetime and disposal: bad input is invalid with a message naming the field", () => {
  it.each([
    [{ altitude: 400, ballisticCoefficient: 0 }, /ballisticCoefficient must be more than 0/],
    [{ altitude: 90, ballisticCoefficient: 50 }, /already below 100 km/],
    [{ altitude: 400 }, /give the drag inputs/],
    [{ altitude: 400, ballisticCoefficient: 50, solarActivity: "extreme" }, /solarActivity must be one of low, mean, high/],
  ])("%j", (given, message) => {
    const r = life(given);
    expect(r.status).toBe("invalid");
    expect(r.messages.join(" ")).toMatch(message);
  });
  it("refuses a target perigee above the mission perigee", () => {
    const r = evaluateClaim({ kind: "disposal", given: { altitude: 600, targetPerigeeAltitude: 650, ballisticCoefficient: 50 } });
    expect(r.status).toBe("invalid");
    expect(r.messages[0]).toMatch(/targetPerigeeAltitude .* must be below the mission orbit's perigee/);
  });
});

describe("disposal", () => {
  it("computes the apogee burn by vis-viva, the propellant by the rocket equation, and judges the deadline", () => {
    // Hand-worked: circular 700 km → r = 7078.137 km, v = √(398600.4418/7078.137) = 7.50422 km/s;
    // after lowering perigee to 300 km, a = (7078.137 + 6678.137)/2 = 6878.137 km and
    // v_a = √(μ(2/7078.137 − 1/6878.137)) = 7.39431 km/s; Δv = 0.10991 km/s.
    // Propellant for 150 kg at 220 s: 150(1 − e^(−0.10991/(220·0.00980665))) = 7.450 kg.
    const r = evaluateClaim({
      kind: "disposal",
      given: { altitude: 700, targetPerigeeAltitude: 300, ballisticCoefficient: 50, deadlineYears: 25, specificImpulse: 220, mass: 150 },
      claimed: { deltaV: 0.1099, propellantMass: 7.45, deadlineMet: true },
    });
    expect(r.status, r.messages.join("; ")).toBe("consistent");
    expect(r.computed.deltaV as number).toBeCloseTo(0.10991, 4);
    expect(r.computed.lifetimeYears as number).toBeLessThan(r.computed.naturalLifetimeYears as number);
  });
  it("without a burn judges the natural lifetime, and a low enough target perigee re-enters at once", () => {
    const none = evaluateClaim({ kind: "disposal", given: { altitude: 700, ballisticCoefficient: 50, deadlineYears: 25 } });
    expect(none.computed.deltaV).toBe(0);
    expect(none.computed.deadlineMet).toBe(false);
    expect(none.computed.lifetimeYears).toBe(none.computed.naturalLifetimeYears);
    const steep = evaluateClaim({ kind: "disposal", given: { altitude: 700, targetPerigeeAltitude: 50, ballisticCoefficient: 50, deadlineYears: 5 } });
    expect(steep.computed.lifetimeYears).toBe(0);
    expect(steep.computed.deadlineMet).toBe(true);
  });
});

describe("massBudget: growth allowances of ESA's margin philosophy (SRE-PA/2011.097, recalled from memory)", () => {
  it("uses 5 % off the shelf, 10 % modified, 20 % new design", () => {
    expect(GROWTH_ALLOWANCE).toEqual({ offTheShelf: 0.05, modified: 0.1, new: 0.2 });
  });
  it("adds growth, a 20 % system margin and propellant, and compares with the launch allowance", () => {
    // Hand-worked: 10 kg new (+2), 20 kg off the shelf (+1), 5 kg modified (+0.5) → 38.5 kg with growth;
    // +20 % system margin = 46.2 kg; +4 kg propellant = 50.2 kg against a 55 kg allowance:
    // allowance margin (55 − 50.2)/55 = 8.727 %; system margin left (55 − 4 − 38.5)/38.5 = 32.47 %.
    const b = massBudget(
      [
        { name: "structure", mass: 10, maturity: "new" },
        { name: "reaction wheels", mass: 20, maturity: "offTheShelf" },
        { name: "radio", mass: 5, maturity: "modified" },
      ],
      0.2,
      55,
      4,
    );
    expect(b.growthAllowance).toBeCloseTo(3.5, 12);
    expect(b.totalWithMargin).toBeCloseTo(46.2, 12);
    expect(b.wetMass).toBeCloseTo(50.2, 12);
    expect(b.allowanceMargin!).toBeCloseTo(0.087273, 6);
    expect(b.systemMarginAvailable!).toBeCloseTo(0.324675, 6);
    expect(b.fits).toBe(true);
  });
  it("refuses negative items and a margin of 100 %", () => {
    const neg = evaluateClaim({ kind: "massBudget", given: { items: [{ name: "bus", mass: -3, maturity: "new" }], systemMargin: 0.2 } });
    expect(neg.status).toBe("invalid");
    expect(neg.messages[0]).toMatch(/items\[0\]\.mass cannot be negative/);
    const full = evaluateClaim({ kind: "massBudget", given: { items: [{ name: "bus", mass: 3, maturity: "new" }], systemMargin: 1 } });
    expect(full.status).toBe("invalid");
    expect(full.messages[0]).toMatch(/systemMargin/);
  });
});

describe("deltaVBudget with phases: hand-worked example", () => {
  const given = {
    specificImpulse: 220,
    thrusterSpecificImpulse: 200,
    initialMass: 150,
    finalMass: 130,
    residualFraction: 0.02,
    phases: [
      { name: "transfer", type: "deterministic", margin: 0.05, maneuvers: [{ name: "raise", deltaV: 0.1 }] },
      { name: "corrections", type: "statistical", margin: 0.1, maneuvers: [{ name: "trim", deltaV: 0.02, engine: "thrusters" }] },
    ],
  };
  it("sizes each phase in order with its own Isp and margin", () => {
    // By hand (g0 = 9.80665 m/s²): ve main = 2.157463 km/s, thrusters 1.961330 km/s.
    // Transfer: 0.1 × 1.05 = 0.105 km/s; mp = 150(1 − e^(−0.105/2.157463)) = 7.1254 kg → 142.8746 kg.
    // Corrections: 0.02 × 1.1 = 0.022 km/s; mp = 142.8746(1 − e^(−0.022/1.96133)) = 1.5937 kg.
    // Usable: (150 − 130)(1 − 0.02) = 19.6 kg; available 2.157463·ln(150/130.4) = 0.30211 km/s;
    // margin (0.30211 − 0.12)/0.12 = 151.76 %.
    const r = evaluateClaim({ kind: "deltaVBudget", given, claimed: { deltaVRequired: 0.12, deltaVAvailable: 0.3021, propellantRequired: 8.719 } });
    expect(r.status, r.messages.join("; ")).toBe("consistent");
    const phases = r.computed.phases as { propellant: number; marginOk: boolean }[];
    expect(phases[0]!.propellant).toBeCloseTo(7.1254, 3);
    expect(phases[1]!.propellant).toBeCloseTo(1.5937, 3);
    expect(r.computed.propellantUsable).toBeCloseTo(19.6, 12);
    expect(r.computed.margin as number).toBeCloseTo(1.5176, 3);
    expect(r.computed.closes).toBe(true);
    // Δv available at the start of each phase, on the usable propellant still aboard (by hand):
    // transfer 2.157463·ln(150/130.4) = 0.302107 km/s; corrections 2.157463·ln(142.8746/130.4)
    // = 0.197107 km/s (the transfer's 0.105 km/s at the main engine's Isp is spent).
    const available = r.computed.phaseDeltaVAvailable as { name: string; deltaVAvailable: number }[];
    expect(available.map((p) => p.name)).toEqual(["transfer", "corrections"]);
    expect(available[0]!.deltaVAvailable).toBeCloseTo(0.302107, 5);
    expect(available[1]!.deltaVAvailable).toBeCloseTo(0.197107, 5);
  });
  it("says when the budget closes only without its statistical margins", () => {
    // Load just enough propellant for the phases without the statistical margin (0.1 → 0): not with it.
    const r = evaluateClaim({
      kind: "deltaVBudget",
      given: {
        ...given,
        residualFraction: 0,
        finalMass: 150 - 8.69,
        phases: [given.phases[0], { ...given.phases[1], margin: 0.5 }],
      },
    });
    expect(r.computed.closes).toBe(false);
    expect(r.computed.closesWithoutStatisticalMargins).toBe(true);
  });
  it("refuses a budget with no phases and a phase with an unknown type", () => {
    const none = evaluateClaim({ kind: "deltaVBudget", given: { ...given, phases: [] } });
    expect(none.status).toBe("invalid");
    expect(none.messages[0]).toMatch(/phases is empty/);
    const odd = evaluateClaim({ kind: "deltaVBudget", given: { ...given, phases: [{ ...given.phases[0], type: "optional" }] } });
    expect(odd.messages[0]).toMatch(/phases\[0\]\.type must be deterministic or statistical/);
  });
  it("keeps the single-list budget of version 1", () => {
    const r = checkOrbitClaims({
      claims: [{ kind: "deltaVBudget", given: { maneuvers: [{ name: "a", deltaV: 0.1 }], specificImpulse: 220, initialMass: 200, finalMass: 170 } }],
    });
    expect(r.results[0]!.status).toBe("consistent");
    expect(Object.keys(r.results[0]!.computed).sort()).toEqual(["deltaVAvailable", "deltaVRequired", "margin", "marginOk"]);
  });
});
