import { describe, expect, it } from "vitest";
import { evaluateBlocks, extractOrbitChecks } from "./claims";
import { rerunWithTodaysRules } from "./rerun";

const BLOCK = "5b0e0f52-8f3c-4a43-9d1e-2f6f4e1a7c10";
// A 500 km circular Earth orbit has a period of about 5677 s (two-body, the engine's own
// constants table); 5690 s is 0.23 % off: inside 1 %, outside 0.1 %.
const doc = {
  type: "doc",
  content: [
    {
      type: "orbitCheck",
      attrs: { blockId: BLOCK, label: "science orbit", claim: { kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: "5690" } } },
    },
  ],
};

describe("today's rules beside an old record", () => {
  it("finds the claim that a tightened policy no longer passes, and leaves the record as given", () => {
    const old = evaluateBlocks(extractOrbitChecks(doc), { relative: 0.01 })[0]!;
    expect(old.result.status).toBe("consistent");
    const record = { blockId: BLOCK, label: "science orbit", kind: "orbit", status: old.result.status, result: { ...old.result }, contractVersion: 1 };
    const frozen = JSON.stringify(record);
    const rerun = rerunWithTodaysRules(doc, [record], { relative: 0.001 });
    expect(rerun.differing).toBe(1);
    expect(rerun.blocks[0]).toMatchObject({ storedStatus: "consistent", storedContractVersion: 1, todayStatus: "inconsistent" });
    expect(rerun.blocks[0]!.changes.map((c) => [c.quantity, c.stored?.ok, c.today?.ok])).toEqual([["period", true, false]]);
    expect(JSON.stringify(record)).toBe(frozen);
    expect(rerunWithTodaysRules(doc, [record], { relative: 0.01 }).differing).toBe(0);
  });
});
