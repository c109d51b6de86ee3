// Review reminders three days and one day before the due date, once per assignment and day,
// through the outbox. The clock is set far in the future so other tests' assignments never
// fall in the window.
import { and, eq, like } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { assignments, boardMembers, outboxMessages, reviews } from "@/db/schema";
import { enqueueReviewReminders } from "@/lib/jobs/review-reminders";
import { decisionScenario } from "./decision-fixtures";

const DAY = 86_400_000;

async function remindersFor(assignmentId: string) {
  return db()
    .select({ dedupeKey: outboxMessages.dedupeKey, to: outboxMessages.toAddresses, subject: outboxMessages.subject, text: outboxMessages.text })
    .from(outboxMessages)
    .where(like(outboxMessages.dedupeKey, `review-reminder:${assignmentId}:%`))
    .orderBy(outboxMessages.dedupeKey);
}

describe("review reminders", () => {
  it("mails an unfinished review three days and one day before it is due, once each day", async () => {
    const s = await decisionScenario({ submitted: 0 });
    const [first, second] = s.assignments;
    // Far in the future, at 10:00 UTC.
    const now = new Date(Date.UTC(2091, 2, 10, 10, 0, 0) + Math.floor(Math.random() * 1000) * 7 * DAY);
    await db()
      .update(assignments)
      .set({ dueAt: new Date(now.getTime() + 3 * DAY + 2 * 3_600_000) })
      .where(eq(assignments.id, first!.id));
    await db()
      .update(assignments)
      .set({ dueAt: new Date(now.getTime() + 2 * DAY) })
      .where(eq(assignments.id, second!.id));

    await enqueueReviewReminders(now);
    await enqueueReviewReminders(new Date(now.getTime() + 3_600_000)); // later the same day: nothing new
    let mine = await remindersFor(first!.id);
    expect(mine).toHaveLength(1);
    expect(mine[0]!.to).toEqual([s.reviewer.email]);
    expect(mine[0]!.subject).toBe(`Review due in 3 days: “${s.proposal.title}”`);
    expect(mine[0]!.text).toContain("It has not been submitted yet.");
    expect(await remindersFor(second!.id)).toEqual([]); // two days out: not a reminder day

    // The next day the second is one day out; two days later the first is.
    await enqueueReviewReminders(new Date(now.getTime() + DAY));
    expect((await remindersFor(second!.id)).map((r) => r.subject)).toEqual([`Review due tomorrow: “${s.proposal.title}”`]);
    await enqueueReviewReminders(new Date(now.getTime() + 2 * DAY));
    mine = await remindersFor(first!.id);
    expect(mine.map((r) => r.subject)).toEqual([`Review due in 3 days: “${s.proposal.title}”`, `Review due tomorrow: “${s.proposal.title}”`]);
  });

  it("does not remind reviewers who submitted or who left the board", async () => {
    const s = await decisionScenario({ submitted: 0 });
    const [first, second] = s.assignments;
    const now = new Date(Date.UTC(2093, 6, 1, 8, 0, 0) + Math.floor(Math.random() * 1000) * 7 * DAY);
    for (const a of s.assignments)
      await db()
        .update(assignments)
        .set({ dueAt: new Date(now.getTime() + DAY + 3_600_000) })
        .where(eq(assignments.id, a.id));
    await db().update(reviews).set({ status: "submitted", submittedAt: new Date() }).where(eq(reviews.assignmentId, first!.id));
    await db()
      .update(boardMembers)
      .set({ status: "deactivated" })
      .where(and(eq(boardMembers.boardId, s.board.id), eq(boardMembers.userId, s.reviewer2.id)));
    await enqueueReviewReminders(now);
    expect(await remindersFor(first!.id)).toEqual([]);
    expect(await remindersFor(second!.id)).toEqual([]);
  });
});
