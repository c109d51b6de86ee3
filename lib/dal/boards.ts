import "server-only";
import { and, eq } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { boardMembers, type BoardRole } from "@/db/schema";

/**
 * The user's role on a board while their membership is active; null when they are not a
 * member or their membership was deactivated. Every area builds its policy facts from this.
 */
export async function boardRole(userId: string, boardId: string, tx: Database | Transaction = db()): Promise<BoardRole | null> {
  if (!isUuid(boardId) || !isUuid(userId)) return null;
  const [row] = await tx
    .select({ role: boardMembers.role })
    .from(boardMembers)
    .where(and(eq(boardMembers.boardId, boardId), eq(boardMembers.userId, userId), eq(boardMembers.status, "active")))
    .limit(1);
  return row?.role ?? null;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Ids come from URLs; a malformed one is simply an unknown resource, never a database error. */
export function isUuid(value: string): boolean {
  return UUID.test(value);
}
