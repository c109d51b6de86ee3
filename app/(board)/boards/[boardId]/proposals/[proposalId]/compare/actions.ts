"use server";
import { action } from "@/lib/actions/action";
import { reassignPreviousReviewers } from "@/lib/review/reassign";
import { reassignInput } from "@/lib/validation/decisions";

/** Asks the previous version's reviewers to review the resubmitted one. */
export const reassignReviewersAction = action(reassignInput, async ({ boardId, proposalId, dueAt }, user) => {
  const result = await reassignPreviousReviewers(user, boardId, proposalId, { dueAt });
  return { created: result.created.length, existing: result.existing.length, skipped: result.skipped.map((s) => s.name) };
});
