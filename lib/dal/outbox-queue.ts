import "server-only";
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { outboxMessages } from "@/db/schema";
import type { Tx } from "./transaction";

/**
 * The outbox rows as a queue: enqueue in the caller's transaction, claim what is due, write
 * a send's outcome, requeue a failed message. The sending itself (and the guarantees it
 * keeps) is lib/mail/outbox.ts; this file is only its SQL.
 */

export interface OutgoingMail {
  kind: string;
  /** Same key, same message: a second enqueue with this key is ignored (never sent twice). */
  dedupeKey: string;
  to: string[];
  subject: string;
  html: string;
  text: string;
  boardId?: string | null;
  attachments?: { filename: string; objectKey: string; contentType: string }[];
}

export type ClaimedMessage = typeof outboxMessages.$inferSelect;

/** Inserts the message unless its dedupe key is taken; answers the row's id either way. */
export async function insertOutboxMessage(mail: OutgoingMail, tx: Tx = db()): Promise<{ id: string; duplicate: boolean }> {
  const inserted = await tx
    .insert(outboxMessages)
    .values({
      kind: mail.kind,
      dedupeKey: mail.dedupeKey,
      toAddresses: mail.to,
      subject: mail.subject,
      html: mail.html,
      text: mail.text,
      boardId: mail.boardId ?? null,
      attachments: mail.attachments ?? [],
    })
    .onConflictDoNothing({ target: outboxMessages.dedupeKey })
    .returning({ id: outboxMessages.id });
  if (inserted[0]) return { id: inserted[0].id, duplicate: false };
  const [existing] = await tx.select({ id: outboxMessages.id }).from(outboxMessages).where(eq(outboxMessages.dedupeKey, mail.dedupeKey));
  return { id: existing!.id, duplicate: true };
}

/** Claims due messages: queued ones whose time came, and claimed ones whose lease ran out. */
export async function claimDueMessages(limit: number, leaseSeconds: number, ids?: string[], now?: Date): Promise<ClaimedMessage[]> {
  const clock = now ? sql`${now.toISOString()}::timestamptz` : sql`now()`;
  return db().transaction(async (tx) => {
    const due = await tx
      .select({ id: outboxMessages.id, status: outboxMessages.status })
      .from(outboxMessages)
      .where(
        and(
          sql`((${outboxMessages.status} = 'queued' and ${outboxMessages.nextAttemptAt} <= ${clock})
            or (${outboxMessages.status} = 'sending' and ${outboxMessages.nextAttemptAt} <= now() - make_interval(secs => ${leaseSeconds})))`,
          ids ? inArray(outboxMessages.id, ids.length > 0 ? ids : ["00000000-0000-0000-0000-000000000000"]) : undefined,
        ),
      )
      .orderBy(asc(outboxMessages.nextAttemptAt))
      .limit(limit)
      .for("update", { skipLocked: true });
    if (due.length === 0) return [];
    const interrupted = due.filter((d) => d.status === "sending").map((d) => d.id);
    if (interrupted.length > 0) {
      // Say so on the row: an admin reading it knows why attempts went up without an error.
      await tx
        .update(outboxMessages)
        .set({ lastError: "The previous attempt was interrupted (its worker stopped while sending); sent again with the same Message-ID." })
        .where(inArray(outboxMessages.id, interrupted));
    }
    return tx
      .update(outboxMessages)
      .set({ status: "sending", attempts: sql`${outboxMessages.attempts} + 1`, nextAttemptAt: sql`now()` })
      .where(
        inArray(
          outboxMessages.id,
          due.map((d) => d.id),
        ),
      )
      .returning();
  });
}

/** Only while the row is still this claim (same attempt number, still sending). */
function stillClaimed(message: { id: string; attempts: number }) {
  return and(eq(outboxMessages.id, message.id), eq(outboxMessages.status, "sending"), eq(outboxMessages.attempts, message.attempts));
}

/** A failed attempt: back to the queue at `nextAttemptAt`, or failed for good. */
export async function recordSendFailure(
  message: { id: string; attempts: number },
  outcome: { status: "queued" | "failed"; lastError: string; nextAttemptAt: Date },
): Promise<void> {
  await db().update(outboxMessages).set(outcome).where(stillClaimed(message));
}

export async function recordSendSuccess(message: { id: string; attempts: number }, providerMessageId: string | null): Promise<void> {
  await db().update(outboxMessages).set({ status: "sent", sentAt: new Date(), lastError: null, providerMessageId }).where(stillClaimed(message));
}

/** Puts a failed message back in the queue (admins' "send again"); false unless it had failed. */
export async function requeueFailedMessage(id: string): Promise<boolean> {
  const rows = await db()
    .update(outboxMessages)
    .set({ status: "queued", nextAttemptAt: sql`now()`, attempts: 0 })
    .where(and(eq(outboxMessages.id, id), eq(outboxMessages.status, "failed")))
    .returning({ id: outboxMessages.id });
  return rows.length > 0;
}
