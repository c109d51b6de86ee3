import { describe, expect, it } from "vitest";
import { checkOrbitClaims } from "@/lib/orbit";
import { evaluateRequirements, requirementSummary } from "./registry";
import type { CallRequirement, RequirementClaim } from "./types";

const north = { name: "North site", latitude: 64.8, longitude: -147.7, minimumElevation: 10 };
const south = { name: "South site", latitude: -53, longitude: -70.9, minimumElevation: 5 };

/** A claim as the requirements see it: the engine's own recomputation. */
function claimOf(kind: string, given: Record<string, unknown>): RequirementClaim {
  const r = checkOrbitClaims({ claims: [{ id: "c", kind, given }] }).results[0]!;
  return { kind, status: r.status, given, computed: r.computed };
}

const req = (type: string, params: Record<string, unknown>): CallRequirement => ({ id: crypto.randomUUID(), type, params, rationale: "" });

describe("contact and link requirements", () => {
  const contact = claimOf("contactTime", { altitude: 550, inclination: 97.6, stations: [north] });
  const least = contact.computed.contactPerDayMin as number;

  it("minimum daily contact: met above, not met below, judged on the least day", () => {
    expect(evaluateRequirements([req("minDailyContact", { minimumPerDay: least - 60 })], contact)[0]).toMatchObject({ status: "met" });
    const notMet = evaluateRequirements([req("minDailyContact", { minimumPerDay: least + 60 })], contact)[0]!;
    expect(notMet.status).toBe("notMet");
    expect(notMet.reason).toMatch(/least contact has .* min, the call asks at least/);
    expect(notMet.rows[0]).toMatchObject({ label: "Least daily contact", sense: "min" });
  });

  it("counts only the stations the call names", () => {
    const both = claimOf("contactTime", { altitude: 550, inclination: 97.6, stations: [north, south] });
    const r = evaluateRequirements([req("minDailyContact", { minimumPerDay: 60, stations: ["North site"] })], both)[0]!;
    expect(r.status).toBe("notMet");
    expect(r.reason).toMatch(/counts South site, which the call does not name/);
    expect(evaluateRequirements([req("minDailyContact", { minimumPerDay: 60, stations: ["North site"] })], contact)[0]!.status).toBe("met");
    expect(requirementSummary(req("minDailyContact", { minimumPerDay: 1800, stations: ["North site"] }))).toBe(
      "Contact at least 30 min every day at North site",
    );
  });

  it("maximum gap between contacts", () => {
    const gap = contact.computed.longestGap as number;
    expect(evaluateRequirements([req("maxContactGap", { maximumGap: gap + 60 })], contact)[0]!.status).toBe("met");
    expect(evaluateRequirements([req("maxContactGap", { maximumGap: gap - 60 })], contact)[0]!.status).toBe("notMet");
  });

  it("minimum link margin, on the NOAA EMWIN-N downlink (margin 7.8 dB)", () => {
    const link = claimOf("linkBudget", {
      frequency: 1.6927,
      transmitPower: 1,
      transmitGain: 14.8,
      losses: 0.6,
      gOverT: -0.3,
      range: 41127,
      dataRate: 9600,
      requiredEbN0: 5.6,
    });
    expect(evaluateRequirements([req("minLinkMargin", { minimumMargin: 3 })], link)[0]!.status).toBe("met");
    const r = evaluateRequirements([req("minLinkMargin", { minimumMargin: 10 })], link)[0]!;
    expect(r.status).toBe("notMet");
    expect(r.reason).toMatch(/the link margin is 7\.8 dB, the call asks at least 10 dB/);
  });

  it("an invalid claim is not evaluated, and bad parameters are reported", () => {
    const bad = claimOf("contactTime", { altitude: 550, inclination: 97.6, stations: [{ ...north, latitude: 95 }] });
    expect(evaluateRequirements([req("minDailyContact", { minimumPerDay: 600 })], bad)[0]!.status).toBe("notEvaluated");
    expect(evaluateRequirements([req("minLinkMargin", { minimumMargin: -1 })], contact)).toEqual([]); // not a link claim
    expect(evaluateRequirements([req("maxContactGap", { maximumGap: -5 })], contact)[0]).toMatchObject({ status: "notEvaluated" });
  });
});
