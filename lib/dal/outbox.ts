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
  /** Whether another page follows (one extra row is fetched; the outbox is not counted per request). */
  hasMore: boolean;
  /** Messages per status, counted up to OUTBOX_COUNT_LIMIT through the status index: a value at the limit means "that many or more". */
  counts: Record<"queued" | "sending" | "sent" | "failed", number>;
  countLimit: number;
}

/** Status counts stop here: enough to say "1,000 or more" without counting a large outbox. */
export const OUTBOX_COUNT_LIMIT = 1000;

const outboxStatuses = ["queued", "sending", "sent", "failed"] as const;

/** The outbox list's statement (one row more than the page, newest first), also used by the plan check in the tests. */
export function outboxListStatement(query: OutboxListQuery) {
  return db()
    .select({
      id: outboxMessages.id,
      kind: outboxMessages.kind,
      to: outboxMessages.toAddresses,
      subject: outboxMessages.subject,
      boardName: sql<string | null>`(select ${boards.name} from ${boards} where ${boards.id} = ${outboxMessages.boardId})`,
      status: outboxMessages.status,
      attempts: outboxMessages.attempts,
      lastError: outboxMessages.lastError,
      attachments: outboxMessages.attachments,
      createdAt: outboxMessages.createdAt,
      sentAt: outboxMessages.sentAt,
      nextAttemptAt: outboxMessages.nextAttemptAt,
    })
    .from(outboxMessages)
    .where(query.status ? eq(outboxMessages.status, query.status) : undefined)
    .orderBy(desc(outboxMessages.createdAt), desc(outboxMessages.id))
    .limit(query.limit + 1)
    .offset(query.offset);
}

/** The bounded status counts in one statement (each a range of the (status, created_at) index that stops at the limit; the order keeps it on the index). */
export function outboxCountsStatement() {
  return sql.join(
    [
      sql`select `,
      sql.join(
        outboxStatuses.map(
          (s) =>
            sql`(select count(*)::int from (select 1 from ${outboxMessages} where ${outboxMessages.status} = ${s} order by ${outboxMessages.createdAt} desc limit ${OUTBOX_COUNT_LIMIT}) x) as ${sql.identifier(s)}`,
        ),
        sql`, `,
      ),
    ],
    sql``,
  );
}

/** Every e-mail of the product, newest first, for site admins. */
export async function listOutbox(user: SessionUser, query: OutboxListQuery): Promise<OutboxPage> {
  authorize(user, "site.admin", { role: null });
  const [fetched, counted] = await Promise.all([
    outboxListStatement(query),
    db().execute<Record<(typeof outboxStatuses)[number], number>>(outboxCountsStatement()),
  ]);
  const hasMore = fetched.length > query.limit;
  const rows = hasMore ? fetched.slice(0, query.limit) : fetched;
  const c = counted.rows[0];
  const counts = { queued: c?.queued ?? 0, sending: c?.sending ?? 0, sent: c?.sent ?? 0, failed: c?.failed ?? 0 };
  return {
    rows: rows.map((r) => ({
      ...r,
      attachments: r.attachments.length,
      createdAt: r.createdAt.toISOString(),
      sentAt: r.sentAt?.toISOString() ?? null,
      nextAttemptAt: r.nextAttemptAt.toISOString(),
    })),
    hasMore,
    counts,
    countLimit: OUTBOX_COUNT_LIMIT,
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
