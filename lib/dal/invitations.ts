import "server-only";
import { and, desc, eq, gt, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { boardMembers, boards, invitations, users, userSessions } from "@/db/schema";
import { authorize } from "@/lib/auth/policy";
import { hashPassword } from "@/lib/auth/passwords";
import { hashToken, newToken } from "@/lib/auth/tokens";
import type { SessionUser } from "@/lib/dal/sessions";
import { recordAudit } from "@/lib/dal/audit";
import { boardRole, isUuid } from "@/lib/dal/boards";
import { env } from "@/lib/env";
import { AppError, conflict, notFound, unprocessable } from "@/lib/errors";
import { enqueueMail } from "@/lib/mail/outbox";
import { renderMail } from "@/lib/mail/templates/layout";
import { INVITATION_DAYS, type acceptInvitationSchema, type createInvitationSchema, type InvitationListQuery } from "@/lib/validation/accounts";
import type { z } from "zod";
import { formatDateTime } from "@/lib/format/dates";

export type InvitationStatus = "pending" | "accepted" | "revoked" | "expired";

export interface InvitationRow {
  id: string;
  email: string;
  name: string | null;
  role: "proposer" | "reviewer" | "chair";
  status: InvitationStatus;
  expiresAt: Date;
  createdAt: Date;
  invitedBy: string | null;
}

function statusOf(row: { acceptedAt: Date | null; revokedAt: Date | null; expiresAt: Date }, now = new Date()): InvitationStatus {
  if (row.acceptedAt) return "accepted";
  if (row.revokedAt) return "revoked";
  if (row.expiresAt <= now) return "expired";
  return "pending";
}

async function requireMembersPermission(user: SessionUser, boardId: string, permission: "members.view" | "members.manage") {
  if (!isUuid(boardId)) throw notFound("That board");
  authorize(user, permission, { role: await boardRole(user.id, boardId) }, "That board");
}

export function invitationUrl(token: string): string {
  return `${env().APP_URL.replace(/\/$/, "")}/invitations/${encodeURIComponent(token)}`;
}

const roleWords = { proposer: "a proposer", reviewer: "a reviewer", chair: "a chair" } as const;

export interface InvitationPage {
  invitations: InvitationRow[];
  total: number;
  pendingTotal: number;
  page: number;
  pageSize: number;
}

/**
 * The board's invitations, newest first, one page at a time (chairs and admins). Pending
 * ones by default: links that were neither accepted nor withdrawn and have not expired.
 */
export async function listInvitations(user: SessionUser, boardId: string, query: Partial<InvitationListQuery> = {}): Promise<InvitationPage> {
  await requireMembersPermission(user, boardId, "members.view");
  const { show = "pending", page = 1, pageSize = 25 } = query;
  const pendingWhere = and(isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, sql`now()`));
  const where = show === "pending" ? and(eq(invitations.boardId, boardId), pendingWhere) : eq(invitations.boardId, boardId);
  const [rows, [counts]] = await Promise.all([
    db()
      .select({
        id: invitations.id,
        email: invitations.email,
        name: invitations.name,
        role: invitations.role,
        expiresAt: invitations.expiresAt,
        acceptedAt: invitations.acceptedAt,
        revokedAt: invitations.revokedAt,
        createdAt: invitations.createdAt,
        invitedBy: users.email,
      })
      .from(invitations)
      .leftJoin(users, eq(users.id, invitations.invitedBy))
      .where(where)
      .orderBy(desc(invitations.createdAt), desc(invitations.id))
      .limit(pageSize)
      .offset((page - 1) * pageSize),
    db()
      .select({
        all: sql<number>`count(*)::int`,
        pending: sql<number>`(count(*) filter (where ${pendingWhere}))::int`,
      })
      .from(invitations)
      .where(eq(invitations.boardId, boardId)),
  ]);
  return {
    invitations: rows.map(({ acceptedAt, revokedAt, ...r }) => ({ ...r, status: statusOf({ acceptedAt, revokedAt, expiresAt: r.expiresAt }) })),
    total: show === "pending" ? (counts?.pending ?? 0) : (counts?.all ?? 0),
    pendingTotal: counts?.pending ?? 0,
    page,
    pageSize,
  };
}

/**
 * Invites someone by e-mail to a board with a role. Any earlier pending invitation of the
 * same address to the same board is withdrawn, so only the newest link works. The mail is
 * queued in the same transaction as the invitation and its audit row.
 */
export async function createInvitation(
  user: SessionUser,
  boardId: string,
  input: z.infer<typeof createInvitationSchema>,
  meta: { ipAddress?: string | null } = {},
): Promise<InvitationRow & { token: string }> {
  await requireMembersPermission(user, boardId, "members.manage");
  const { token, tokenHash } = newToken();
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 86_400_000);
  return db().transaction(async (tx) => {
    const [board] = await tx.select({ name: boards.name }).from(boards).where(eq(boards.id, boardId));
    if (!board) throw notFound("That board");
    const [existing] = await tx
      .select({ status: boardMembers.status })
      .from(boardMembers)
      .innerJoin(users, eq(users.id, boardMembers.userId))
      .where(and(eq(boardMembers.boardId, boardId), sql`lower(${users.email}) = ${input.email}`));
    if (existing?.status === "active")
      throw conflict(`${input.email} is already an active member of this board; change their role in the members table instead.`);
    await tx
      .update(invitations)
      .set({ revokedAt: new Date() })
      .where(
        and(eq(invitations.boardId, boardId), sql`lower(${invitations.email}) = ${input.email}`, isNull(invitations.acceptedAt), isNull(invitations.revokedAt)),
      );
    const [row] = await tx
      .insert(invitations)
      .values({ boardId, email: input.email, name: input.name ?? null, role: input.role, tokenHash, invitedBy: user.id, expiresAt })
      .returning({
        id: invitations.id,
        email: invitations.email,
        name: invitations.name,
        role: invitations.role,
        expiresAt: invitations.expiresAt,
        createdAt: invitations.createdAt,
      });
    const mail = await renderMail({
      subject: `Invitation to the ${board.name}`,
      preview: `${user.name} invites you to join as ${roleWords[input.role]}.`,
      heading: `Join the ${board.name}`,
      paragraphs: [
        `${input.name ? `Hello ${input.name}, ` : ""}${user.name} invites you to take part in the ${board.name} on VisViva as ${roleWords[input.role]}.`,
        `The link works once and expires on ${formatDateTime(expiresAt)}. If you already have a VisViva account, accepting adds this board to it.`,
      ],
      action: { label: "Accept the invitation", url: invitationUrl(token) },
      footnote: "You receive this because a chair or administrator of a VisViva review board entered your address. If you did not expect it, ignore it.",
    });
    await enqueueMail({ kind: "invitation", dedupeKey: `invitation:${row!.id}`, to: [input.email], boardId, ...mail }, tx);
    await recordAudit(
      {
        action: "invitation.sent",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: `invitation:${row!.id}`,
        details: { email: input.email, role: input.role },
        ipAddress: meta.ipAddress,
      },
      tx,
    );
    return { ...row!, status: "pending" as const, invitedBy: user.email, token };
  });
}

/** Withdraws a pending invitation so its link stops working. */
export async function revokeInvitation(
  user: SessionUser,
  boardId: string,
  invitationId: string,
  meta: { ipAddress?: string | null } = {},
): Promise<{ ok: true }> {
  await requireMembersPermission(user, boardId, "members.manage");
  if (!isUuid(invitationId)) throw notFound("That invitation");
  return db().transaction(async (tx) => {
    const [row] = await tx
      .select({
        id: invitations.id,
        email: invitations.email,
        acceptedAt: invitations.acceptedAt,
        revokedAt: invitations.revokedAt,
        expiresAt: invitations.expiresAt,
      })
      .from(invitations)
      .where(and(eq(invitations.id, invitationId), eq(invitations.boardId, boardId)))
      .for("update");
    if (!row) throw notFound("That invitation");
    const status = statusOf(row);
    if (status === "accepted") throw conflict("That invitation was already accepted; deactivate the member instead.");
    if (status === "revoked") return { ok: true as const };
    await tx
      .update(invitations)
      .set({ revokedAt: new Date() })
      .where(and(eq(invitations.id, invitationId), eq(invitations.boardId, boardId)));
    await recordAudit(
      {
        action: "invitation.revoked",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: `invitation:${invitationId}`,
        details: { email: row.email },
        ipAddress: meta.ipAddress,
      },
      tx,
    );
    return { ok: true as const };
  });
}

export interface InvitationPreview {
  boardName: string;
  email: string;
  name: string | null;
  role: "proposer" | "reviewer" | "chair";
  status: InvitationStatus;
  expiresAt: Date;
  /** An account with this address exists: accepting only adds the board to it. */
  hasAccount: boolean;
}

/** What the acceptance page shows for a token (public: the token is the credential). */
export async function invitationForToken(token: string): Promise<InvitationPreview | null> {
  if (!token || token.length > 200) return null;
  const [row] = await db()
    .select({
      boardName: boards.name,
      email: invitations.email,
      name: invitations.name,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      revokedAt: invitations.revokedAt,
      // An unverified account does not count: accepting replaces it (see acceptInvitation).
      hasAccount: sql<boolean>`exists (select 1 from ${users} where lower(${users.email}) = lower(${invitations.email}) and ${users.status} <> 'unverified')`,
    })
    .from(invitations)
    .innerJoin(boards, eq(boards.id, invitations.boardId))
    .where(eq(invitations.tokenHash, hashToken(token)));
  if (!row) return null;
  const { acceptedAt, revokedAt, ...rest } = row;
  return { ...rest, status: statusOf({ acceptedAt, revokedAt, expiresAt: row.expiresAt }) };
}

const unusable: Record<Exclude<InvitationStatus, "pending">, string> = {
  accepted: "This invitation was already used. Sign in with your account instead.",
  revoked: "This invitation was withdrawn. Ask the board's chair for a new one.",
  expired: "This invitation has expired. Ask the board's chair for a new one.",
};

/**
 * Accepts an invitation once: creates the account (name and password required) or, when
 * the address already has one, adds the board membership to it. The invitation row is
 * locked, so a double submit cannot use it twice.
 */
export async function acceptInvitation(
  input: z.infer<typeof acceptInvitationSchema>,
  meta: { ipAddress?: string | null; user?: SessionUser | null } = {},
): Promise<{ email: string; boardId: string; createdAccount: boolean }> {
  const passwordHash = input.password ? await hashPassword(input.password) : null;
  return db().transaction(async (tx) => {
    const [invitation] = await tx
      .select({
        id: invitations.id,
        boardId: invitations.boardId,
        email: invitations.email,
        name: invitations.name,
        role: invitations.role,
        expiresAt: invitations.expiresAt,
        acceptedAt: invitations.acceptedAt,
        revokedAt: invitations.revokedAt,
      })
      .from(invitations)
      .where(eq(invitations.tokenHash, hashToken(input.token)))
      .for("update");
    if (!invitation) throw notFound("That invitation");
    const status = statusOf(invitation);
    if (status !== "pending") throw new AppError(409, unusable[status]);

    let [account] = await tx
      .select({ id: users.id, email: users.email, status: users.status })
      .from(users)
      .where(sql`lower(${users.email}) = lower(${invitation.email})`)
      .for("update");
    // The invitation link proves the address. An unverified account (anyone may have
    // registered it openly) is taken over by the address's owner: new name and password, its
    // sessions ended. An active account must be signed in to accept: the link alone is not
    // proof enough to add a role to an account someone else may control.
    const unverified = account?.status === "unverified";
    if (account && !unverified) {
      if (account.status !== "active") throw conflict("The account with this address is closed. Ask an administrator to reopen it.");
      if (meta.user?.id !== account.id)
        throw new AppError(
          403,
          `An account with ${account.email} exists. Sign in as ${account.email} first, then open this invitation link again to accept it.`,
        );
    }
    const createdAccount = !account || unverified;
    if (createdAccount) {
      const name = input.name ?? invitation.name;
      if (!name) throw unprocessable("Enter your name.", { fieldErrors: { name: ["Enter your name."] } });
      if (!passwordHash)
        throw unprocessable("Choose a password of at least 12 characters.", { fieldErrors: { password: ["Choose a password of at least 12 characters."] } });
      if (account) {
        await tx.update(users).set({ name, passwordHash, organisation: null, status: "active", updatedAt: new Date() }).where(eq(users.id, account.id));
        await tx
          .update(userSessions)
          .set({ revokedAt: new Date() })
          .where(and(eq(userSessions.userId, account.id), isNull(userSessions.revokedAt)));
        await tx.delete(boardMembers).where(eq(boardMembers.userId, account.id));
      } else {
        [account] = await tx
          .insert(users)
          .values({ email: invitation.email, name, passwordHash })
          .returning({ id: users.id, email: users.email, status: users.status });
      }
    }
    const userId = account!.id;
    await tx
      .insert(boardMembers)
      .values({ boardId: invitation.boardId, userId, role: invitation.role, status: "active" })
      .onConflictDoUpdate({ target: [boardMembers.boardId, boardMembers.userId], set: { role: invitation.role, status: "active" } });
    const used = await tx
      .update(invitations)
      .set({ acceptedAt: new Date() })
      .where(and(eq(invitations.id, invitation.id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, new Date())))
      .returning({ id: invitations.id });
    if (used.length !== 1) throw conflict(unusable.accepted);
    await recordAudit(
      {
        action: "invitation.accepted",
        actorId: userId,
        actorEmail: account!.email,
        boardId: invitation.boardId,
        target: `invitation:${invitation.id}`,
        details: { role: invitation.role, createdAccount },
        ipAddress: meta.ipAddress,
      },
      tx,
    );
    return { email: account!.email, boardId: invitation.boardId, createdAccount };
  });
}
