// The rail's budget uses the dossier's own budget block in full, and the call's requirements
// judge the blocks live with the code the server runs at submission.
import { describe, expect, it } from "vitest";
import { deltaVBudget, evaluateBlocks, extractOrbitChecks } from "./claims";
import { countOutcomes, judgeBlocks, missingClaims } from "./requirements";
import { rowBand } from "@/lib/requirements";

const block = (n: number, label: string, claim: Record<string, unknown>) => ({
  type: "orbitCheck",
  attrs: { blockId: `00000000-0000-4000-8000-00000000010${n}`, label, claim },
});

describe("the rail's Δv budget", () => {
  it("counts every manoeuvre of the dossier's own budget block, not only those with a block of their own", () => {
    // Three manoeuvres in the budget (0.1 + 0.05 + 0.2 = 0.35 km/s); only the first also has a Hohmann block.
    const doc = {
      type: "doc",
      content: [
        block(1, "raise", { kind: "hohmann", body: "earth", given: { initialAltitude: 400, finalAltitude: 550 } }),
        block(2, "budget", {
          kind: "deltaVBudget",
          given: {
            maneuvers: [
              { name: "raise", deltaV: 0.1 },
              { name: "phasing", deltaV: 0.05 },
              { name: "disposal", deltaV: 0.2 },
            ],
            specificImpulse: 220,
            initialMass: 180,
            finalMass: 150,
          },
        }),
      ],
    };
    const b = deltaVBudget(evaluateBlocks(extractOrbitChecks(doc)));
    expect(b.maneuvers.map((m) => m.label)).toEqual(["raise", "phasing", "disposal"]);
    expect(b.required).toBeCloseTo(0.35, 12);
    // Rocket equation: 220 s × 9.80665 m/s² × ln(180/150) = 0.39336 km/s; margin (0.39336 − 0.35)/0.35 = 12.4 %.
    expect(b.available!).toBeCloseTo(0.39336, 4);
    expect(b.margin!).toBeCloseTo(0.1239, 3);
  });
});

describe("requirements judged on blocks", () => {
  const doc = {
    type: "doc",
    content: [
      block(3, "end of life", { kind: "disposal", body: "earth", given: { altitude: 700, ballisticCoefficient: 50 } }),
      block(4, "shadow", { kind: "eclipse", body: "earth", given: { altitude: 700 } }),
    ],
  };
  const requirements = [
    { id: "r1", type: "disposalDeadline", params: { years: 25 }, rationale: "" },
    { id: "r2", type: "maxEclipse", params: { maximumDuration: 1800 } as Record<string, unknown>, rationale: "" },
    { id: "r3", type: "systemMassMargin", params: { minimumMargin: 0.2 }, rationale: "" },
  ];
  it("judges each concerned block and lists the requirements no block addresses", () => {
    const evaluations = evaluateBlocks(extractOrbitChecks(doc));
    const outcomes = judgeBlocks(evaluations, requirements);
    const disposal = outcomes["00000000-0000-4000-8000-000000000103"]!;
    expect(disposal.map((o) => [o.requirementId, o.status])).toEqual([["r1", "notMet"]]);
    // A 700 km circular orbit at beta 0 spends about 35.5 min in shadow (engine's cylindrical model): above 30 min.
    const eclipse = outcomes["00000000-0000-4000-8000-000000000104"]!;
    expect(eclipse[0]!.status).toBe("notMet");
    expect(eclipse[0]!.reason).toMatch(/the eclipse lasts 3\d\.\d min, the call allows 30\.0 min/);
    expect(countOutcomes(Object.values(outcomes))).toEqual({ met: 0, notMet: 2, notEvaluated: 0 });
    expect(missingClaims(evaluations, requirements).map((r) => r.id)).toEqual(["r3"]);
  });
  it("colours figures red below, amber within 5 points, green above", () => {
    const row = (actual: number) => ({ label: "m", actual, required: 0.1, unit: "fraction", sense: "min" as const, closeWithin: 0.05 });
    expect(rowBand(row(0.09))).toBe("below");
    expect(rowBand(row(0.14))).toBe("close");
    expect(rowBand(row(0.2))).toBe("clear");
    expect(rowBand({ ...row(30), sense: "max", required: 25, unit: "years", closeWithin: 1.25 })).toBe("below");
  });
});
