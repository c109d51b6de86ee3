import { describe, expect, it } from "vitest";
import { rubricProblems, scoreProblems, submitProblems, weightedTotal, weightsSumTo100, type RubricCriterion } from "./rubric";

const levels = ["Poor", "Weak", "Adequate", "Strong", "Excellent"];
const criterion = (id: string, weight: number, commentRequiredBelow: number | null = null): RubricCriterion => ({
  id,
  title: id,
  description: "",
  weight,
  scaleMin: 1,
  scaleMax: 5,
  levels,
  commentRequiredBelow,
});
const rubric = [criterion("science", 50, 3), criterion("feasibility", 30), criterion("cost", 20)];

describe("weighted total of one review", () => {
  it("is Σ wᵢ·sᵢ / 100 once every criterion is scored (worked by hand)", () => {
    // 50·4 + 30·3 + 20·5 = 200 + 90 + 100 = 390; 390 / 100 = 3.9
    const total = weightedTotal(rubric, {
      science: { score: 4, comment: "" },
      feasibility: { score: 3, comment: "" },
      cost: { score: 5, comment: "" },
    });
    expect(total).toEqual({ value: expect.closeTo(3.9, 12), scored: 3, total: 3, complete: true });
  });

  it("runs over the scored criteria only while scoring is under way", () => {
    // (50·4 + 30·3) / (50 + 30) = 290 / 80 = 3.625
    const total = weightedTotal(rubric, { science: { score: 4, comment: "" }, feasibility: { score: 3, comment: "" }, cost: { score: null, comment: "" } });
    expect(total.value).toBeCloseTo(3.625, 12);
    expect(total.complete).toBe(false);
    expect(total.scored).toBe(2);
  });

  it("is null when nothing is scored", () => {
    expect(weightedTotal(rubric, {}).value).toBeNull();
  });
});

describe("rubric template checks", () => {
  it("accepts weights that add up to 100 % and refuses 99 % with the sum in the message", () => {
    expect(weightsSumTo100(rubric)).toBe(true);
    expect(rubricProblems(rubric)).toEqual([]);
    const off = [criterion("a", 33), criterion("b", 33), criterion("c", 33)];
    expect(weightsSumTo100(off)).toBe(false);
    expect(rubricProblems(off).map((p) => p.message)).toContain("The weights add up to 99 %; they must add up to 100 %.");
  });

  it("tolerates binary rounding of fractional weights (33.3 + 33.3 + 33.4)", () => {
    expect(weightsSumTo100([criterion("a", 33.3), criterion("b", 33.3), criterion("c", 33.4)])).toBe(true);
  });

  it("needs one descriptor per level and one scale for the whole rubric", () => {
    const short = { ...criterion("a", 50), levels: ["x", "y"] };
    const otherScale = { ...criterion("b", 50), scaleMin: 0, scaleMax: 10, levels: Array.from({ length: 11 }, (_, i) => `L${i}`) };
    const messages = rubricProblems([short, otherScale]).map((p) => p.message);
    expect(messages).toContain('"a": a 1..5 scale has 5 levels, so it needs 5 descriptors (got 2).');
    expect(messages).toContain('"b": every criterion of a rubric uses the same scale (1..5).');
  });

  it("refuses duplicate criterion ids and an empty rubric", () => {
    expect(rubricProblems([criterion("a", 50), criterion("a", 50)])[0]!.message).toMatch(/used twice/);
    expect(rubricProblems([])[0]!.message).toMatch(/at least one criterion/);
  });
});

describe("score checks", () => {
  it("refuses a score outside the scale, a fractional score and an unknown criterion", () => {
    const problems = scoreProblems(rubric, {
      science: { score: 6, comment: "" },
      feasibility: { score: 2.5, comment: "" },
      budget: { score: 3, comment: "" },
    });
    expect(problems.map((p) => p.path)).toEqual(["scores.science.score", "scores.feasibility.score", "scores.budget"]);
    expect(problems[0]!.message).toBe('"science": 6 is outside the scale 1..5.');
  });

  it("needs every criterion scored and a comment below the threshold before submitting", () => {
    expect(submitProblems(rubric, { science: { score: 2, comment: " " }, feasibility: { score: 3, comment: "" } }).map((p) => p.path)).toEqual([
      "scores.science.comment",
      "scores.cost.score",
    ]);
    expect(
      submitProblems(rubric, { science: { score: 2, comment: "No link budget." }, feasibility: { score: 3, comment: "" }, cost: { score: 1, comment: "" } }),
    ).toEqual([]);
  });
});
