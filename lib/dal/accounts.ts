import "server-only";
import { and, asc, eq, gt, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { accountTokens, boardMembers, boards, users, userSessions } from "@/db/schema";
import { hashPassword, verifyPassword } from "@/lib/auth/passwords";
import { newToken } from "@/lib/auth/tokens";
import { consumeAccountToken, revokeOtherSessions, type SessionUser } from "@/lib/dal/sessions";
import { recordAudit } from "@/lib/dal/audit";
import { consumeRateLimit } from "@/lib/dal/rate-limits";
import { boardOpenForRegistration } from "@/lib/dal/boards";
import { env } from "@/lib/env";
import { conflict, notFound, unauthenticated, unprocessable } from "@/lib/errors";
import { enqueueMail } from "@/lib/mail/outbox";
import { renderMail } from "@/lib/mail/templates/layout";
import type {
  changePasswordSchema,
  passwordResetRequestSchema,
  passwordResetSchema,
  registerProposerSchema,
  signInLinkRequestSchema,
} from "@/lib/validation/accounts";
import type { z } from "zod";

// Account functions act on the caller's own account only: the session user IS the
// authorization (no board permission applies). Anonymous flows take no user at all.

export interface Me {
  id: string;
  email: string;
  name: string;
  organisation: string | null;
  isAdmin: boolean;
  boards: { boardId: string; slug: string; name: string; role: "proposer" | "reviewer" | "chair" }[];
  otherActiveSessions: number;
}

export async function getMe(user: SessionUser): Promise<Me> {
  const [profile] = await db()
    .select({ id: users.id, email: users.email, name: users.name, organisation: users.organisation, isAdmin: users.isAdmin })
    .from(users)
    .where(and(eq(users.id, user.id), eq(users.status, "active")));
  if (!profile) throw unauthenticated();
  const [memberships, [sessions]] = await Promise.all([
    db()
      .select({ boardId: boards.id, slug: boards.slug, name: boards.name, role: boardMembers.role })
      .from(boardMembers)
      .innerJoin(boards, eq(boards.id, boardMembers.boardId))
      .where(and(eq(boardMembers.userId, user.id), eq(boardMembers.status, "active")))
      .orderBy(asc(boards.name)),
    db()
      .select({ n: sql<number>`count(*)::int` })
      .from(userSessions)
      .where(
        and(
          eq(userSessions.userId, user.id),
          isNull(userSessions.revokedAt),
          gt(userSessions.expiresAt, new Date()),
          sql`${userSessions.id} <> ${user.sessionId}`,
        ),
      ),
  ]);
  return { ...profile, boards: memberships, otherActiveSessions: sessions?.n ?? 0 };
}

/**
 * Changes the caller's password after checking the current one. Other browsers are signed
 * out, since a password change usually means the old one may be known to someone else.
 */
export async function changePassword(
  user: SessionUser,
  input: z.infer<typeof changePasswordSchema>,
  meta: { ipAddress?: string | null } = {},
): Promise<{ ok: true; revokedSessions: number }> {
  const [row] = await db()
    .select({ passwordHash: users.passwordHash })
    .from(users)
    .where(and(eq(users.id, user.id), eq(users.status, "active")));
  if (!row) throw unauthenticated();
  if (!(await verifyPassword(row.passwordHash, input.currentPassword))) {
    await recordAudit({ action: "password.change-refused", actorId: user.id, actorEmail: user.email, ipAddress: meta.ipAddress });
    throw unprocessable("Your current password is not right.", { fieldErrors: { currentPassword: ["Your current password is not right."] } });
  }
  const passwordHash = await hashPassword(input.newPassword);
  const revokedSessions = await db().transaction(async (tx) => {
    await tx.update(users).set({ passwordHash, updatedAt: new Date() }).where(eq(users.id, user.id));
    const revoked = await tx
      .update(userSessions)
      .set({ revokedAt: new Date() })
      .where(and(eq(userSessions.userId, user.id), isNull(userSessions.revokedAt), sql`${userSessions.id} <> ${user.sessionId}`))
      .returning({ id: userSessions.id });
    await recordAudit(
      {
        action: "password.changed",
        actorId: user.id,
        actorEmail: user.email,
        target: `user:${user.id}`,
        details: { revokedSessions: revoked.length },
        ipAddress: meta.ipAddress,
      },
      tx,
    );
    return revoked.length;
  });
  return { ok: true, revokedSessions };
}

/** Signs the caller out of every other browser; this one stays signed in. */
export async function signOutOtherSessions(user: SessionUser, meta: { ipAddress?: string | null } = {}): Promise<{ revoked: number }> {
  const revoked = await revokeOtherSessions(user.id, user.sessionId);
  await recordAudit({
    action: "sessions.revoked-others",
    actorId: user.id,
    actorEmail: user.email,
    target: `user:${user.id}`,
    details: { revoked },
    ipAddress: meta.ipAddress,
  });
  return { revoked };
}

export const SIGN_IN_LINK_MINUTES = 15;
export const SIGN_IN_LINKS_PER_ADDRESS = 3;
export const SIGN_IN_LINKS_PER_CLIENT = 20;
const LINK_WINDOW_SECONDS = 15 * 60;

export const SIGN_IN_LINK_SENT = "If that address belongs to an active VisViva account, a sign-in link is on its way. It works once, for 15 minutes.";

export function signInLinkUrl(token: string): string {
  return `${env().APP_URL.replace(/\/$/, "")}/sign-in/link?token=${encodeURIComponent(token)}`;
}

/**
 * Mails a single-use sign-in link when the address has an active account. The answer is
 * the same either way, so the form does not reveal who has an account; requests are
 * limited per address and per client address.
 */
export async function requestSignInLink(
  input: z.infer<typeof signInLinkRequestSchema>,
  meta: { ipAddress?: string | null } = {},
): Promise<{ message: string }> {
  const ipAddress = meta.ipAddress ?? "local";
  await consumeRateLimit(
    `sign-in-link:client:${ipAddress}`,
    SIGN_IN_LINKS_PER_CLIENT,
    LINK_WINDOW_SECONDS,
    "Too many sign-in links were asked for from this network.",
  );
  await consumeRateLimit(
    `sign-in-link:address:${input.email}`,
    SIGN_IN_LINKS_PER_ADDRESS,
    LINK_WINDOW_SECONDS,
    "Too many sign-in links were asked for this address.",
  );
  const [account] = await db()
    .select({ id: users.id, email: users.email, name: users.name })
    .from(users)
    .where(and(sql`lower(${users.email}) = ${input.email}`, eq(users.status, "active")));
  if (!account) {
    await recordAudit({ action: "sign-in-link.requested", actorEmail: input.email, ipAddress, details: { sent: false } });
    return { message: SIGN_IN_LINK_SENT };
  }
  const { token, tokenHash } = newToken();
  await db().transaction(async (tx) => {
    const [row] = await tx
      .insert(accountTokens)
      .values({ purpose: "sign-in-link", email: account.email, tokenHash, expiresAt: new Date(Date.now() + SIGN_IN_LINK_MINUTES * 60_000) })
      .returning({ id: accountTokens.id });
    const mail = await renderMail({
      subject: "Your VisViva sign-in link",
      preview: `Sign in to VisViva; the link works once, for ${SIGN_IN_LINK_MINUTES} minutes.`,
      heading: "Sign in to VisViva",
      paragraphs: [`Hello ${account.name}, use the button below to sign in. The link works once and expires in ${SIGN_IN_LINK_MINUTES} minutes.`],
      action: { label: "Sign in", url: signInLinkUrl(token) },
      footnote:
        "You receive this because someone asked for a sign-in link for this address. If it was not you, ignore this message; your account stays as it is.",
    });
    await enqueueMail({ kind: "sign-in-link", dedupeKey: `sign-in-link:${row!.id}`, to: [account.email], ...mail }, tx);
    await recordAudit({ action: "sign-in-link.requested", actorId: account.id, actorEmail: account.email, ipAddress, details: { sent: true } }, tx);
  });
  return { message: SIGN_IN_LINK_SENT };
}

export const PASSWORD_RESET_MINUTES = 30;

export const PASSWORD_RESET_SENT =
  "If that address belongs to an active VisViva account, a link to choose a new password is on its way. It works once, for 30 minutes.";

export function passwordResetUrl(token: string): string {
  return `${env().APP_URL.replace(/\/$/, "")}/sign-in/reset?token=${encodeURIComponent(token)}`;
}

/**
 * Mails a single-use link to choose a new password, under the same rules as sign-in links:
 * the same answer whether or not the address has an account, limited per address and client.
 */
export async function requestPasswordReset(
  input: z.infer<typeof passwordResetRequestSchema>,
  meta: { ipAddress?: string | null } = {},
): Promise<{ message: string }> {
  const ipAddress = meta.ipAddress ?? "local";
  await consumeRateLimit(
    `password-reset:client:${ipAddress}`,
    SIGN_IN_LINKS_PER_CLIENT,
    LINK_WINDOW_SECONDS,
    "Too many password resets were asked for from this network.",
  );
  await consumeRateLimit(
    `password-reset:address:${input.email}`,
    SIGN_IN_LINKS_PER_ADDRESS,
    LINK_WINDOW_SECONDS,
    "Too many password resets were asked for this address.",
  );
  const [account] = await db()
    .select({ id: users.id, email: users.email, name: users.name })
    .from(users)
    .where(and(sql`lower(${users.email}) = ${input.email}`, eq(users.status, "active")));
  if (!account) {
    await recordAudit({ action: "password-reset.requested", actorEmail: input.email, ipAddress, details: { sent: false } });
    return { message: PASSWORD_RESET_SENT };
  }
  const { token, tokenHash } = newToken();
  await db().transaction(async (tx) => {
    const [row] = await tx
      .insert(accountTokens)
      .values({ purpose: "password-reset", email: account.email, tokenHash, expiresAt: new Date(Date.now() + PASSWORD_RESET_MINUTES * 60_000) })
      .returning({ id: accountTokens.id });
    const mail = await renderMail({
      subject: "Choose a new VisViva password",
      preview: `Choose a new password; the link works once, for ${PASSWORD_RESET_MINUTES} minutes.`,
      heading: "Choose a new password",
      paragraphs: [
        `Hello ${account.name}, use the button below to choose a new password. The link works once and expires in ${PASSWORD_RESET_MINUTES} minutes.`,
        "Choosing a new password signs you out of every browser.",
      ],
      action: { label: "Choose a new password", url: passwordResetUrl(token) },
      footnote:
        "You receive this because someone asked to reset the password of this address. If it was not you, ignore this message; your password stays as it is.",
    });
    await enqueueMail({ kind: "password-reset", dedupeKey: `password-reset:${row!.id}`, to: [account.email], ...mail }, tx);
    await recordAudit({ action: "password-reset.requested", actorId: account.id, actorEmail: account.email, ipAddress, details: { sent: true } }, tx);
  });
  return { message: PASSWORD_RESET_SENT };
}

/** Sets a new password from a reset link (single use) and signs the account out everywhere. */
export async function resetPassword(input: z.infer<typeof passwordResetSchema>, meta: { ipAddress?: string | null } = {}): Promise<{ email: string }> {
  const passwordHash = await hashPassword(input.password);
  return db().transaction(async (tx) => {
    const email = await consumeAccountToken("password-reset", input.token, tx);
    const [account] = email
      ? await tx
          .select({ id: users.id, email: users.email })
          .from(users)
          .where(and(sql`lower(${users.email}) = lower(${email})`, eq(users.status, "active")))
      : [];
    if (!account) throw unprocessable("This reset link is invalid, already used or expired. Ask for a new one on the sign-in page.");
    await tx.update(users).set({ passwordHash, updatedAt: new Date() }).where(eq(users.id, account.id));
    const revoked = await tx
      .update(userSessions)
      .set({ revokedAt: new Date() })
      .where(and(eq(userSessions.userId, account.id), isNull(userSessions.revokedAt)))
      .returning({ id: userSessions.id });
    await recordAudit(
      {
        action: "password.reset",
        actorId: account.id,
        actorEmail: account.email,
        target: `user:${account.id}`,
        details: { revokedSessions: revoked.length },
        ipAddress: meta.ipAddress,
      },
      tx,
    );
    return { email: account.email };
  });
}

export const REGISTRATIONS_PER_CLIENT = 10;

/**
 * Open registration: a new account with the proposer role on a board that allows it. An
 * address that already has an account is told to sign in (and ask the chair), not given a
 * second account.
 */
export async function registerProposer(
  input: z.infer<typeof registerProposerSchema>,
  meta: { ipAddress?: string | null } = {},
): Promise<{ email: string; boardId: string }> {
  const board = await boardOpenForRegistration(input.board);
  if (!board) throw notFound("That board, or its open registration,");
  await consumeRateLimit(`register:client:${meta.ipAddress ?? "local"}`, REGISTRATIONS_PER_CLIENT, 60 * 60, "Too many registrations from this network.");
  const passwordHash = await hashPassword(input.password);
  return db().transaction(async (tx) => {
    const inserted = await tx
      .insert(users)
      .values({ email: input.email, name: input.name, organisation: input.organisation ?? null, passwordHash })
      .onConflictDoNothing()
      .returning({ id: users.id, email: users.email });
    const account = inserted[0];
    if (!account) {
      throw conflict("An account with this e-mail address already exists. Sign in, and ask the board's chair to add you as a proposer.", {
        fieldErrors: { email: ["An account with this address already exists; sign in instead."] },
      });
    }
    await tx.insert(boardMembers).values({ boardId: board.id, userId: account.id, role: "proposer" });
    await recordAudit(
      {
        action: "account.registered",
        actorId: account.id,
        actorEmail: account.email,
        boardId: board.id,
        target: `user:${account.id}`,
        details: { role: "proposer" },
        ipAddress: meta.ipAddress,
      },
      tx,
    );
    return { email: account.email, boardId: board.id };
  });
}
