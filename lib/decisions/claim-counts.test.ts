import { describe, expect, it } from "vitest";
import { countClaims } from "./claim-counts";

const entry = (quantity: string, ok: boolean) => ({ quantity, claimed: 1, computed: 1, unit: "s", ok });

describe("counting orbit claims for the letter and the decision page", () => {
  it("counts claimed values, not blocks: 2 blocks with 3 claims, 2 of them wrong", () => {
    const counts = countClaims([
      {
        status: "inconsistent",
        claim: { claimed: { period: 1, apoapsisAltitude: 2 } },
        result: { checks: [entry("period", false), entry("apoapsisAltitude", true)] },
      },
      { status: "inconsistent", claim: { claimed: { deltaVTotal: 0.2 } }, result: { checks: [entry("deltaVTotal", false)] } },
    ]);
    expect(counts).toEqual({ blocks: 2, claims: 3, flagged: 2, inconsistent: 2, invalid: 0 });
  });

  it("counts each claimed value of a block that cannot be evaluated as flagged", () => {
    const counts = countClaims([
      { status: "invalid", claim: { claimed: { period: 1, eccentricity: 0.1 } }, result: { checks: [], messages: ["missing"] } },
      { status: "consistent", claim: { claimed: { period: 1 } }, result: { checks: [entry("period", true)] } },
    ]);
    expect(counts).toEqual({ blocks: 2, claims: 3, flagged: 2, inconsistent: 0, invalid: 2 });
  });

  it("no blocks, no claims", () => {
    expect(countClaims([])).toEqual({ blocks: 0, claims: 0, flagged: 0, inconsistent: 0, invalid: 0 });
  });
});
