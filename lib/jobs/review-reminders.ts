import "server-only";
import { and, eq, gt, isNull, lte, notInArray, or, ne } from "drizzle-orm";
import { db } from "@/db/client";
import { assignments, boardMembers, boards, decisions, proposals, reviews, users } from "@/db/schema";
import { env } from "@/lib/env";
import { enqueueMail } from "@/lib/mail/outbox";
import { renderReviewReminder } from "@/lib/mail/templates/notices";

/** Reminders go out this many calendar days (UTC) before the due date. */
export const REMINDER_DAYS = [3, 1] as const;

const DAY = 86_400_000;
const utcDay = (d: Date) => Math.floor(d.getTime() / DAY);

/**
 * Enqueues review reminders due today. Safe to run as often as one likes and on several
 * instances: the dedupe key names the assignment and the day, so each reminder is mailed once.
 * Skips submitted reviews, decided or withdrawn proposals, versions already decided, and
 * reviewers no longer active on the board.
 */
export async function enqueueReviewReminders(now: Date = new Date()): Promise<{ enqueued: number }> {
  const horizon = new Date((utcDay(now) + Math.max(...REMINDER_DAYS) + 1) * DAY);
  const rows = await db()
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

  const today = utcDay(now);
  const todayIso = new Date(today * DAY).toISOString().slice(0, 10);
  let enqueued = 0;
  for (const row of rows) {
    const daysLeft = utcDay(row.dueAt) - today;
    if (!(REMINDER_DAYS as readonly number[]).includes(daysLeft)) continue;
    const mail = await renderReviewReminder({
      boardName: row.boardName,
      proposalTitle: row.proposalTitle,
      dueAt: row.dueAt,
      daysLeft,
      url: `${env().APP_URL}/boards/${row.boardId}/proposals/${row.proposalId}/review`,
    });
    const result = await enqueueMail({
      kind: "review-reminder",
      dedupeKey: `review-reminder:${row.assignmentId}:${todayIso}`,
      to: [row.email],
      boardId: row.boardId,
      ...mail,
    });
    if (!result.duplicate) enqueued += 1;
  }
  return { enqueued };
}
