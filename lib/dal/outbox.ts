import "server-only";
import { and, desc, eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { boards, outboxMessages } from "@/db/schema";
import { authorize } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { conflict, notFound } from "@/lib/errors";
import type { OutboxListQuery } from "@/lib/validation/decisions";
import { recordAudit } from "./audit";
import { isUuid } from "./boards";
import { requeueFailedMessage } from "./outbox-queue";

export interface OutboxRow {
  id: string;
  kind: string;
  to: string[];
  subject: string;
  boardName: string | null;
  status: "queued" | "sending" | "sent" | "failed";
  attempts: number;
  lastError: string | null;
  attachments: number;
  createdAt: string;
  sentAt: string | null;
  nextAttemptAt: string;
}

export interface OutboxPage {
  rows: OutboxRow[];
  total: number;
  counts: Record<"queued" | "sending" | "sent" | "failed", number>;
}

/** Every e-mail of the product, newest first, for site admins. */
export async function listOutbox(user: SessionUser, query: OutboxListQuery): Promise<OutboxPage> {
  authorize(user, "site.admin", { role: null });
  const where = query.status ? eq(outboxMessages.status, query.status) : undefined;
  const rows = await db()
    .select({
      id: outboxMessages.id,
      kind: outboxMessages.kind,
      to: outboxMessages.toAddresses,
      subject: outboxMessages.subject,
      boardName: boards.name,
      status: outboxMessages.status,
      attempts: outboxMessages.attempts,
      lastError: outboxMessages.lastError,
      attachments: outboxMessages.attachments,
      createdAt: outboxMessages.createdAt,
      sentAt: outboxMessages.sentAt,
      nextAttemptAt: outboxMessages.nextAttemptAt,
    })
    .from(outboxMessages)
    .leftJoin(boards, eq(boards.id, outboxMessages.boardId))
    .where(where)
    .orderBy(desc(outboxMessages.createdAt))
    .limit(query.limit)
    .offset(query.offset);
  const grouped = await db()
    .select({ status: outboxMessages.status, n: sql<number>`count(*)::int` })
    .from(outboxMessages)
    .groupBy(outboxMessages.status);
  const counts = { queued: 0, sending: 0, sent: 0, failed: 0 };
  for (const g of grouped) counts[g.status] = g.n;
  return {
    rows: rows.map((r) => ({
      ...r,
      attachments: r.attachments.length,
      createdAt: r.createdAt.toISOString(),
      sentAt: r.sentAt?.toISOString() ?? null,
      nextAttemptAt: r.nextAttemptAt.toISOString(),
    })),
    total: query.status ? counts[query.status] : Object.values(counts).reduce((a, b) => a + b, 0),
    counts,
  };
}

/** "Send again" for a failed message: back to the queue with a fresh attempt count. */
export async function requeueOutboxMessage(user: SessionUser, messageId: string): Promise<{ id: string; status: "queued" }> {
  authorize(user, "site.admin", { role: null });
  if (!isUuid(messageId)) throw notFound("That message");
  const [row] = await db()
    .select({ status: outboxMessages.status, boardId: outboxMessages.boardId, kind: outboxMessages.kind })
    .from(outboxMessages)
    .where(and(eq(outboxMessages.id, messageId)));
  if (!row) throw notFound("That message");
  if (!(await requeueFailedMessage(messageId))) throw conflict(`Only failed messages can be sent again; this one is ${row.status}.`, { status: row.status });
  await recordAudit({
    action: "outbox.requeue",
    actorId: user.id,
    actorEmail: user.email,
    boardId: row.boardId,
    target: messageId,
    details: { kind: row.kind },
  });
  return { id: messageId, status: "queued" };
}
