/**
 * The request runner: tolerance rules, statuses and messages exactly as the contract says,
 * and no exception for any input whatsoever.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  checkOrbitClaims,
  conicForPlot,
  evaluateClaim,
  exitCodeFor,
  KIND_NAMES,
  ORBIT_CHECK_KINDS,
  orbitCheckJsonSchemas,
  orbitCheckResponseSchema,
  overallStatus,
} from "./index";

const CONTRACT_REQUEST = {
  tolerance: { relative: 0.01 },
  claims: [
    {
      id: "c1",
      kind: "orbit",
      body: "earth",
      given: { periapsisAltitude: 500, apoapsisAltitude: 800 },
      claimed: { period: 5827, eccentricity: 0.0214 },
    },
  ],
};

const orbit = (claimed: Record<string, unknown>, given: Record<string, unknown> = { periapsisAltitude: 500, apoapsisAltitude: 800 }) =>
  evaluateClaim({ id: "x", kind: "orbit", body: "earth", given, claimed });

describe("the contract's example", () => {
  it("is consistent, with two check rows and every derivable quantity computed", () => {
    const res = checkOrbitClaims(CONTRACT_REQUEST);
    expect(res.error).toBeUndefined();
    expect(res.results).toHaveLength(1);
    const r = res.results[0]!;
    expect(r).toMatchObject({ id: "c1", kind: "orbit", status: "consistent", messages: [] });
    expect(r.checks.map((c) => c.quantity)).toEqual(["period", "eccentricity"]);
    for (const q of [
      "semiMajorAxis",
      "eccentricity",
      "semiLatusRectum",
      "semiMinorAxis",
      "periapsisRadius",
      "apoapsisRadius",
      "period",
      "meanMotion",
      "specificEnergy",
      "specificAngularMomentum",
      "periapsisSpeed",
      "apoapsisSpeed",
      "orbitType",
    ])
      expect(r.computed).toHaveProperty(q);
    expect(r.computed.orbitType).toBe("elliptic");
    expect(exitCodeFor(res)).toBe(0);
    expect(orbitCheckResponseSchema.safeParse(res).success).toBe(true);
  });

  it("survives a JSON round trip unchanged (no Infinity or NaN in the response)", () => {
    const res = checkOrbitClaims(CONTRACT_REQUEST);
    expect(JSON.parse(JSON.stringify(res))).toEqual(res);
  });
});

describe("tolerance", () => {
  it("passes within the relative bound (0.1 % by default in contract version 2) and fails outside it", () => {
    // Computed period 5863.69 s: 0.09 % off passes, 0.2 % off fails (both far beyond 1 s and the 0.5 s of the written digits).
    const pass = orbit({ period: "5869" });
    expect(pass.status).toBe("consistent");
    expect(pass.checks[0]).toMatchObject({ basis: "relative", ok: true });
    expect(pass.checks[0]!.allowance!).toBeCloseTo(5.86369, 4);
    const r = orbit({ period: 5863.69 * 1.002 });
    expect(r.status).toBe("inconsistent");
    expect(r.checks[0]!.ok).toBe(false);
    // The version 1 default (1 %) remains reachable through the tolerance.
    expect(
      evaluateClaim({
        kind: "orbit",
        body: "earth",
        given: { periapsisAltitude: 500, apoapsisAltitude: 800 },
        claimed: { period: 5863.69 * 1.009 },
        tolerance: { relative: 0.01 },
      }).status,
    ).toBe("consistent");
  });

  it("passes within the absolute bound of the unit even when the relative error is large", () => {
    // 0.5 km off a 500 km altitude is 0.1 % relative; 0.9 km off a tiny quantity still passes by the 1 km bound.
    const r = evaluateClaim({ kind: "orbit", body: "earth", given: { altitude: 1 }, claimed: { periapsisAltitude: 1.9 }, tolerance: { relative: 0 } });
    expect(r.status).toBe("consistent");
    const r2 = evaluateClaim({ kind: "orbit", body: "earth", given: { altitude: 1 }, claimed: { periapsisAltitude: 2.1 }, tolerance: { relative: 0 } });
    expect(r2.status).toBe("inconsistent");
  });

  it("uses the request's tolerance, with per-unit absolute overrides", () => {
    const req = (absolute: Record<string, number>) => ({
      tolerance: { relative: 0, absolute },
      claims: [{ id: "a", kind: "hohmann", body: "earth", given: { initialAltitude: 300, finalAltitude: 35786 }, claimed: { transferTime: 19000 } }],
    });
    // Computed ≈ 18 990 s; 10 s off.
    expect(checkOrbitClaims(req({})).results[0]!.status).toBe("inconsistent");
    expect(checkOrbitClaims(req({ s: 60 })).results[0]!.status).toBe("consistent");
  });

  it("compares angles modulo 360°", () => {
    const r = evaluateClaim({
      kind: "stateVector",
      body: { name: "earth", mu: 398600 },
      given: { position: [-6045, -3490, 2500], velocity: [-3.457, 6.618, 2.533] },
      claimed: { raan: 255.279 - 360 },
    });
    expect(r.status).toBe("consistent");
  });

  it("compares vectors as a whole: length of the difference relative to the computed length", () => {
    const base = {
      kind: "propagate",
      body: { name: "earth", mu: 398600.4418 },
      given: { position: [1131.34, -2282.343, 6672.423], velocity: [-5.64305, 4.30333, 2.42879], time: 2400 },
    };
    const ok = evaluateClaim({ ...base, claimed: { position: [-4219.75, 4363.03, -3958.77] } });
    expect(ok.status).toBe("consistent");
    expect(ok.checks[0]!.relativeError).toBeLessThan(1e-5);
    const bad = evaluateClaim({ ...base, claimed: { position: [-4219.75, 4363.03, 3958.77] }, tolerance: { relative: 0.01, absolute: { km: 0 } } });
    expect(bad.status).toBe("inconsistent");
    expect(bad.checks[0]!.absoluteError!).toBeCloseTo(2 * 3958.77, 0);
  });

  it("requires an exact match for text", () => {
    expect(orbit({ orbitType: "elliptic" }).status).toBe("consistent");
    expect(orbit({ orbitType: "circular" }).status).toBe("inconsistent");
  });
});

describe("invalid claims get a message a proposer can act on", () => {
  const expectInvalid = (claim: unknown, pattern: RegExp) => {
    const r = evaluateClaim(claim);
    expect(r.status).toBe("invalid");
    expect(r.messages.join(" ")).toMatch(pattern);
    return r;
  };

  it("unknown kind lists the valid kinds", () => {
    expectInvalid({ id: "k", kind: "warpDrive", given: {} }, /unknown kind "warpDrive".*orbit.*lambert/);
  });

  it("unknown claimed quantity lists the valid names, and still reports the good rows", () => {
    const r = expectInvalid(
      { kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { perod: 5600, period: 5677 } },
      /cannot derive "perod".*valid names: .*period/,
    );
    expect(r.checks.map((c) => c.quantity)).toEqual(["period"]);
  });

  it("unknown given value lists the valid names", () => {
    expectInvalid({ kind: "orbit", body: "earth", given: { periapsisAltitud: 500, apoapsisAltitude: 800 } }, /unknown given.*periapsisAltitud.*valid names/);
  });

  it("missing givens", () => {
    expectInvalid({ kind: "orbit", body: "earth", given: { periapsisAltitude: 500 } }, /second independent value/);
    expectInvalid({ kind: "hohmann", body: "earth", given: { initialAltitude: 500 } }, /finalAltitude or finalRadius/);
    expectInvalid({ kind: "lambert", body: "earth", given: { position1: [7000, 0, 0], timeOfFlight: 100 } }, /position2/);
  });

  it("contradictory givens", () => {
    expectInvalid({ kind: "orbit", body: "earth", given: { altitude: 500, periapsisAltitude: 400 } }, /circular orbit by itself/);
    expectInvalid({ kind: "orbit", body: "earth", given: { periapsisAltitude: 500, apoapsisAltitude: 300 } }, /below periapsis/);
    expectInvalid({ kind: "orbit", body: "earth", given: { semiMajorAxis: 7000, period: 5800 } }, /not independent/);
    expectInvalid({ kind: "orbit", body: "earth", given: { periapsisAltitude: 500, periapsisRadius: 6878, eccentricity: 0.1 } }, /both give the periapsis/);
    expectInvalid({ kind: "rocket", given: { specificImpulse: 300, initialMass: 100, finalMass: 200 } }, /exceeds initialMass/);
    expectInvalid({ kind: "escape", given: { parkingAltitude: 300, c3: 9, hyperbolicExcessSpeed: 3 } }, /exactly one/);
  });

  it("non-finite and wrongly typed numbers", () => {
    expectInvalid({ kind: "orbit", body: "earth", given: { periapsisAltitude: Number.NaN, apoapsisAltitude: 800 } }, /finite number in km/);
    expectInvalid({ kind: "orbit", body: "earth", given: { periapsisAltitude: Infinity, apoapsisAltitude: 800 } }, /finite number/);
    expectInvalid({ kind: "orbit", body: "earth", given: { periapsisAltitude: "500", apoapsisAltitude: 800 } }, /finite number in km \(got the text "500"\)/);
    expectInvalid(
      { kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: "95 min" } },
      /claimed.period is not a plain decimal number.*remove the unit/,
    );
    expectInvalid({ kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: true } }, /claimed.period must be a number or a decimal string/);
  });

  it("negative where impossible", () => {
    expectInvalid({ kind: "orbit", body: "earth", given: { periapsisAltitude: 500, eccentricity: -0.1 } }, /eccentricity must be zero or positive/);
    expectInvalid({ kind: "rocket", given: { specificImpulse: -300, initialMass: 100, finalMass: 50 } }, /specificImpulse must be positive/);
    expectInvalid(
      { kind: "lambert", body: "earth", given: { position1: [7000, 0, 0], position2: [0, 8000, 0], timeOfFlight: -5 } },
      /timeOfFlight must be positive/,
    );
  });

  it("periapsis below the surface", () => {
    expectInvalid(
      { kind: "orbit", body: "earth", given: { periapsisAltitude: -50, apoapsisAltitude: 800 } },
      /below the surface of earth.*raise the periapsis/,
    );
    expectInvalid({ kind: "orbit", body: "earth", given: { apoapsisAltitude: 800, eccentricity: 0.5 } }, /below the surface/);
  });

  it("bound-orbit quantities asked of open orbits", () => {
    const r = expectInvalid(
      { kind: "orbit", body: "earth", given: { periapsisAltitude: 300, eccentricity: 1.5 }, claimed: { period: 9000 } },
      /period is defined only for closed orbits.*hyperbolic/,
    );
    expect(r.computed.hyperbolicExcessSpeed).toBeGreaterThan(0);
    expectInvalid(
      { kind: "orbit", body: "earth", given: { periapsisAltitude: 300, eccentricity: 1 }, claimed: { semiMajorAxis: 1 } },
      /parabola has no finite semi-major axis/,
    );
    expectInvalid({ kind: "orbit", body: "earth", given: { altitude: 300 }, claimed: { hyperbolicExcessSpeed: 1 } }, /only for open orbits/);
  });

  it("Lambert at exactly 180° explains that the plane is undefined", () => {
    expectInvalid(
      { kind: "lambert", body: "earth", given: { position1: [7000, 0, 0], position2: [-8000, 0, 0], timeOfFlight: 3000 } },
      /180°.*plane is undefined/,
    );
  });

  it("unknown body and incomplete overrides", () => {
    expectInvalid({ kind: "orbit", body: "pluto", given: { altitude: 100 } }, /not in the constants table/);
    expectInvalid({ kind: "orbit", body: { name: "vesta", mu: 17.8 }, given: { altitude: 100 } }, /needs both mu.*radius/);
    expectInvalid({ kind: "orbit", body: { name: "earth", mu: -1 }, given: { altitude: 100 } }, /mu must be a positive number/);
  });

  it("a claim that is not an object", () => {
    expectInvalid("orbit please", /a claim must be an object/);
    expectInvalid(null, /a claim must be an object/);
  });
});

describe("requests", () => {
  it("one bad claim never spoils the others; exit code reflects the worst", () => {
    const res = checkOrbitClaims({
      tolerance: CONTRACT_REQUEST.tolerance,
      claims: [
        CONTRACT_REQUEST.claims[0],
        { id: "bad", kind: "orbit", given: { periapsisAltitude: "x" } },
        { id: "wrong", kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: 7000 } },
      ],
    });
    expect(res.results.map((r) => r.status)).toEqual(["consistent", "invalid", "inconsistent"]);
    expect(exitCodeFor(res)).toBe(2);
    expect(overallStatus(res)).toBe("invalid");
    expect(exitCodeFor({ notice: res.notice, results: [res.results[0]!, res.results[2]!] })).toBe(1);
  });

  it("a malformed envelope says why and has no results", () => {
    for (const bad of [null, 42, "claims", [], {}, { claims: "all" }]) {
      const res = checkOrbitClaims(bad);
      expect(res.error).toMatch(/request must be an object/);
      expect(res.results).toEqual([]);
      expect(exitCodeFor(res)).toBe(2);
    }
    // A refused tolerance names its field (contract version 2, "Bad input").
    const res = checkOrbitClaims({ claims: [], tolerance: { relative: -1 } });
    expect(res.error).toMatch(/tolerance.relative: the relative bound must not be negative/);
    expect(res.results).toEqual([]);
    expect(exitCodeFor(res)).toBe(2);
  });

  it("assigns ids to claims that have none", () => {
    const res = checkOrbitClaims({ claims: [{ kind: "orbit", body: "earth", given: { altitude: 500 } }] });
    expect(res.results[0]!.id).toBe("claim-1");
  });

  it("every contract kind is implemented, with units for every given and computed quantity", () => {
    const contractKinds = [
      "orbit",
      "stateVector",
      "elements",
      "kepler",
      "timeOfFlight",
      "propagate",
      "hohmann",
      "biElliptic",
      "planeChange",
      "rocket",
      "deltaVBudget",
      "escape",
      "interplanetaryHohmann",
      "sphereOfInfluence",
      "j2Rates",
      "sunSynchronous",
      "lambert",
      "eclipse",
      "groundContact",
    ];
    expect([...KIND_NAMES].sort()).toEqual([...contractKinds].sort());
    for (const k of ORBIT_CHECK_KINDS) {
      expect(k.computed.length).toBeGreaterThan(0);
      for (const q of [...k.given, ...k.computed]) expect(typeof q.unit).toBe("string");
    }
  });

  it("publishes JSON Schemas for the request and response", () => {
    const { request, response } = orbitCheckJsonSchemas() as {
      request: { properties: Record<string, unknown> };
      response: { properties: Record<string, unknown> };
    };
    expect(request.properties).toHaveProperty("claims");
    expect(response.properties).toHaveProperty("results");
  });
});

describe("conicForPlot", () => {
  it("gives p, e and apse radii for an orbit claim", () => {
    const plot = conicForPlot(CONTRACT_REQUEST.claims[0]);
    expect(plot.bodyRadius).toBeCloseTo(6378.137, 6);
    expect(plot.conics).toHaveLength(1);
    const c = plot.conics[0]!;
    expect(c.periapsisRadius).toBeCloseTo(6878.137, 6);
    expect(c.apoapsisRadius!).toBeCloseTo(7178.137, 6);
    expect(c.p / (1 + c.e)).toBeCloseTo(6878.137, 6);
  });

  it("gives initial, transfer and final conics for a Hohmann transfer", () => {
    const plot = conicForPlot({ kind: "hohmann", body: "earth", given: { initialAltitude: 300, finalAltitude: 35786 } });
    expect(plot.conics.map((c) => c.label)).toEqual(["initial", "transfer", "final"]);
    expect(plot.conics[1]!.periapsisRadius).toBeCloseTo(6678.137, 6);
    expect(plot.conics[1]!.apoapsisRadius!).toBeCloseTo(42164.137, 6);
  });

  it("explains when there is nothing to draw, without throwing", () => {
    expect(conicForPlot({ kind: "rocket", given: { specificImpulse: 300, initialMass: 10, finalMass: 5 } }).conics).toEqual([]);
    expect(conicForPlot({ kind: "orbit", given: { altitude: -7000 } }).message).toMatch(/altitude|surface/);
    expect(conicForPlot(undefined).conics).toEqual([]);
  });
});

describe("hostile inputs never throw and always give a status", { timeout: 60_000 }, () => {
  const statuses = new Set(["consistent", "inconsistent", "invalid"]);
  const junk = fc.oneof(
    fc.anything(),
    fc.constantFrom(Number.NaN, Infinity, -Infinity, -1e308, 1e308, -0, 5e-324, "", "NaN", [], {}, [1, 2], [1, 2, 3, 4], [Number.NaN, 0, 0]),
  );
  const nameArb = fc.constantFrom(
    "periapsisAltitude",
    "apoapsisAltitude",
    "altitude",
    "eccentricity",
    "semiMajorAxis",
    "period",
    "semiLatusRectum",
    "position",
    "velocity",
    "time",
    "position1",
    "position2",
    "timeOfFlight",
    "direction",
    "angle",
    "speed",
    "specificImpulse",
    "initialMass",
    "finalMass",
    "deltaV",
    "maneuvers",
    "from",
    "to",
    "departureAltitude",
    "inclination",
    "raan",
    "argPeriapsis",
    "trueAnomaly",
    "meanAnomaly",
    "betaAngle",
    "minimumElevation",
    "parkingAltitude",
    "c3",
    "initialAltitude",
    "finalAltitude",
    "intermediateAltitude",
    "trueAnomalyFrom",
    "trueAnomalyTo",
    "__proto__",
    "constructor",
    "toString",
  );
  const numberish = fc.oneof(fc.double(), fc.double({ min: -1e5, max: 1e5, noNaN: true }), fc.integer(), junk);
  const claimArb = fc.record(
    {
      id: fc.oneof(fc.string(), fc.integer(), junk),
      kind: fc.oneof(fc.constantFrom(...KIND_NAMES), fc.string(), junk),
      body: fc.oneof(fc.constantFrom("earth", "sun", "moon", "mars", "pluto"), fc.record({ name: fc.string(), mu: numberish, radius: numberish }), junk),
      given: fc.oneof(fc.dictionary(nameArb, fc.oneof(numberish, fc.array(numberish, { maxLength: 4 }))), junk),
      claimed: fc.oneof(fc.dictionary(fc.oneof(nameArb, fc.string()), numberish), junk),
      tolerance: junk,
    },
    { requiredKeys: [] },
  );

  it("single claims: random structure and values", () => {
    fc.assert(
      fc.property(claimArb, (claim) => {
        const r = evaluateClaim(claim);
        expect(statuses.has(r.status)).toBe(true);
        expect(typeof r.id).toBe("string");
        expect(() => JSON.stringify(r)).not.toThrow();
        for (const v of Object.values(r.computed)) {
          if (typeof v === "number") expect(Number.isFinite(v)).toBe(true);
        }
        expect(r.messages.join(" ")).not.toMatch(/internal error/);
      }),
      { numRuns: 4000 },
    );
  });

  it("whole requests: anything at all", () => {
    fc.assert(
      fc.property(
        fc.oneof(
          fc.anything(),
          fc.record({ claims: fc.array(fc.oneof(claimArb, fc.anything()), { maxLength: 5 }), tolerance: junk }, { requiredKeys: ["claims"] }),
        ),
        (req) => {
          const res = checkOrbitClaims(req);
          expect(Array.isArray(res.results)).toBe(true);
          for (const r of res.results) expect(statuses.has(r.status)).toBe(true);
          expect([0, 1, 2]).toContain(exitCodeFor(res));
        },
      ),
      { numRuns: 3000 },
    );
  });

  it("plausible numbers for every kind (the physics edge cases) never throw", () => {
    const val = fc.oneof(
      fc.double({ min: -1e6, max: 1e6, noNaN: true }),
      fc.double({ min: 0, max: 2, noNaN: true }),
      fc.tuple(
        fc.double({ min: -1e5, max: 1e5, noNaN: true }),
        fc.double({ min: -1e5, max: 1e5, noNaN: true }),
        fc.double({ min: -1e5, max: 1e5, noNaN: true }),
      ),
    );
    fc.assert(
      fc.property(fc.constantFrom(...ORBIT_CHECK_KINDS), fc.array(val, { minLength: 8, maxLength: 8 }), fc.integer({ min: 0, max: 255 }), (k, vals, mask) => {
        const given: Record<string, unknown> = {};
        k.given.forEach((g, i) => {
          if (mask & (1 << (i % 8)) || g.use === "required")
            given[g.name] =
              g.type === "vector"
                ? Array.isArray(vals[i % 8])
                  ? vals[i % 8]
                  : [7000, 0, 0]
                : g.type === "body"
                  ? "mars"
                  : g.type === "maneuvers"
                    ? [{ name: "a", deltaV: vals[i % 8] }]
                    : g.type === "text"
                      ? "prograde"
                      : Array.isArray(vals[i % 8])
                        ? 1
                        : vals[i % 8];
        });
        const claimed = Object.fromEntries(
          k.computed.map((c) => [c.name, c.type === "vector" ? [1, 2, 3] : c.type === "text" ? "x" : c.type === "boolean" ? true : 1]),
        );
        const r = evaluateClaim({ kind: k.kind, body: "earth", given, claimed });
        expect(statuses.has(r.status)).toBe(true);
        expect(r.messages.join(" ")).not.toMatch(/internal error/);
      }),
      { numRuns: 6000 },
    );
  });
});
