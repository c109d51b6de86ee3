import "server-only";
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { outboxMessages } from "@/db/schema";
import { readObject } from "@/storage/object-store";
import { mailFrom, mailTransport } from "./transport";

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

/**
 * Puts a message in the outbox. Pass the transaction of the write the message belongs to
 * (a decision, an invitation) so both commit or neither does; the worker sends it after.
 */
export async function enqueueMail(mail: OutgoingMail, tx: Database | Transaction = db()): Promise<{ id: string; duplicate: boolean }> {
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

export const MAX_ATTEMPTS = 12;

/** Seconds before attempt n+1: 5 s, 10 s, 20 s … capped at 15 minutes. */
export function backoffSeconds(attempts: number): number {
  return Math.min(15 * 60, 5 * 2 ** Math.max(0, attempts - 1));
}

/**
 * Sends what is due. Each message is claimed by moving it to `sending` under
 * FOR UPDATE SKIP LOCKED, so several workers never send the same one. A message whose
 * worker died mid-send (still `sending` after 5 minutes) is retried; the SMTP Message-ID
 * is fixed per message so a receiving server can drop a duplicate of that rare case.
 */
export async function processOutbox(limit = 20): Promise<{ sent: number; failed: number }> {
  const claimed = await db().transaction(async (tx) => {
    const due = await tx
      .select({ id: outboxMessages.id })
      .from(outboxMessages)
      .where(
        sql`(${outboxMessages.status} = 'queued' and ${outboxMessages.nextAttemptAt} <= now())
          or (${outboxMessages.status} = 'sending' and ${outboxMessages.nextAttemptAt} <= now() - interval '5 minutes')`,
      )
      .orderBy(asc(outboxMessages.nextAttemptAt))
      .limit(limit)
      .for("update", { skipLocked: true });
    if (due.length === 0) return [];
    return tx
      .update(outboxMessages)
      .set({ status: "sending", attempts: sql`${outboxMessages.attempts} + 1`, nextAttemptAt: new Date() })
      .where(inArray(outboxMessages.id, due.map((d) => d.id)))
      .returning();
  });

  let sent = 0;
  let failed = 0;
  for (const message of claimed) {
    try {
      const attachments = await Promise.all(
        message.attachments.map(async (a) => ({ filename: a.filename, contentType: a.contentType, content: await readObject(a.objectKey) })),
      );
      const info = await mailTransport().sendMail({
        from: mailFrom(),
        to: message.toAddresses,
        subject: message.subject,
        html: message.html,
        text: message.text,
        attachments,
        messageId: `<${message.id}@visviva.local>`,
        headers: { "X-VisViva-Outbox-Id": message.id, "X-VisViva-Kind": message.kind },
      });
      await db()
        .update(outboxMessages)
        .set({ status: "sent", sentAt: new Date(), lastError: null, providerMessageId: info.messageId ?? null })
        .where(and(eq(outboxMessages.id, message.id), eq(outboxMessages.status, "sending")));
      sent += 1;
    } catch (error) {
      failed += 1;
      const exhausted = message.attempts >= MAX_ATTEMPTS;
      await db()
        .update(outboxMessages)
        .set({
          status: exhausted ? "failed" : "queued",
          lastError: (error instanceof Error ? error.message : String(error)).slice(0, 1000),
          nextAttemptAt: new Date(Date.now() + backoffSeconds(message.attempts) * 1000),
        })
        .where(eq(outboxMessages.id, message.id));
    }
  }
  return { sent, failed };
}

/** Puts a failed message back in the queue (admins' "send again"). */
export async function requeueMessage(id: string): Promise<boolean> {
  const rows = await db()
    .update(outboxMessages)
    .set({ status: "queued", nextAttemptAt: new Date(), attempts: 0 })
    .where(and(eq(outboxMessages.id, id), eq(outboxMessages.status, "failed")))
    .returning({ id: outboxMessages.id });
  return rows.length > 0;
}

export async function outboxMessageStatus(id: string) {
  const [row] = await db()
    .select({ status: outboxMessages.status, attempts: outboxMessages.attempts, lastError: outboxMessages.lastError })
    .from(outboxMessages)
    .where(eq(outboxMessages.id, id));
  return row ?? null;
}

