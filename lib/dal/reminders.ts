import "server-only";
import { and, eq, gt, isNull, lte, notInArray, or, ne } from "drizzle-orm";
import { db } from "@/db/client";
import { assignments, boardMembers, boards, decisions, proposals, reviews, users } from "@/db/schema";

/**
 * Assignments due after `now` and by `horizon` whose review is not submitted, on proposals
 * still under review and versions not decided, for reviewers still active on the board.
 */
export async function assignmentsDueForReminder(now: Date, horizon: Date) {
  return db()
    .select({
      assignmentId: assignments.id,
      boardId: assignments.boardId,
      proposalId: assignments.proposalId,
      dueAt: assignments.dueAt,
      email: users.email,
      proposalTitle: proposals.title,
      boardName: boards.name,
    })
    .from(assignments)
    .innerJoin(proposals, and(eq(proposals.id, assignments.proposalId), eq(proposals.boardId, assignments.boardId)))
    .innerJoin(boards, eq(boards.id, assignments.boardId))
    .innerJoin(users, and(eq(users.id, assignments.reviewerId), eq(users.status, "active")))
    .innerJoin(
      boardMembers,
      and(
        eq(boardMembers.boardId, assignments.boardId),
        eq(boardMembers.userId, assignments.reviewerId),
        eq(boardMembers.status, "active"),
        eq(boardMembers.role, "reviewer"),
      ),
    )
    .leftJoin(reviews, eq(reviews.assignmentId, assignments.id))
    .leftJoin(decisions, eq(decisions.versionId, assignments.versionId))
    .where(
      and(
        gt(assignments.dueAt, now),
        lte(assignments.dueAt, horizon),
        notInArray(proposals.status, ["decided", "withdrawn", "draft"]),
        or(isNull(reviews.id), ne(reviews.status, "submitted")),
        isNull(decisions.id),
      ),
    );
}
