import "server-only";
import { assignmentsDueForReminder } from "@/lib/dal/reminders";
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
  const rows = await assignmentsDueForReminder(now, horizon);

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
