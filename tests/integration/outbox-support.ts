// Helpers the outbox and decision tests share: reading the mail catcher, and driving the
// outbox for a test's own messages while other workers (other test apps) share the database.
import { inArray, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { outboxMessages } from "@/db/schema";
import { processOutbox, type ProcessOptions } from "@/lib/mail/outbox";
import { caughtMessages, type CatcherMessage } from "../support/mail";

export { caughtMessages, type CatcherMessage };

/** Messages the catcher holds for one outbox row (by the X-VisViva-Outbox-Id header). */
export async function caughtFor(outboxId: string): Promise<CatcherMessage[]> {
  return (await caughtMessages()).filter((m) => m.headers["x-visviva-outbox-id"] === outboxId);
}

export async function rowsOf(ids: string[]) {
  return db()
    .select({
      id: outboxMessages.id,
      status: outboxMessages.status,
      attempts: outboxMessages.attempts,
      lastError: outboxMessages.lastError,
      nextAttemptAt: outboxMessages.nextAttemptAt,
    })
    .from(outboxMessages)
    .where(inArray(outboxMessages.id, ids));
}

/** Lets time pass for these rows: whatever backoff they wait for is over now. */
export async function makeDue(ids: string[]) {
  await db()
    .update(outboxMessages)
    .set({ nextAttemptAt: sql`now()` })
    .where(inArray(outboxMessages.id, ids));
}

/** Runs the outbox for these rows until every one is sent (or the deadline passes). */
export async function deliver(ids: string[], options: Omit<ProcessOptions, "ids"> = {}, timeoutMs = 40_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    await processOutbox({ ...options, ids });
    const rows = await rowsOf(ids);
    if (rows.every((r) => r.status === "sent")) return rows;
    if (Date.now() > deadline) throw new Error(`not delivered in time: ${JSON.stringify(rows)}`);
    await makeDue(rows.filter((r) => r.status === "queued").map((r) => r.id));
    await new Promise((r) => setTimeout(r, 300));
  }
}

export async function waitFor<T>(probe: () => Promise<T | null | undefined | false>, timeoutMs = 30_000, what = "condition"): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}
