import { describe, expect, it } from "vitest";
import { aggregateTotals, histogram, mean, sampleStandardDeviation } from "./stats";

describe("aggregates of reviewers' weighted totals", () => {
  it("three reviewers: mean and sample standard deviation worked by hand", () => {
    // Totals 3.9, 3.2, 4.4. Mean = 11.5 / 3 = 3.833333…
    // Deviations +0.066667, −0.633333, +0.566667; squares 0.004444, 0.401111, 0.321111;
    // sum = 0.726667 (exactly 109/150); divided by n − 1 = 2: 0.363333 (109/300);
    // square root: 0.602771.
    const a = aggregateTotals([3.9, 3.2, 4.4]);
    expect(a.weightedMean).toBeCloseTo(3.833333, 6);
    expect(a.spread).toBeCloseTo(Math.sqrt(109 / 300), 12);
    expect(a.spread).toBeCloseTo(0.602771, 6);
    expect(a.count).toBe(3);
    expect(a.totals).toEqual([3.2, 3.9, 4.4]);
  });

  it("divides by n − 1, not n (2, 4, 4, 4, 5, 5, 7, 9: population σ = 2, sample s = √(32/7))", () => {
    // Mean 5; squared deviations 9+1+1+1+0+0+4+16 = 32; 32/8 = 4 → σ = 2; 32/7 = 4.571429 → s = 2.138090.
    const values = [2, 4, 4, 4, 5, 5, 7, 9];
    expect(mean(values)).toBe(5);
    expect(sampleStandardDeviation(values)).toBeCloseTo(2.13809, 5);
  });

  it("has no spread with fewer than two reviews and no mean with none", () => {
    expect(sampleStandardDeviation([4.2])).toBeNull();
    expect(aggregateTotals([])).toEqual({ weightedMean: null, spread: null, count: 0, totals: [] });
  });

  it("bins totals to the nearest whole level for the distribution chart", () => {
    expect(histogram([3.9, 3.2, 4.4, 1.0, 5], 1, 5)).toEqual([
      { level: 1, count: 1 },
      { level: 2, count: 0 },
      { level: 3, count: 1 },
      { level: 4, count: 2 },
      { level: 5, count: 1 },
    ]);
  });
});
