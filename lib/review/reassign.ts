import "server-only";
import { authorize } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { assignReviewers, proposalAccess, type AssignResult } from "@/lib/dal/assignments";
import { reviewersOfVersion, versionIdByNumber } from "@/lib/dal/versions";
import { conflict } from "@/lib/errors";

export const REASSIGN_DAYS = 14;

/**
 * Assigns the reviewers of the previous version to the latest (resubmitted) one, through the
 * review area's assignReviewers: one transaction, one e-mail each via the outbox. Declared
 * conflicts still refuse the whole request; a likely conflict (same e-mail domain as an
 * author) counts as confirmed unless the caller says otherwise, because the chair already
 * accepted these reviewers for the previous version. Reviewers who left the board are
 * skipped and reported.
 */
export async function reassignPreviousReviewers(
  user: SessionUser,
  boardId: string,
  proposalId: string,
  input: { dueAt?: Date; confirmLikelyConflicts?: boolean } = {},
): Promise<AssignResult & { skipped: { id: string; name: string }[] }> {
  const access = await proposalAccess(user, boardId, proposalId);
  authorize(user, "review.assign", { role: access.role }, "That proposal");
  const latest = access.proposal.latestVersion;
  if (latest < 2) throw conflict("There is no resubmitted version yet: the previous reviewers can be asked again once version 2 is submitted.");
  const prev = await versionIdByNumber(boardId, proposalId, latest - 1);
  const rows = await reviewersOfVersion(boardId, prev ?? "00000000-0000-0000-0000-000000000000");
  const active = rows.filter((r) => r.memberStatus === "active" && r.userStatus === "active" && r.role === "reviewer");
  const skipped = rows.filter((r) => !active.includes(r)).map((r) => ({ id: r.id, name: r.name }));
  if (!active.length)
    throw conflict("None of the previous version's reviewers is still an active reviewer on this board; assign reviewers on the call's assignment page.");
  const dueAt = input.dueAt ?? new Date(Date.now() + REASSIGN_DAYS * 86_400_000);
  const result = await assignReviewers(user, boardId, {
    proposalIds: [proposalId],
    reviewerIds: active.map((r) => r.id),
    dueAt,
    confirmLikelyConflicts: input.confirmLikelyConflicts ?? true,
  });
  return { ...result, skipped };
}
