import { describe, expect, it } from "vitest";
import { changedKeys, keepBoth, mergeDrafts, SAVED_ELSEWHERE, type Draft } from "./draft-merge";

const base: Draft = {
  scores: { science: { score: 3, comment: "Fine" }, cost: { score: 2, comment: "" } },
  summary: "First summary",
};

describe("review draft merge", () => {
  it("takes one-sided changes from both sides", () => {
    const mine: Draft = { ...base, scores: { ...base.scores, cost: { score: 2, comment: "Too costly" } } };
    const theirs: Draft = { ...base, summary: "Newer summary" };
    const { merged, overlaps } = mergeDrafts(base, mine, theirs);
    expect(overlaps).toEqual([]);
    expect(merged.summary).toBe("Newer summary");
    expect(merged.scores.cost).toEqual({ score: 2, comment: "Too costly" });
    expect(merged.scores.science).toEqual({ score: 3, comment: "Fine" });
  });

  it("a stale screen with no edits of its own changes nothing that was saved", () => {
    const theirs: Draft = { scores: { ...base.scores, science: { score: 5, comment: "Newer comment" } }, summary: base.summary };
    const { merged, overlaps } = mergeDrafts(base, base, theirs);
    expect(overlaps).toEqual([]);
    expect(changedKeys(merged, theirs)).toEqual([]);
  });

  it("reports fields both sides changed, keeps the saved value there, and keepBoth loses neither text", () => {
    const mine: Draft = { ...base, scores: { ...base.scores, science: { score: 4, comment: "Mine" } } };
    const theirs: Draft = { ...base, scores: { ...base.scores, science: { score: 5, comment: "Theirs" } } };
    const { merged, overlaps } = mergeDrafts(base, mine, theirs);
    expect(overlaps.map((o) => o.key).sort()).toEqual(["comment:science", "score:science"]);
    expect(merged.scores.science).toEqual({ score: 5, comment: "Theirs" });
    const both = keepBoth(merged, overlaps);
    expect(both.scores.science).toEqual({ score: 4, comment: `Mine\n\n${SAVED_ELSEWHERE}\nTheirs` });
  });

  it("the same change on both sides is no overlap", () => {
    const mine: Draft = { ...base, summary: "Same" };
    const theirs: Draft = { ...base, summary: "Same" };
    expect(mergeDrafts(base, mine, theirs).overlaps).toEqual([]);
  });
});
