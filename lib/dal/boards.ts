import "server-only";
import { and, asc, desc, eq, isNotNull, sql } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { boardMembers, boards, calls, type BoardRole } from "@/db/schema";
import { authorize } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/dal/sessions";
import { recordAudit } from "@/lib/dal/audit";
import { conflict, notFound } from "@/lib/errors";
import type { createBoardSchema, updateBoardSchema } from "@/lib/validation/accounts";
import type { z } from "zod";

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

const boardColumns = {
  id: boards.id,
  slug: boards.slug,
  name: boards.name,
  description: boards.description,
  openRegistration: boards.openRegistration,
  hideProposerNames: boards.hideProposerNames,
  reviewersSeeAllVersions: boards.reviewersSeeAllVersions,
  shareReviewItemsAfterSubmit: boards.shareReviewItemsAfterSubmit,
  createdAt: boards.createdAt,
};

export interface BoardView {
  id: string;
  slug: string;
  name: string;
  description: string;
  openRegistration: boolean;
  hideProposerNames: boolean;
  reviewersSeeAllVersions: boolean;
  shareReviewItemsAfterSubmit: boolean;
  createdAt: Date;
  /** The caller's active role; null for an admin who is not a member. */
  myRole: BoardRole | null;
}

/**
 * Loads a board and checks `board.view` (or a stronger permission) for the caller. A board
 * the caller is not an active member of answers 404, as if it did not exist.
 */
export async function getBoard(user: SessionUser, boardId: string, permission: "board.view" | "board.manage" = "board.view"): Promise<BoardView> {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId);
  authorize(user, permission, { role }, "That board");
  const [row] = await db().select(boardColumns).from(boards).where(eq(boards.id, boardId)).limit(1);
  if (!row) throw notFound("That board");
  return { ...row, myRole: role };
}

/** The boards the caller is an active member of; admins see every board. */
export async function listBoards(user: SessionUser): Promise<BoardView[]> {
  // No single-resource permission applies: the membership join is the filter. (A column
  // inside a raw sql subquery renders unqualified, so the role comes from a real join.)
  const membership = and(eq(boardMembers.boardId, boards.id), eq(boardMembers.userId, user.id), eq(boardMembers.status, "active"));
  const query = db()
    .select({ ...boardColumns, myRole: boardMembers.role })
    .from(boards)
    .leftJoin(boardMembers, membership)
    .orderBy(asc(boards.name));
  const rows = user.isAdmin ? await query : await query.where(isNotNull(boardMembers.id));
  return rows.map((r) => ({ ...r, myRole: (r.myRole as BoardRole | null) ?? null }));
}

function slugify(name: string): string {
  const base = name
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 50)
    .replace(/-+$/g, "");
  return base.length >= 3 ? base : `board-${base || "new"}`;
}

/** Site admins create boards; the first chair is then invited from the members page. */
export async function createBoard(user: SessionUser, input: z.infer<typeof createBoardSchema>, meta: { ipAddress?: string | null } = {}): Promise<BoardView> {
  authorize(user, "site.admin", { role: null });
  const slug = input.slug ?? slugify(input.name);
  return db().transaction(async (tx) => {
    const inserted = await tx
      .insert(boards)
      .values({ slug, name: input.name, description: input.description ?? "" })
      .onConflictDoNothing()
      .returning(boardColumns);
    const row = inserted[0];
    if (!row) throw conflict(`The short name "${slug}" is taken by another board; choose another.`, { field: "slug" });
    await recordAudit(
      {
        action: "board.created",
        actorId: user.id,
        actorEmail: user.email,
        boardId: row.id,
        target: `board:${row.id}`,
        details: { name: row.name, slug },
        ipAddress: meta.ipAddress,
      },
      tx,
    );
    return { ...row, myRole: null };
  });
}

/** Chairs (and admins) change a board's name, description and privacy settings. */
export async function updateBoard(
  user: SessionUser,
  boardId: string,
  input: z.infer<typeof updateBoardSchema>,
  meta: { ipAddress?: string | null } = {},
): Promise<BoardView> {
  const before = await getBoard(user, boardId, "board.manage");
  const changes = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined));
  return db().transaction(async (tx) => {
    const [row] = await tx.update(boards).set(changes).where(eq(boards.id, boardId)).returning(boardColumns);
    if (!row) throw notFound("That board");
    const changed = Object.fromEntries(
      Object.entries(changes)
        .filter(([k, v]) => before[k as keyof BoardView] !== v)
        .map(([k, v]) => [k, { from: before[k as keyof BoardView], to: v }]),
    );
    await recordAudit(
      {
        action: "board.settings-changed",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: `board:${boardId}`,
        details: changed,
        ipAddress: meta.ipAddress,
      },
      tx,
    );
    return { ...row, myRole: before.myRole };
  });
}

export interface BoardCallSummary {
  id: string;
  title: string;
  opensAt: Date;
  closesAt: Date;
  state: "upcoming" | "open" | "closed";
}

/** The board's calls, newest first, for the board home page. */
export async function listBoardCalls(user: SessionUser, boardId: string): Promise<BoardCallSummary[]> {
  await getBoard(user, boardId);
  return db()
    .select({
      id: calls.id,
      title: calls.title,
      opensAt: calls.opensAt,
      closesAt: calls.closesAt,
      state: sql<BoardCallSummary["state"]>`case when now() < ${calls.opensAt} then 'upcoming' when now() <= ${calls.closesAt} then 'open' else 'closed' end`,
    })
    .from(calls)
    .where(eq(calls.boardId, boardId))
    .orderBy(desc(calls.closesAt));
}

/** What the public registration page may show: only boards that allow it, by slug or id. */
export async function boardOpenForRegistration(slugOrId: string): Promise<{ id: string; slug: string; name: string; description: string } | null> {
  const [row] = await db()
    .select({ id: boards.id, slug: boards.slug, name: boards.name, description: boards.description })
    .from(boards)
    .where(and(isUuid(slugOrId) ? eq(boards.id, slugOrId) : eq(boards.slug, slugOrId.toLowerCase()), eq(boards.openRegistration, true)))
    .limit(1);
  return row ?? null;
}
