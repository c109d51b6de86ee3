import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { calibrateScores, outlyingScores, rankChangeNote, ranksOf, type ScoreObservation } from "./calibration";

const obs = (proposalId: string, reviewerId: string, score: number): ScoreObservation => ({ proposalId, reviewerId, score });

/*
 * Hand-worked example (worked out by hand for this test; no outside source).
 * Reviewer R1 scores P1 = 9 and P2 = 8; reviewer R2 scores P2 = 6 and P3 = 7.
 * Raw means: P1 = 9, P2 = 7, P3 = 7.
 *
 * Eliminating the proposal effects (a_p = mean of p's scores less its reviewers' effects):
 *   M = D_R − Nᵀ D_P⁻¹ N: R1 has 2 scores, minus 1/1 (P1) and 1/2 (P2) → 0.5; R2 likewise 0.5;
 *   off-diagonal −1/2 (they share P2).  M = [[0.5, −0.5], [−0.5, 0.5]].
 *   t_r = Σ (score − raw mean): R1 (9 − 9) + (8 − 7) = 1; R2 (6 − 7) + (7 − 7) = −1.
 *
 * λ = 2: [[2.5, −0.5], [−0.5, 2.5]] b = (1, −1) → b = (t, −t), 3t = 1 → b = (1/3, −1/3).
 *   a_P1 = 9 − 1/3 = 8.6667; a_P2 = 7 − (1/3 − 1/3)/2 = 7; a_P3 = 7 + 1/3 = 7.3333.
 *   Objective check: residuals on P2: 8 − 7 − 1/3 = 2/3 and 6 − 7 + 1/3 = −2/3, others 0.
 * λ = 1: [[1.5, −0.5], [−0.5, 1.5]] b = (1, −1) → 2t = 1 → b = (0.5, −0.5);
 *   a = (8.5, 7, 7.5).
 * λ = 0: 0.5 (b1 − b2) = 1 with b1 + b2 = 0 (minimum norm) → b = (1, −1); a = (8, 7, 8):
 *   every score is then fitted exactly (8 = 7 + 1, 6 = 7 − 1, 9 = 8 + 1, 7 = 8 − 1).
 * Raw ranks: P1 1st, P2 and P3 share 2nd. Calibrated (λ = 2): P1, P3, P2 → P2 drops to 3rd.
 */
const handWorked = [obs("P1", "R1", 9), obs("P2", "R1", 8), obs("P2", "R2", 6), obs("P3", "R2", 7)];

describe("calibrated scores: the hand-worked example", () => {
  const byId = (lambda: number) => {
    const r = calibrateScores(handWorked, { lambda });
    return {
      p: Object.fromEntries(r.proposals.map((x) => [x.proposalId, x])),
      b: Object.fromEntries(r.reviewers.map((x) => [x.reviewerId, x.effect])),
    };
  };

  it("λ = 2 (the default): effects ±1/3, calibrated means 8.667, 7, 7.333", () => {
    const { p, b } = byId(2);
    expect(b.R1).toBeCloseTo(1 / 3, 12);
    expect(b.R2).toBeCloseTo(-1 / 3, 12);
    expect(p.P1!.calibratedMean).toBeCloseTo(26 / 3, 12);
    expect(p.P2!.calibratedMean).toBeCloseTo(7, 12);
    expect(p.P3!.calibratedMean).toBeCloseTo(22 / 3, 12);
    expect([p.P1!.rawMean, p.P2!.rawMean, p.P3!.rawMean]).toEqual([9, 7, 7]);
    expect([p.P1!.rawRank, p.P2!.rawRank, p.P3!.rawRank]).toEqual([1, 2, 2]);
    expect([p.P1!.calibratedRank, p.P2!.calibratedRank, p.P3!.calibratedRank]).toEqual([1, 3, 2]);
    expect(p.P2!.rankChange).toBe(-1);
    expect(rankChangeNote(p.P2!)).toBe("Ranks 3rd calibrated, 2nd raw");
    expect(rankChangeNote(p.P1!)).toBeNull();
    // Spread of P2's raw scores 8 and 6: sample sd √2; less the effects 7.667 and 6.333: (4/3)/√2.
    expect(p.P2!.spread).toBeCloseTo(Math.SQRT2, 12);
    expect(p.P2!.calibratedSpread).toBeCloseTo(4 / 3 / Math.SQRT2, 12);
    expect(p.P1!.spread).toBeNull();
  });

  it("λ = 1: effects ±0.5, calibrated means 8.5, 7, 7.5", () => {
    const { p, b } = byId(1);
    expect(b.R1).toBeCloseTo(0.5, 12);
    expect(b.R2).toBeCloseTo(-0.5, 12);
    expect([p.P1!.calibratedMean, p.P2!.calibratedMean, p.P3!.calibratedMean].map((v) => Number(v.toFixed(10)))).toEqual([8.5, 7, 7.5]);
  });

  it("λ = 0: effects ±1 and every score fitted exactly", () => {
    const { p, b } = byId(0);
    expect(b.R1).toBeCloseTo(1, 12);
    expect(b.R2).toBeCloseTo(-1, 12);
    expect([p.P1!.calibratedMean, p.P2!.calibratedMean, p.P3!.calibratedMean].map((v) => Number(v.toFixed(10)))).toEqual([8, 7, 8]);
  });

  it("refuses a negative or non-finite λ and takes an empty call", () => {
    expect(() => calibrateScores(handWorked, { lambda: -1 })).toThrow(/λ/);
    expect(() => calibrateScores(handWorked, { lambda: Number.NaN })).toThrow(/λ/);
    expect(calibrateScores([])).toEqual({ lambda: 2, proposals: [], reviewers: [], outliers: [] });
  });

  it("averages a reviewer's repeated scores of one proposal and ignores non-finite ones", () => {
    const r = calibrateScores([obs("P", "R", 4), obs("P", "R", 6), obs("P", "S", Number.NaN)]);
    expect(r.proposals).toHaveLength(1);
    expect(r.proposals[0]!.rawMean).toBe(5);
    expect(r.proposals[0]!.count).toBe(1);
  });
});

describe("outlying scores", () => {
  it("flags a score more than 2 standard deviations from the other reviewers of the proposal", () => {
    // Others 7, 8, 9: mean 8, sample sd 1. A 2 is 6 sd below; a 10 is exactly 2 sd above (not more).
    const flagged = outlyingScores([obs("P", "A", 7), obs("P", "B", 8), obs("P", "C", 9), obs("P", "D", 2)]);
    expect(flagged.map((f) => f.reviewerId)).toEqual(["D"]);
    expect(flagged[0]!.othersMean).toBe(8);
    expect(flagged[0]!.othersSpread).toBe(1);
    expect(flagged[0]!.deviations).toBe(-6);
    expect(outlyingScores([obs("Q", "A", 7), obs("Q", "B", 8), obs("Q", "C", 9), obs("Q", "D", 10)])).toEqual([]);
  });

  it("needs two other reviewers, and floors their spread at half a step", () => {
    expect(outlyingScores([obs("P", "A", 1), obs("P", "B", 9)])).toEqual([]);
    // Others unanimous at 7: sd 0, floored to 0.5. 8 is 2 "sd" away (not flagged); 6 is 2 (not); 5 is 4 (flagged).
    expect(outlyingScores([obs("P", "A", 7), obs("P", "B", 7), obs("P", "C", 8)])).toEqual([]);
    expect(outlyingScores([obs("P", "A", 7), obs("P", "B", 7), obs("P", "C", 5)]).map((f) => f.deviations)).toEqual([-4]);
  });
});

describe("ranks", () => {
  it("share a rank within the tolerance and skip the next", () => {
    expect(ranksOf([5, 7, 7 + 1e-12, 1])).toEqual([3, 1, 1, 4]);
  });
});

/** A design where every proposal has exactly one reviewer (reviewers may have several proposals). */
const onePerProposal = fc
  .array(fc.record({ reviewer: fc.integer({ min: 0, max: 4 }), score: fc.integer({ min: 1, max: 10 }) }), { minLength: 1, maxLength: 12 })
  .map((rows) => rows.map((r, i) => obs(`P${i}`, `R${r.reviewer}`, r.score)));

/**
 * A connected design: proposal i is scored by reviewers i mod R and (i + 1) mod R (for i < R
 * that chain links every reviewer), plus any others the generator adds.
 */
const connectedDesign = fc
  .integer({ min: 2, max: 5 })
  .chain((R) =>
    fc.integer({ min: R, max: 8 }).chain((P) =>
      fc.record({
        R: fc.constant(R),
        extra: fc.array(fc.array(fc.boolean(), { minLength: R, maxLength: R }), { minLength: P, maxLength: P }),
        scores: fc.array(fc.array(fc.integer({ min: 1, max: 10 }), { minLength: R, maxLength: R }), { minLength: P, maxLength: P }),
        shifted: fc.integer({ min: 0, max: R - 1 }),
        constant: fc.oneof(fc.integer({ min: -9, max: 9 }), fc.double({ min: -9, max: 9, noNaN: true })),
      }),
    ),
  )
  .map(({ R, extra, scores, shifted, constant }) => {
    const rows: ScoreObservation[] = [];
    scores.forEach((row, p) =>
      row.forEach((score, r) => {
        if (r === p % R || r === (p + 1) % R || extra[p]![r]) rows.push(obs(`P${p}`, `R${r}`, score));
      }),
    );
    return { rows, shifted: `R${shifted}`, constant };
  });

describe("calibration properties (fast-check)", () => {
  it("with one reviewer per proposal, calibration changes nothing (any λ)", () => {
    fc.assert(
      fc.property(onePerProposal, fc.constantFrom(0, 0.5, 2, 10), (rows, lambda) => {
        const r = calibrateScores(rows, { lambda });
        for (const p of r.proposals) {
          expect(p.calibratedMean).toBe(p.rawMean);
          expect(p.calibratedRank).toBe(p.rawRank);
        }
        for (const b of r.reviewers) expect(b.effect).toBe(0);
      }),
      { numRuns: 300 },
    );
  });

  it("λ = 0, connected design: adding a constant to one reviewer's scores leaves the calibrated ranking unchanged", () => {
    fc.assert(
      fc.property(connectedDesign, ({ rows, shifted, constant }) => {
        const before = calibrateScores(rows, { lambda: 0 });
        const after = calibrateScores(
          rows.map((o) => (o.reviewerId === shifted ? { ...o, score: o.score + constant } : o)),
          { lambda: 0 },
        );
        expect(after.proposals.map((p) => p.calibratedRank)).toEqual(before.proposals.map((p) => p.calibratedRank));
        // The whole constant lands in the reviewer effects: every calibrated mean moves by the same amount.
        const moves = after.proposals.map((p, i) => p.calibratedMean - before.proposals[i]!.calibratedMean);
        for (const m of moves) expect(m).toBeCloseTo(moves[0]!, 9);
      }),
      { numRuns: 300 },
    );
  });

  it("λ > 0: the shifted reviewer's effect absorbs a share of the constant between 0 and 1, and no other reviewer's effect moves more", () => {
    fc.assert(
      fc.property(connectedDesign, fc.constantFrom(0.5, 2, 10), ({ rows, shifted, constant }, lambda) => {
        fc.pre(Math.abs(constant) > 1e-6);
        const before = calibrateScores(rows, { lambda });
        const after = calibrateScores(
          rows.map((o) => (o.reviewerId === shifted ? { ...o, score: o.score + constant } : o)),
          { lambda },
        );
        const share = (id: string) =>
          (after.reviewers.find((b) => b.reviewerId === id)!.effect - before.reviewers.find((b) => b.reviewerId === id)!.effect) / constant;
        const own = share(shifted);
        expect(own).toBeGreaterThan(0);
        expect(own).toBeLessThanOrEqual(1 + 1e-9);
        for (const b of before.reviewers) if (b.reviewerId !== shifted) expect(Math.abs(share(b.reviewerId))).toBeLessThanOrEqual(own + 1e-9);
      }),
      { numRuns: 300 },
    );
  });

  it("λ > 0 does not keep the ranking in general: a counterexample written out", () => {
    // The hand-worked design with R2's scores lowered by 6 (P2 = 0, P3 = 1). Raw means 9, 4, 1;
    // t = (0 + 4, −4 + 0) = (4, −4). λ = 0: b = (4, −4), a = (5, 4, 5): P1 and P3 share 1st,
    // P2 3rd, as before the shift (a = (8, 7, 8)). λ = 2: 3t = 4 → b = ±4/3, a = (7.667, 4,
    // 2.333): P1, P2, P3, where before the shift P3 was above P2. The penalty kept R2's
    // effect from taking the whole shift, and the rest leaked into P3 (docs/calibration.md).
    const lowered = handWorked.map((o) => (o.reviewerId === "R2" ? { ...o, score: o.score - 6 } : o));
    const ranks = (rows: ScoreObservation[], lambda: number) => calibrateScores(rows, { lambda }).proposals.map((p) => p.calibratedRank);
    expect(ranks(lowered, 0)).toEqual(ranks(handWorked, 0));
    expect(ranks(lowered, 2)).not.toEqual(ranks(handWorked, 2));
  });
});
