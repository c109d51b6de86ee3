/**
 * Rubric arithmetic and checks, shared by the scoring table in the browser and the server.
 * Pure: no framework, database or storage imports.
 */
import type { CriterionScore, RubricCriterion } from "@/db/schema/reviews";

export type { CriterionScore, RubricCriterion };

/** Weights are percentages; a template is valid when they add up to 100 within this margin. */
export const WEIGHT_TOLERANCE = 1e-6;

export function weightSum(criteria: Pick<RubricCriterion, "weight">[]): number {
  return criteria.reduce((sum, c) => sum + c.weight, 0);
}

export function weightsSumTo100(criteria: Pick<RubricCriterion, "weight">[]): boolean {
  return Math.abs(weightSum(criteria) - 100) <= WEIGHT_TOLERANCE;
}

export interface RubricProblem {
  path: string;
  message: string;
}

/**
 * Structural problems of a template a chair wants to save: weights off 100 %, a scale
 * whose descriptors do not match its levels, criteria on different scales (the weighted
 * total is expressed on the rubric's one scale, so mixing scales would make it meaningless).
 */
export function rubricProblems(criteria: RubricCriterion[]): RubricProblem[] {
  const problems: RubricProblem[] = [];
  if (criteria.length === 0) problems.push({ path: "criteria", message: "A rubric needs at least one criterion." });
  const ids = new Set<string>();
  criteria.forEach((c, i) => {
    if (ids.has(c.id)) problems.push({ path: `criteria.${i}.id`, message: `Criterion id "${c.id}" is used twice.` });
    ids.add(c.id);
    if (!(c.scaleMax > c.scaleMin)) problems.push({ path: `criteria.${i}.scaleMax`, message: `"${c.title}": the top of the scale must be above the bottom.` });
    const levels = c.scaleMax - c.scaleMin + 1;
    if (c.scaleMax > c.scaleMin && c.levels.length !== levels)
      problems.push({
        path: `criteria.${i}.levels`,
        message: `"${c.title}": a ${c.scaleMin}..${c.scaleMax} scale has ${levels} levels, so it needs ${levels} descriptors (got ${c.levels.length}).`,
      });
    if (c.commentRequiredBelow !== null && (c.commentRequiredBelow < c.scaleMin || c.commentRequiredBelow > c.scaleMax + 1))
      problems.push({ path: `criteria.${i}.commentRequiredBelow`, message: `"${c.title}": the comment threshold must lie within the scale.` });
    const first = criteria[0]!;
    if (i > 0 && (c.scaleMin !== first.scaleMin || c.scaleMax !== first.scaleMax))
      problems.push({
        path: `criteria.${i}.scaleMin`,
        message: `"${c.title}": every criterion of a rubric uses the same scale (${first.scaleMin}..${first.scaleMax}).`,
      });
  });
  if (criteria.length > 0 && !weightsSumTo100(criteria))
    problems.push({ path: "criteria", message: `The weights add up to ${round(weightSum(criteria), 4)} %; they must add up to 100 %.` });
  return problems;
}

/** Problems with scores being saved: unknown criteria, and scores that are not whole levels of the scale. */
export function scoreProblems(criteria: RubricCriterion[], scores: Record<string, CriterionScore>): RubricProblem[] {
  const byId = new Map(criteria.map((c) => [c.id, c]));
  const problems: RubricProblem[] = [];
  for (const [id, entry] of Object.entries(scores)) {
    const criterion = byId.get(id);
    if (!criterion) {
      problems.push({ path: `scores.${id}`, message: `There is no criterion "${id}" in this rubric.` });
      continue;
    }
    const s = entry.score;
    if (s !== null && (!Number.isInteger(s) || s < criterion.scaleMin || s > criterion.scaleMax))
      problems.push({ path: `scores.${id}.score`, message: `"${criterion.title}": ${s} is outside the scale ${criterion.scaleMin}..${criterion.scaleMax}.` });
  }
  return problems;
}

/** What still stops a review from being submitted: unscored criteria, missing required comments. */
export function submitProblems(criteria: RubricCriterion[], scores: Record<string, CriterionScore>): RubricProblem[] {
  const problems = scoreProblems(criteria, scores);
  for (const c of criteria) {
    const entry = scores[c.id];
    if (!entry || entry.score === null) {
      problems.push({ path: `scores.${c.id}.score`, message: `"${c.title}" is not scored yet.` });
      continue;
    }
    if (c.commentRequiredBelow !== null && entry.score < c.commentRequiredBelow && entry.comment.trim() === "")
      problems.push({ path: `scores.${c.id}.comment`, message: `"${c.title}": a score below ${c.commentRequiredBelow} needs a comment.` });
  }
  return problems;
}

export interface WeightedTotal {
  /** Σ wᵢ·sᵢ / Σ wᵢ over the scored criteria, on the rubric's scale; null when nothing is scored. */
  value: number | null;
  scored: number;
  total: number;
  complete: boolean;
}

/**
 * The weighted total of one review. With every criterion scored it is Σ wᵢ·sᵢ / 100; while
 * scoring is under way it is the weighted mean of what is scored so far (the running total).
 */
export function weightedTotal(criteria: RubricCriterion[], scores: Record<string, CriterionScore>): WeightedTotal {
  let weighted = 0;
  let weights = 0;
  let scored = 0;
  for (const c of criteria) {
    const s = scores[c.id]?.score;
    if (s === null || s === undefined) continue;
    weighted += c.weight * s;
    weights += c.weight;
    scored += 1;
  }
  return { value: scored === 0 || weights === 0 ? null : weighted / weights, scored, total: criteria.length, complete: scored === criteria.length };
}

export function round(value: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(value * f) / f;
}
