import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { boardMembers, boards } from "@/db/schema";
import { recordAudit } from "./audit";
import type { Transaction } from "./transaction";

/** The board's name, its letter template (null: the default) and the user's active role on it. */
export async function boardLetterTemplate(boardId: string, userId: string) {
  const [board] = await db().select({ name: boards.name, letterTemplate: boards.letterTemplate }).from(boards).where(eq(boards.id, boardId));
  const [member] = await db()
    .select({ role: boardMembers.role })
    .from(boardMembers)
    .where(and(eq(boardMembers.boardId, boardId), eq(boardMembers.userId, userId), eq(boardMembers.status, "active")));
  return { board: board ? { name: board.name, letterTemplate: board.letterTemplate ?? null } : null, role: member?.role ?? null };
}

/** Stores the board's letter template (null resets to the default) with its audit row, in `tx`. */
export async function writeLetterTemplate(
  tx: Transaction,
  actor: { id: string; email: string },
  boardId: string,
  template: Record<string, unknown> | null,
): Promise<void> {
  await tx.update(boards).set({ letterTemplate: template }).where(eq(boards.id, boardId));
  await recordAudit(
    { action: "board.letter-template", actorId: actor.id, actorEmail: actor.email, boardId, target: boardId, details: { reset: template === null } },
    tx,
  );
}
