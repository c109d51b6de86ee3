import "server-only";
import { desc, sql } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { auditEvents } from "@/db/schema";

export interface AuditEntry {
  action: string;
  actorId?: string | null;
  actorEmail?: string | null;
  boardId?: string | null;
  target?: string | null;
  details?: Record<string, unknown>;
  ipAddress?: string | null;
}

/** Records one audit event; pass the transaction when the event belongs to a larger write. */
export async function recordAudit(entry: AuditEntry, tx: Database | Transaction = db()): Promise<void> {
  await tx.insert(auditEvents).values({
    action: entry.action,
    actorId: entry.actorId ?? null,
    actorEmail: entry.actorEmail ?? null,
    boardId: entry.boardId ?? null,
    target: entry.target ?? null,
    details: entry.details ?? {},
    ipAddress: entry.ipAddress ?? null,
  });
}

export async function listAuditEvents(options: { limit: number; offset: number }) {
  const rows = await db()
    .select({
      id: auditEvents.id,
      occurredAt: auditEvents.occurredAt,
      actorEmail: auditEvents.actorEmail,
      boardId: auditEvents.boardId,
      action: auditEvents.action,
      target: auditEvents.target,
      details: auditEvents.details,
      ipAddress: auditEvents.ipAddress,
    })
    .from(auditEvents)
    .orderBy(desc(auditEvents.occurredAt))
    .limit(options.limit)
    .offset(options.offset);
  const [count] = await db().select({ n: sql<number>`count(*)::int` }).from(auditEvents);
  return { rows, total: count?.n ?? 0 };
}
