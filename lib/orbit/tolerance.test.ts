/**
 * Contract version 2's tolerance: defaults, wrapped angles, stated precision, the largest
 * bound, and bad input (claimed strings and refused policies). Reference values are the
 * contract's own examples unless a source is named.
 */
import { describe, expect, it } from "vitest";
import { parseDecimal, parsePlainDecimal, precisionAllowance } from "./decimal";
import {
  checkOrbitClaims,
  CONTRACT_VERSION,
  DEFAULT_ABSOLUTE_TOLERANCE,
  DEFAULT_RELATIVE_TOLERANCE,
  evaluateClaim,
  evaluateClaimWithPolicy,
  exitCodeFor,
  NOTICE,
  orbitCheckResponseSchema,
  parseTolerancePolicy,
  toleranceSummary,
  DEFAULT_TOLERANCE,
  ORBIT_CHECK_KINDS,
} from "./index";

describe("precision allowance: half a unit in the last written digit (contract examples)", () => {
  it.each([
    ["3.9", 0.05],
    ["3.90", 0.005],
    ["86400", 0.5],
    ["8.64e4", 50],
    ["-0.25", 0.005],
    [".5", 0.05],
    ["7.", 0.5],
    ["1E-3", 0.0005],
    [" 42 ", 0.5],
  ])("%j → %s", (text, allowance) => {
    const r = parseDecimal(text);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.allowance).toBeCloseTo(allowance, 15);
  });

  it("a JSON number counts as written in its shortest round-trip form", () => {
    expect(precisionAllowance(3.9)).toBeCloseTo(0.05, 15);
    expect(precisionAllowance(86400)).toBe(0.5);
    expect(precisionAllowance(0.0214)).toBeCloseTo(0.00005, 15);
    expect(precisionAllowance(1e21)).toBe(5e20);
    expect(precisionAllowance(Number.NaN)).toBeNull();
  });

  it.each(["3.9 km/s", "", "1e400", "0x10", "--1", "86 400", "86,400", ".", "e5", "1e", "+-1", "Infinity", "NaN", "1/2"])(
    "%j is not a plain decimal",
    (text) => {
      const r = parseDecimal(text);
      expect(r.ok).toBe(false);
      expect(() => parsePlainDecimal(text, "claimed.period")).toThrow(/^claimed\.period /);
    },
  );

  it("says what to do: remove the unit, drop separators", () => {
    expect(parseDecimal("3.9 km/s")).toMatchObject({ ok: false, message: expect.stringMatching(/remove the unit/) });
    expect(parseDecimal("86 400")).toMatchObject({ ok: false, message: expect.stringMatching(/without separators/) });
    expect(parseDecimal("1e400")).toMatchObject({ ok: false, message: expect.stringMatching(/too large/) });
  });
});

describe("the version 2 rule", () => {
  it("defaults: relative 0.1 %, angles 0.05°, the other units as in version 1", () => {
    expect(DEFAULT_RELATIVE_TOLERANCE).toBe(0.001);
    expect(DEFAULT_ABSOLUTE_TOLERANCE).toMatchObject({ km: 1, "km/s": 0.001, deg: 0.05, s: 1, kg: 0.1, "deg/day": 0.001 });
    expect(toleranceSummary(DEFAULT_TOLERANCE)).toBe("checked at 0.1 %, angles 0.05°");
  });

  it('"3.9" passes for 3.854, "3.90" does not (contract example), and each row names its bound', () => {
    // A 3.854 km/s speed: circular speed at r = μ/3.854² with WGS-84 μ (common practice: v = √(μ/r)).
    const r = 398_600.4418 / 3.854 ** 2;
    const claim = (speed: string) =>
      evaluateClaim({ kind: "orbit", body: "earth", given: { semiMajorAxis: r, eccentricity: 0 }, claimed: { periapsisSpeed: speed } });
    const loose = claim("3.9");
    expect(loose.status).toBe("consistent");
    expect(loose.checks[0]).toMatchObject({ claimed: "3.9", basis: "precision", ok: true });
    expect(loose.checks[0]!.allowance).toBeCloseTo(0.05, 12);
    const tight = claim("3.90");
    expect(tight.status).toBe("inconsistent");
    expect(tight.checks[0]).toMatchObject({ claimed: "3.90", basis: "precision", ok: false });
    expect(tight.checks[0]!.allowance).toBeCloseTo(0.005, 12);
  });

  it("a geostationary period of 86 400 s (a solar day) fails at 0.1 % where 1 % let it through", () => {
    // Geostationary radius 42 164 km (Curtis, geostationary example, recalled from memory): T = 86 164 s.
    const claim = { kind: "orbit", body: "earth", given: { semiMajorAxis: 42_164, eccentricity: 0 }, claimed: { period: 86_400 } };
    expect(evaluateClaim(claim).status).toBe("inconsistent");
    expect(evaluateClaim(claim, { relative: 0.01 }).status).toBe("consistent");
  });

  it("angles: wrapped, absolute bound only; 350° is held to the same 0.05° as 5°", () => {
    const node = (claimed: number) =>
      evaluateClaim({
        kind: "stateVector",
        body: { name: "earth", mu: 398_600 },
        given: { position: [-6_045, -3_490, 2_500], velocity: [-3.457, 6.618, 2.533] },
        claimed: { raan: claimed },
      });
    // Curtis, Example 4.3: Ω = 255.3° (recalled from memory); engine gives 255.2793°.
    expect(node(255.279 - 360).status).toBe("consistent");
    expect(node(255.279 + 720).status).toBe("consistent");
    const off = node(255.279 + 0.2);
    expect(off.status).toBe("inconsistent");
    expect(off.checks[0]).toMatchObject({ basis: "absolute", allowance: 0.05 });
    // A relative bound of 40 % cannot loosen an angle.
    expect(
      evaluateClaim({ kind: "kepler", given: { eccentricity: 0, meanAnomaly: 350 }, claimed: { trueAnomaly: "353.50" }, tolerance: { relative: 0.4 } }).status,
    ).toBe("inconsistent");
  });

  it("a call can tighten the relative bound (the largest bound still holds the absolute one)", () => {
    const claim = { kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: "5680" } };
    // Computed 5676.98 s: 3 s off is 0.053 %.
    expect(evaluateClaim(claim).status).toBe("consistent");
    expect(evaluateClaim(claim, { relative: 0.0001 }).status).toBe("inconsistent");
    expect(evaluateClaim(claim, { relative: 0.0001, absolute: { s: 5 } }).checks[0]).toMatchObject({ ok: true, basis: "absolute", allowance: 5 });
  });

  it("vectors: each component's written digits earn their allowance; the vector's is their length", () => {
    // Vallado, Example 2-6 position [6525.344, 6861.535, 6449.125] km (recalled from memory), written to the kilometre.
    const claim = {
      kind: "elements",
      body: { name: "earth", mu: 398_600.4418, radius: 6_378.137 },
      given: { semiLatusRectum: 11_067.79, eccentricity: 0.832_85, inclination: 87.87, raan: 227.89, argPeriapsis: 53.38, trueAnomaly: 92.335 },
      claimed: { position: ["6525", "6862", "6449"] },
      tolerance: { relative: 0, absolute: { km: 0 } },
    };
    const r = evaluateClaim(claim);
    expect(r.checks[0]).toMatchObject({ basis: "precision", precision: [0.5, 0.5, 0.5], ok: true });
    expect(r.checks[0]!.allowance).toBeCloseTo(Math.sqrt(3) * 0.5, 12);
    expect(evaluateClaim({ ...claim, claimed: { position: ["6525.0", "6862.0", "6449.0"] } }).status).toBe("inconsistent");
  });
});

describe("bad input gets a message naming the field, never a failure of the request", () => {
  it.each(["3.9 km/s", "", "1e400", "0x10", "--1"])("claimed period %j makes the claim invalid", (text) => {
    const res = checkOrbitClaims({ claims: [{ id: "p", kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: text } }] });
    expect(res.error).toBeUndefined();
    expect(res.results[0]!.status).toBe("invalid");
    expect(res.results[0]!.messages[0]).toMatch(/^claimed\.period /);
    expect(exitCodeFor(res)).toBe(2);
  });

  it("a bad component of a claimed vector names its index", () => {
    const r = evaluateClaim({
      kind: "propagate",
      body: "earth",
      given: { position: [7000, 0, 0], velocity: [0, 7.5, 0], time: 60 },
      claimed: { position: ["7000", "4 km", 0] },
    });
    expect(r.status).toBe("invalid");
    expect(r.messages[0]).toMatch(/^claimed\.position\[1\] is not a plain decimal/);
  });

  it.each([
    [{ relative: -0.1 }, "tolerance.relative", /must not be negative/],
    [{ relative: 0.5 }, "tolerance.relative", /below 0.5/],
    [{ relative: Infinity }, "tolerance.relative", /finite/],
    [{ absolute: { km: -1 } }, "tolerance.absolute.km", /must not be negative/],
    [{ absolute: { deg: Number.NaN } }, "tolerance.absolute.deg", /finite|number/],
    [{ relative: "0.1" }, "tolerance.relative", /number/],
  ])("policy %j is refused naming %s", (policy, path, message) => {
    const p = parseTolerancePolicy(policy);
    expect(p.ok).toBe(false);
    if (!p.ok) {
      expect(p.issues[0]!.path).toBe(path);
      expect(p.issues[0]!.message).toMatch(message);
    }
    const res = checkOrbitClaims({ tolerance: policy, claims: [] });
    expect(res.error).toMatch(new RegExp(`tolerance is refused: ${path.replace(/\./g, "\\.")}`));
    expect(exitCodeFor(res)).toBe(2);
    const one = evaluateClaimWithPolicy({ id: "x", kind: "orbit", given: { altitude: 500 } }, policy);
    expect(one.status).toBe("invalid");
    expect(one.messages[0]).toContain(path);
  });
});

describe("response additions", () => {
  it("every response carries the notice and the contract version, errors included", () => {
    for (const req of [{ claims: [] }, { claims: [{ kind: "orbit", given: { altitude: 500 } }] }, 42, { tolerance: { relative: 2 }, claims: [] }]) {
      const res = checkOrbitClaims(req);
      expect(res.notice).toBe(NOTICE);
      expect(res.contractVersion).toBe(CONTRACT_VERSION);
      expect(orbitCheckResponseSchema.safeParse(res).success).toBe(true);
    }
    expect(NOTICE).toMatch(/two-body screening estimates, not flight-qualified analysis/i);
    expect(NOTICE).toMatch(/flight dynamics, mission assurance and its licensing authority's rules govern/);
  });

  it("sunSynchronous uses the body's own year and refuses bodies without one", () => {
    // Mars: 360° per 686.973-day tropical year (NASA fact sheet, recalled from memory) = 0.524°/day.
    const mars = evaluateClaim({ kind: "sunSynchronous", body: "mars", given: { altitude: 300 } });
    expect(mars.status).toBe("consistent");
    expect(mars.computed.raanRate as number).toBeCloseTo(360 / 686.973, 9);
    const earth = evaluateClaim({ kind: "sunSynchronous", body: "earth", given: { altitude: 800 } });
    expect(earth.computed.raanRate as number).toBeCloseTo(360 / 365.242_19, 9);
    for (const body of ["moon", "sun"]) {
      const r = evaluateClaim({ kind: "sunSynchronous", body, given: { altitude: 300 } });
      expect(r.status).toBe("invalid");
      expect(r.messages[0]).toMatch(/no orbital period about the sun.*year \(days\)/);
    }
    expect(evaluateClaim({ kind: "sunSynchronous", body: { name: "moon", year: 365.25 }, given: { altitude: 100 } }).status).not.toBe("invalid");
  });

  it("a 600 km sun-synchronous inclination claimed for 800 km fails (0.8° off)", () => {
    const at600 = evaluateClaim({ kind: "sunSynchronous", body: "earth", given: { altitude: 600 } }).computed.inclination as number;
    const r = evaluateClaim({ kind: "sunSynchronous", body: "earth", given: { altitude: 800 }, claimed: { inclination: Number(at600.toFixed(2)) } });
    expect(r.status).toBe("inconsistent");
  });

  it("J2 formulas use j2ReferenceRadius, from the table or an override", () => {
    const base = { kind: "j2Rates", given: { altitude: 700, inclination: 98 } };
    const table = evaluateClaim({ ...base, body: "earth" }).computed.raanRate as number;
    const scaled = evaluateClaim({ ...base, body: { name: "earth", j2ReferenceRadius: 6_378.136_3 * 1.01 } }).computed.raanRate as number;
    // Ω̇ ∝ J2 R² (Vallado §9.6 first-order secular rate).
    expect(scaled / table).toBeCloseTo(1.01 ** 2, 9);
  });

  it("orbit computes meanMotionRevPerDay; groundContact emits centralAngle and its old name", () => {
    // 86 400 / 5676.98 s at 500 km (WGS-84 μ and a).
    const o = evaluateClaim({ kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { meanMotionRevPerDay: "15.22" } });
    expect(o.status).toBe("consistent");
    expect(o.checks[0]).toMatchObject({ unit: "rev/day" });
    const g = evaluateClaim({ kind: "groundContact", body: "earth", given: { altitude: 500, minimumElevation: 0 }, claimed: { earthCentralAngle: 21.98 } });
    expect(g.computed.centralAngle).toBe(g.computed.earthCentralAngle);
    const kind = ORBIT_CHECK_KINDS.find((k) => k.kind === "groundContact")!;
    expect(kind.computed.find((c) => c.name === "earthCentralAngle")).toMatchObject({ aliasOf: "centralAngle", unit: "deg" });
    expect(kind.computed.find((c) => c.name === "centralAngle")?.aliasOf).toBeUndefined();
    expect(g.status).toBe("consistent");
    expect(g.messages.join(" ")).toMatch(/earthCentralAngle is the contract version 1 name of centralAngle/);
    expect(
      evaluateClaim({ kind: "groundContact", body: "earth", given: { altitude: 500, minimumElevation: 0 }, claimed: { centralAngle: "21.98" } }).status,
    ).toBe("consistent");
  });
});
