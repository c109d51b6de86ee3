import "server-only";
import { and, asc, desc, eq, ilike, or, type SQL } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { auditEvents } from "@/db/schema";
import { authorize } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/dal/sessions";
import type { AuditQuery } from "@/lib/validation/accounts";

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

/** The audit log for site admins: searched by actor, target or action, newest first by default. */
export async function listAuditLog(user: SessionUser, query: AuditQuery) {
  authorize(user, "site.admin", { role: null });
  const fetched = await auditLogStatement(query);
  const hasMore = fetched.length > query.pageSize;
  return { events: hasMore ? fetched.slice(0, query.pageSize) : fetched, hasMore, page: query.page, pageSize: query.pageSize };
}

/** The audit list's statement (one row more than the page; no count), also used by the plan check in the tests. */
export function auditLogStatement(query: AuditQuery) {
  const conditions: SQL[] = [];
  if (query.action) conditions.push(eq(auditEvents.action, query.action));
  if (query.q) {
    const pattern = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    conditions.push(or(ilike(auditEvents.actorEmail, pattern), ilike(auditEvents.target, pattern), ilike(auditEvents.action, pattern))!);
  }
  const where = conditions.length ? and(...conditions) : undefined;
  return db()
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
    .where(where)
    .orderBy(query.dir === "asc" ? asc(auditEvents.occurredAt) : desc(auditEvents.occurredAt), asc(auditEvents.id))
    .limit(query.pageSize + 1)
    .offset((query.page - 1) * query.pageSize);
}
