import "server-only";
import { and, asc, desc, eq, ilike, or, sql, type SQL } from "drizzle-orm";
import { db } from "@/db/client";
import { boardMembers, users } from "@/db/schema";
import { authorize } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/dal/sessions";
import { recordAudit } from "@/lib/dal/audit";
import { boardRole, isUuid } from "@/lib/dal/boards";
import { conflict, notFound } from "@/lib/errors";
import type { MemberListQuery, updateMemberSchema } from "@/lib/validation/accounts";
import type { z } from "zod";

export interface MemberRow {
  id: string;
  userId: string;
  name: string;
  email: string;
  organisation: string | null;
  role: "proposer" | "reviewer" | "chair";
  status: "active" | "deactivated";
  accountStatus: "active" | "deactivated" | "unverified";
  joinedAt: Date;
}

const memberColumns = {
  id: boardMembers.id,
  userId: boardMembers.userId,
  name: users.name,
  email: users.email,
  organisation: users.organisation,
  role: boardMembers.role,
  status: boardMembers.status,
  accountStatus: users.status,
  joinedAt: boardMembers.createdAt,
};

const sortColumns = {
  name: sql`lower(${users.name})`,
  email: sql`lower(${users.email})`,
  role: boardMembers.role,
  status: boardMembers.status,
  joined: boardMembers.createdAt,
};

/** `%` and `_` in a search are literal characters, not patterns. */
export function likePattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

async function requireBoardPermission(user: SessionUser, boardId: string, permission: "members.view" | "members.manage") {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId);
  authorize(user, permission, { role }, "That board");
  return role;
}

/** One page of a board's members, searched, filtered and sorted on the server (chairs and admins). */
export async function listMembers(
  user: SessionUser,
  boardId: string,
  query: MemberListQuery,
): Promise<{ members: MemberRow[]; hasMore: boolean; page: number; pageSize: number }> {
  await requireBoardPermission(user, boardId, "members.view");
  const fetched = await memberListStatement(boardId, query);
  const hasMore = fetched.length > query.pageSize;
  return { members: hasMore ? fetched.slice(0, query.pageSize) : fetched, hasMore, page: query.page, pageSize: query.pageSize };
}

/** The members list's statement (one row more than the page; no count), also used by the plan check in the tests. */
export function memberListStatement(boardId: string, query: MemberListQuery) {
  const conditions: SQL[] = [eq(boardMembers.boardId, boardId)];
  if (query.q)
    conditions.push(or(ilike(users.name, likePattern(query.q)), ilike(users.email, likePattern(query.q)), ilike(users.organisation, likePattern(query.q)))!);
  if (query.role) conditions.push(eq(boardMembers.role, query.role));
  if (query.status) conditions.push(eq(boardMembers.status, query.status));
  const where = and(...conditions);
  const order = query.dir === "desc" ? desc(sortColumns[query.sort]) : asc(sortColumns[query.sort]);
  return db()
    .select(memberColumns)
    .from(boardMembers)
    .innerJoin(users, eq(users.id, boardMembers.userId))
    .where(where)
    .orderBy(order, asc(boardMembers.id))
    .limit(query.pageSize + 1)
    .offset((query.page - 1) * query.pageSize);
}

/**
 * Changes a member's role or status. Refused (409): changing your own membership, and
 * anything that would leave the board without an active chair. The board's active chair
 * rows are locked first, so two chairs demoting each other at once cannot both succeed.
 */
export async function updateMember(
  user: SessionUser,
  boardId: string,
  memberId: string,
  input: z.infer<typeof updateMemberSchema>,
  meta: { ipAddress?: string | null } = {},
): Promise<MemberRow> {
  await requireBoardPermission(user, boardId, "members.manage");
  if (!isUuid(memberId)) throw notFound("That member");
  return db().transaction(async (tx) => {
    const activeChairs = await tx
      .select({ id: boardMembers.id })
      .from(boardMembers)
      .where(and(eq(boardMembers.boardId, boardId), eq(boardMembers.role, "chair"), eq(boardMembers.status, "active")))
      .for("update");
    const [current] = await tx
      .select({ id: boardMembers.id, userId: boardMembers.userId, role: boardMembers.role, status: boardMembers.status, email: users.email })
      .from(boardMembers)
      .innerJoin(users, eq(users.id, boardMembers.userId))
      .where(and(eq(boardMembers.id, memberId), eq(boardMembers.boardId, boardId)))
      .for("update", { of: boardMembers });
    if (!current) throw notFound("That member");
    const role = input.role ?? current.role;
    const status = input.status ?? current.status;
    if (current.userId === user.id && (role !== current.role || status !== current.status)) {
      throw conflict("You cannot change your own role or deactivate yourself; ask another chair or an admin.");
    }
    const wasActiveChair = current.role === "chair" && current.status === "active";
    const staysActiveChair = role === "chair" && status === "active";
    if (wasActiveChair && !staysActiveChair && activeChairs.length <= 1) {
      throw conflict("This is the board's last active chair. Make another member chair first, then change this one.");
    }
    const [updated] = await tx
      .update(boardMembers)
      .set({ role, status })
      .where(and(eq(boardMembers.id, memberId), eq(boardMembers.boardId, boardId)))
      .returning({ id: boardMembers.id });
    if (!updated) throw notFound("That member");
    const audit = { actorId: user.id, actorEmail: user.email, boardId, target: `member:${memberId}`, ipAddress: meta.ipAddress };
    if (role !== current.role) {
      await recordAudit({ ...audit, action: "member.role-changed", details: { email: current.email, from: current.role, to: role } }, tx);
    }
    if (status !== current.status) {
      await recordAudit(
        { ...audit, action: status === "deactivated" ? "member.deactivated" : "member.reactivated", details: { email: current.email, role } },
        tx,
      );
    }
    const [row] = await tx.select(memberColumns).from(boardMembers).innerJoin(users, eq(users.id, boardMembers.userId)).where(eq(boardMembers.id, memberId));
    return row!;
  });
}
