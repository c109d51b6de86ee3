/**
 * Calibrated scores across a call: an additive model with the reviewer effects shrunk
 * toward zero (ridge), solved exactly from its normal equations. Pure: no framework,
 * database or storage imports, so the browser and the server run the same arithmetic.
 *
 * Model (docs/calibration.md): score(p, r) = a_p + b_r + e, where a_p is the proposal's
 * calibrated mean (the overall mean folded in) and b_r the reviewer's leniency. We minimise
 *
 *   Σ (score − a_p − b_r)²  +  λ Σ_r b_r²
 *
 * with the proposal effects unpenalised. At the optimum every a_p is the mean of its scores
 * less its reviewers' effects, so the two usual definitions of the calibrated mean ("raw mean
 * minus the mean of its reviewers' fitted effects" and "overall mean + fitted proposal
 * effect") are the same number here.
 */

/** One reviewer's score of one proposal (a weighted total, or one criterion's score). */
export interface ScoreObservation {
  proposalId: string;
  reviewerId: string;
  score: number;
}

export interface CalibrationOptions {
  /** Ridge parameter λ on the reviewer effects, in units of "scores": see DEFAULT_LAMBDA. */
  lambda?: number;
  /** A score is flagged when it lies more than this many standard deviations from the other reviewers of its proposal. */
  outlierDeviations?: number;
  /** The smallest spread of the other reviewers used for the flag (score units), so that unanimous co-reviewers do not flag a one-step difference. */
  minSpread?: number;
}

/**
 * λ = 2: a reviewer's leniency is believed about half as far as their own scores suggest
 * when they scored two proposals, two thirds at four, five sixths at ten (roughly n / (n + λ)
 * for a reviewer whose proposals are well covered by others). In random-effects terms
 * λ = σ²(noise) / σ²(leniency): we assume a reviewer's leniency varies by about 1/√2 of the
 * scatter of one score. This is a judgement (common practice for small panels), not a fit;
 * docs/calibration.md gives the reasoning.
 */
export const DEFAULT_LAMBDA = 2;
export const DEFAULT_OUTLIER_DEVIATIONS = 2;
/** Half a step of a whole-number scale. */
export const DEFAULT_MIN_SPREAD = 0.5;

export interface ProposalCalibration {
  proposalId: string;
  /** Number of reviewers whose scores count (one per reviewer; repeated scores are averaged). */
  count: number;
  rawMean: number;
  calibratedMean: number;
  /** Sample standard deviation of the raw scores (null with fewer than two). */
  spread: number | null;
  /** Sample standard deviation of the scores less their reviewers' effects. */
  calibratedSpread: number | null;
  /** 1 = best; equal values (within rounding) share a rank ("1, 2, 2, 4"). */
  rawRank: number;
  calibratedRank: number;
  /** rawRank − calibratedRank: positive when calibration moves the proposal up. */
  rankChange: number;
}

export interface ReviewerEffect {
  reviewerId: string;
  /** Fitted leniency in score units: positive scores above the panel, negative below. */
  effect: number;
  count: number;
}

export interface OutlyingScore {
  proposalId: string;
  reviewerId: string;
  score: number;
  othersMean: number;
  /** The other reviewers' sample standard deviation, before the minSpread floor. */
  othersSpread: number;
  /** Signed distance from the others' mean in units of max(othersSpread, minSpread). */
  deviations: number;
}

export interface CalibrationResult {
  lambda: number;
  proposals: ProposalCalibration[];
  reviewers: ReviewerEffect[];
  outliers: OutlyingScore[];
}

export type RankBy = "raw" | "calibrated";
export const RANK_BY = ["raw", "calibrated"] as const satisfies readonly RankBy[];

interface Cell {
  proposal: number;
  reviewer: number;
  score: number;
}

/** Averages repeated scores of the same proposal by the same reviewer, drops non-finite ones. */
function cellsOf(observations: readonly ScoreObservation[]) {
  const proposals: string[] = [];
  const reviewers: string[] = [];
  const pIndex = new Map<string, number>();
  const rIndex = new Map<string, number>();
  const sums = new Map<string, { proposal: number; reviewer: number; sum: number; n: number }>();
  for (const o of observations) {
    if (!Number.isFinite(o.score)) continue;
    let p = pIndex.get(o.proposalId);
    if (p === undefined) {
      p = proposals.length;
      proposals.push(o.proposalId);
      pIndex.set(o.proposalId, p);
    }
    let r = rIndex.get(o.reviewerId);
    if (r === undefined) {
      r = reviewers.length;
      reviewers.push(o.reviewerId);
      rIndex.set(o.reviewerId, r);
    }
    const key = `${p}:${r}`;
    const entry = sums.get(key);
    if (entry) {
      entry.sum += o.score;
      entry.n += 1;
    } else sums.set(key, { proposal: p, reviewer: r, sum: o.score, n: 1 });
  }
  const cells: Cell[] = [...sums.values()].map((e) => ({ proposal: e.proposal, reviewer: e.reviewer, score: e.sum / e.n }));
  return { proposals, reviewers, cells };
}

/** Connected components of the reviewer–proposal graph, as a component number per reviewer. */
function reviewerComponents(reviewerCount: number, proposalCount: number, cells: Cell[]): number[] {
  const parent = Array.from({ length: reviewerCount + proposalCount }, (_, i) => i);
  const find = (x: number): number => {
    while (parent[x] !== x) {
      parent[x] = parent[parent[x]!]!;
      x = parent[x]!;
    }
    return x;
  };
  for (const c of cells) {
    const a = find(c.reviewer);
    const b = find(reviewerCount + c.proposal);
    if (a !== b) parent[a] = b;
  }
  const ids = new Map<number, number>();
  return Array.from({ length: reviewerCount }, (_, r) => {
    const root = find(r);
    if (!ids.has(root)) ids.set(root, ids.size);
    return ids.get(root)!;
  });
}

/** Solves A x = y for a symmetric positive definite A by Gaussian elimination with partial pivoting. */
function solve(a: number[][], y: number[]): number[] {
  const n = y.length;
  const m = a.map((row, i) => [...row, y[i]!]);
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let row = col + 1; row < n; row++) if (Math.abs(m[row]![col]!) > Math.abs(m[pivot]![col]!)) pivot = row;
    [m[col], m[pivot]] = [m[pivot]!, m[col]!];
    const p = m[col]![col]!;
    for (let row = col + 1; row < n; row++) {
      const f = m[row]![col]! / p;
      if (f === 0) continue;
      for (let k = col; k <= n; k++) m[row]![k]! -= f * m[col]![k]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let row = n - 1; row >= 0; row--) {
    let s = m[row]![n]!;
    for (let k = row + 1; k < n; k++) s -= m[row]![k]! * x[k]!;
    x[row] = s / m[row]![row]!;
  }
  return x;
}

function sampleSd(values: number[]): number | null {
  if (values.length < 2) return null;
  const m = values.reduce((s, v) => s + v, 0) / values.length;
  return Math.sqrt(values.reduce((s, v) => s + (v - m) ** 2, 0) / (values.length - 1));
}

/**
 * Competition ranks, best (highest) first; values within `tolerance` of the previous one
 * share its rank, so rounding noise never splits a tie.
 */
export function ranksOf(values: readonly number[], tolerance = 1e-9): number[] {
  const order = values.map((v, i) => ({ v, i })).sort((x, y) => y.v - x.v);
  const ranks = new Array<number>(values.length).fill(0);
  order.forEach((entry, k) => {
    const prev = order[k - 1];
    ranks[entry.i] = prev && Math.abs(prev.v - entry.v) <= tolerance ? ranks[prev.i]! : k + 1;
  });
  return ranks;
}

/**
 * Fits the reviewer effects of a call. Exact: the proposal effects are eliminated and the
 * reviewers' normal equations (M + λI) b = t are solved directly. M is a weighted graph
 * Laplacian whose null space holds one constant vector per connected group of reviewers;
 * every solution has Σ b = 0 over each group (for λ > 0 because 1ᵀ t = 0; for λ = 0 we pick
 * that one, the minimum-norm solution, which is the limit λ → 0⁺), so adding the group's
 * all-ones outer product to the matrix changes no answer and makes it positive definite.
 */
export function calibrateScores(observations: readonly ScoreObservation[], options: CalibrationOptions = {}): CalibrationResult {
  const lambda = options.lambda ?? DEFAULT_LAMBDA;
  if (!Number.isFinite(lambda) || lambda < 0) throw new RangeError("The shrinkage parameter λ must be a finite number of at least 0.");
  const { proposals, reviewers, cells } = cellsOf(observations);
  const P = proposals.length;
  const R = reviewers.length;

  const byProposal: Cell[][] = Array.from({ length: P }, () => []);
  const byReviewer: Cell[][] = Array.from({ length: R }, () => []);
  for (const c of cells) {
    byProposal[c.proposal]!.push(c);
    byReviewer[c.reviewer]!.push(c);
  }
  const rawMean = byProposal.map((list) => list.reduce((s, c) => s + c.score, 0) / list.length);

  // M = D_R − Nᵀ D_P⁻¹ N and t = Σ_p∈r (score − raw mean of p), built proposal by proposal.
  const matrix = Array.from({ length: R }, () => new Array<number>(R).fill(0));
  const rhs = new Array<number>(R).fill(0);
  for (let p = 0; p < P; p++) {
    const list = byProposal[p]!;
    const n = list.length;
    for (const c of list) {
      matrix[c.reviewer]![c.reviewer]! += 1;
      rhs[c.reviewer]! += c.score - rawMean[p]!;
      for (const d of list) matrix[c.reviewer]![d.reviewer]! -= 1 / n;
    }
  }
  const component = reviewerComponents(R, P, cells);
  for (let i = 0; i < R; i++) {
    matrix[i]![i]! += lambda;
    for (let j = 0; j < R; j++) if (component[i] === component[j]) matrix[i]![j]! += 1;
  }
  const effects = R > 0 ? solve(matrix, rhs) : [];

  const calibrated = byProposal.map((list, p) => rawMean[p]! - list.reduce((s, c) => s + effects[c.reviewer]!, 0) / list.length);
  const scale = Math.max(1, ...cells.map((c) => Math.abs(c.score)));
  const rawRanks = ranksOf(rawMean, 1e-9 * scale);
  const calibratedRanks = ranksOf(calibrated, 1e-9 * scale);

  const result: CalibrationResult = {
    lambda,
    proposals: proposals.map((proposalId, p) => {
      const list = byProposal[p]!;
      return {
        proposalId,
        count: list.length,
        rawMean: rawMean[p]!,
        calibratedMean: calibrated[p]!,
        spread: sampleSd(list.map((c) => c.score)),
        calibratedSpread: sampleSd(list.map((c) => c.score - effects[c.reviewer]!)),
        rawRank: rawRanks[p]!,
        calibratedRank: calibratedRanks[p]!,
        rankChange: rawRanks[p]! - calibratedRanks[p]!,
      };
    }),
    reviewers: reviewers.map((reviewerId, r) => ({ reviewerId, effect: effects[r]!, count: byReviewer[r]!.length })),
    outliers: outlyingScores(observations, options),
  };
  return result;
}

/**
 * Scores more than `outlierDeviations` standard deviations from the other reviewers of the
 * same proposal. Needs at least two other reviewers (one has no spread); their sample
 * standard deviation is floored at `minSpread` so unanimous co-reviewers do not flag a
 * one-step difference. Raw scores: the flag is about what was written, for discussion.
 */
export function outlyingScores(observations: readonly ScoreObservation[], options: CalibrationOptions = {}): OutlyingScore[] {
  const limit = options.outlierDeviations ?? DEFAULT_OUTLIER_DEVIATIONS;
  const floor = options.minSpread ?? DEFAULT_MIN_SPREAD;
  const { proposals, reviewers, cells } = cellsOf(observations);
  const byProposal = new Map<number, Cell[]>();
  for (const c of cells) byProposal.set(c.proposal, [...(byProposal.get(c.proposal) ?? []), c]);
  const out: OutlyingScore[] = [];
  for (const list of byProposal.values()) {
    if (list.length < 3) continue;
    for (const c of list) {
      const others = list.filter((d) => d !== c).map((d) => d.score);
      const othersMean = others.reduce((s, v) => s + v, 0) / others.length;
      const othersSpread = sampleSd(others)!;
      const deviations = (c.score - othersMean) / Math.max(othersSpread, floor);
      if (Math.abs(deviations) > limit)
        out.push({ proposalId: proposals[c.proposal]!, reviewerId: reviewers[c.reviewer]!, score: c.score, othersMean, othersSpread, deviations });
    }
  }
  return out;
}

function ordinal(n: number): string {
  const tens = n % 100;
  const suffix = tens >= 11 && tens <= 13 ? "th" : (["th", "st", "nd", "rd"][n % 10] ?? "th");
  return `${n}${suffix}`;
}

/** "Ranks 2nd calibrated, 4th raw" when calibration moves a proposal; null when it does not. */
export function rankChangeNote(p: Pick<ProposalCalibration, "rawRank" | "calibratedRank">): string | null {
  if (p.rawRank === p.calibratedRank) return null;
  return `Ranks ${ordinal(p.calibratedRank)} calibrated, ${ordinal(p.rawRank)} raw`;
}
