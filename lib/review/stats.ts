/** Aggregates of submitted reviews for the chair. Pure. */

export function mean(values: number[]): number | null {
  if (values.length === 0) return null;
  return values.reduce((a, b) => a + b, 0) / values.length;
}

/**
 * Sample standard deviation (divides by n − 1): the reviewers are a sample of the opinions
 * the proposal could have drawn. Null with fewer than two values, where it is undefined.
 */
export function sampleStandardDeviation(values: number[]): number | null {
  if (values.length < 2) return null;
  const m = mean(values)!;
  const squares = values.reduce((sum, v) => sum + (v - m) ** 2, 0);
  return Math.sqrt(squares / (values.length - 1));
}

export interface ScoreAggregate {
  /** Mean of the reviewers' weighted totals (each already weighted by the rubric). */
  weightedMean: number | null;
  /** Sample standard deviation of the reviewers' weighted totals. */
  spread: number | null;
  count: number;
  totals: number[];
}

export function aggregateTotals(totals: number[]): ScoreAggregate {
  return { weightedMean: mean(totals), spread: sampleStandardDeviation(totals), count: totals.length, totals: [...totals].sort((a, b) => a - b) };
}

/** Counts per whole level of the scale, for the small distribution chart. */
export function histogram(totals: number[], scaleMin: number, scaleMax: number): { level: number; count: number }[] {
  const bins: { level: number; count: number }[] = [];
  for (let level = scaleMin; level <= scaleMax; level++) bins.push({ level, count: 0 });
  for (const t of totals) {
    const level = Math.min(scaleMax, Math.max(scaleMin, Math.round(t)));
    bins[level - scaleMin]!.count += 1;
  }
  return bins;
}
