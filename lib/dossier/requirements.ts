/**
 * The call's requirements judged on a dossier's orbit-check blocks (the second verdict
 * axis). Pure: the editor rail and the server at submission run the same code.
 */
import { evaluateRequirements, unaddressedRequirements, type CallRequirement, type RequirementOutcome } from "@/lib/requirements";
import type { BlockEvaluation } from "./claims";

/** Outcomes per blockId, for every block a requirement concerns (others get an empty list). */
export function judgeBlocks(evaluations: readonly BlockEvaluation[], requirements: readonly CallRequirement[]): Record<string, RequirementOutcome[]> {
  const out: Record<string, RequirementOutcome[]> = {};
  for (const ev of evaluations) {
    out[ev.block.blockId] = evaluateRequirements(requirements, {
      kind: ev.block.claim.kind,
      status: ev.result.status,
      given: ev.claim.given,
      computed: ev.result.computed as Record<string, unknown>,
    });
  }
  return out;
}

export interface RequirementCounts {
  met: number;
  notMet: number;
  notEvaluated: number;
}

export function countOutcomes(outcomes: Iterable<readonly RequirementOutcome[]>): RequirementCounts {
  const counts: RequirementCounts = { met: 0, notMet: 0, notEvaluated: 0 };
  for (const list of outcomes) for (const o of list) counts[o.status] += 1;
  return counts;
}

/** Requirements of the call no block addresses: "not evaluated: no claim in the dossier addresses it". */
export function missingClaims(evaluations: readonly BlockEvaluation[], requirements: readonly CallRequirement[]): CallRequirement[] {
  return unaddressedRequirements(
    requirements,
    evaluations.map((e) => e.block.claim.kind),
  );
}
