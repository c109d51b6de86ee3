import "server-only";
import { and, asc, desc, eq, gt, inArray, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { formatDateTime } from "@/lib/format/dates";
import { accountTokens, boardMembers, boards, invitations, users, userSessions } from "@/db/schema";
import { hashPassword, verifyPassword } from "@/lib/auth/passwords";
import { newToken } from "@/lib/auth/tokens";
import { clearSignInFailures, consumeAccountToken, revokeOtherSessions, type SessionUser } from "@/lib/dal/sessions";
import { recordAudit } from "@/lib/dal/audit";
import { consumeRateLimits } from "@/lib/dal/rate-limits";
import { boardOpenForRegistration } from "@/lib/dal/boards";
import { invitationUrl } from "@/lib/dal/invitations";
import { env } from "@/lib/env";
import { notFound, unauthenticated, unprocessable } from "@/lib/errors";
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
  await consumeRateLimits([
    {
      key: `sign-in-link:client:${ipAddress}`,
      max: SIGN_IN_LINKS_PER_CLIENT,
      windowSeconds: LINK_WINDOW_SECONDS,
      message: "Too many sign-in links were asked for from this network.",
    },
    {
      key: `sign-in-link:address:${input.email}`,
      max: SIGN_IN_LINKS_PER_ADDRESS,
      windowSeconds: LINK_WINDOW_SECONDS,
      message: "Too many sign-in links were asked for this address.",
    },
  ]);
  const [account] = await db()
    .select({ id: users.id, email: users.email, name: users.name })
    .from(users)
    .where(and(sql`lower(${users.email}) = ${input.email}`, inArray(users.status, ["active", "unverified"])));
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
  await consumeRateLimits([
    {
      key: `password-reset:client:${ipAddress}`,
      max: SIGN_IN_LINKS_PER_CLIENT,
      windowSeconds: LINK_WINDOW_SECONDS,
      message: "Too many password resets were asked for from this network.",
    },
    {
      key: `password-reset:address:${input.email}`,
      max: SIGN_IN_LINKS_PER_ADDRESS,
      windowSeconds: LINK_WINDOW_SECONDS,
      message: "Too many password resets were asked for this address.",
    },
  ]);
  const [account] = await db()
    .select({ id: users.id, email: users.email, name: users.name })
    .from(users)
    .where(and(sql`lower(${users.email}) = ${input.email}`, inArray(users.status, ["active", "unverified"])));
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
          .where(and(sql`lower(${users.email}) = lower(${email})`, inArray(users.status, ["active", "unverified"])))
      : [];
    if (!account) throw unprocessable("This reset link is invalid, already used or expired. Ask for a new one on the sign-in page.");
    // The mailed link proves the address, so an unverified account becomes active here too.
    await tx.update(users).set({ passwordHash, status: "active", updatedAt: new Date() }).where(eq(users.id, account.id));
    // The owner proved the address: earlier failed sign-ins (anyone's) no longer hold it back.
    await clearSignInFailures(account.email, tx);
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
export const REGISTRATIONS_PER_ADDRESS = 3;
/** Links that confirm a newly registered address stay valid this long. */
export const VERIFY_LINK_HOURS = 24;

/** The one answer to a registration, whatever the address already is (no enumeration). */
export const REGISTRATION_SENT =
  "Thank you. We sent a message to that address with the next step: open the link in it to confirm the address, then you can sign in.";

/**
 * Open registration on a board that allows it. The answer is the same whoever owns the
 * address, and every case sends one mail to it:
 * - a new address gets an unverified account with the proposer role and a link that confirms
 *   the address (and signs in); the account cannot sign in with its password before that;
 * - an address with a pending invitation gets that invitation again (fresh link) instead of
 *   an account, so nobody can create the account an invitation is meant for;
 * - an address that already has an account gets a note saying so (sign in, or reset).
 */
export async function registerProposer(
  input: z.infer<typeof registerProposerSchema>,
  meta: { ipAddress?: string | null } = {},
): Promise<{ message: string; email: string; boardId: string }> {
  const board = await boardOpenForRegistration(input.board);
  if (!board) throw notFound("That board, or its open registration,");
  const ipAddress = meta.ipAddress ?? "local";
  await consumeRateLimits([
    { key: `register:client:${ipAddress}`, max: REGISTRATIONS_PER_CLIENT, windowSeconds: 60 * 60, message: "Too many registrations from this network." },
    { key: `register:address:${input.email}`, max: REGISTRATIONS_PER_ADDRESS, windowSeconds: 60 * 60, message: "Too many registrations for this address." },
  ]);
  // Hash first in every case, so the answer takes as long whether or not the address is known.
  const passwordHash = await hashPassword(input.password);
  const answer = { message: REGISTRATION_SENT, email: input.email, boardId: board.id };
  await db().transaction(async (tx) => {
    const [invitation] = await tx
      .select({ id: invitations.id, boardId: invitations.boardId, boardName: boards.name, role: invitations.role, expiresAt: invitations.expiresAt })
      .from(invitations)
      .innerJoin(boards, eq(boards.id, invitations.boardId))
      .where(
        and(
          sql`lower(${invitations.email}) = ${input.email}`,
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
          gt(invitations.expiresAt, sql`now()`),
        ),
      )
      .orderBy(desc(invitations.createdAt))
      .limit(1);
    const [existing] = await tx
      .select({ id: users.id, name: users.name })
      .from(users)
      .where(sql`lower(${users.email}) = ${input.email}`);

    if (invitation && !existing) {
      // Send the invitation again with a fresh link (only the hash of the old one is kept).
      const { token, tokenHash } = newToken();
      await tx.update(invitations).set({ tokenHash }).where(eq(invitations.id, invitation.id));
      const mail = await renderMail({
        subject: `Your invitation to the ${invitation.boardName}`,
        preview: "You have an invitation waiting; accept it instead of registering.",
        heading: `Your invitation to the ${invitation.boardName}`,
        paragraphs: [
          `Someone registered this address on VisViva. You already have an invitation to the ${invitation.boardName} as ${invitation.role}: accept it with the button below, which creates your account.`,
          `This link replaces the one in the earlier invitation mail and expires on ${formatDateTime(invitation.expiresAt)}.`,
        ],
        action: { label: "Accept the invitation", url: invitationUrl(token) },
        footnote: "If you did not register, ignore this message; no account was created.",
      });
      await enqueueMail({ kind: "invitation", dedupeKey: `invitation-resent:${invitation.id}:${tokenHash.slice(0, 16)}`, to: [input.email], ...mail }, tx);
      await recordAudit(
        { action: "account.register-invited", actorEmail: input.email, boardId: board.id, target: `invitation:${invitation.id}`, ipAddress },
        tx,
      );
      return;
    }
    if (existing) {
      const mail = await renderMail({
        subject: "You already have a VisViva account",
        preview: "Someone tried to register this address again.",
        heading: "You already have an account",
        paragraphs: [
          `Hello ${existing.name}, someone tried to register this address for the ${board.name}. You already have a VisViva account with it, so nothing was changed.`,
          "Sign in as usual. If you forgot your password, choose a new one from the sign-in page; to join the board as a proposer, ask its chair.",
        ],
        action: { label: "Sign in", url: `${env().APP_URL.replace(/\/$/, "")}/sign-in` },
        footnote: "If it was not you, ignore this message; your account stays as it is.",
      });
      await enqueueMail({ kind: "registration", dedupeKey: `registration-existing:${existing.id}:${Date.now()}`, to: [input.email], ...mail }, tx);
      await recordAudit({ action: "account.register-existing", actorEmail: input.email, boardId: board.id, target: `user:${existing.id}`, ipAddress }, tx);
      return;
    }
    const [account] = await tx
      .insert(users)
      .values({ email: input.email, name: input.name, organisation: input.organisation ?? null, passwordHash, status: "unverified" })
      .returning({ id: users.id, email: users.email });
    await tx.insert(boardMembers).values({ boardId: board.id, userId: account!.id, role: "proposer" });
    const { token, tokenHash } = newToken();
    await tx
      .insert(accountTokens)
      .values({ purpose: "sign-in-link", email: account!.email, tokenHash, expiresAt: new Date(Date.now() + VERIFY_LINK_HOURS * 3600_000) });
    const mail = await renderMail({
      subject: "Confirm your VisViva address",
      preview: `Confirm this address to finish registering for the ${board.name}.`,
      heading: "Confirm your address",
      paragraphs: [
        `Hello ${input.name}, you registered as a proposer for the ${board.name}. Use the button below to confirm this address; it also signs you in. The link works once, for ${VERIFY_LINK_HOURS} hours.`,
        "Until the address is confirmed, the account cannot sign in with its password.",
      ],
      action: { label: "Confirm and sign in", url: signInLinkUrl(token) },
      footnote: "If you did not register, ignore this message; the account stays unconfirmed and unusable.",
    });
    await enqueueMail({ kind: "registration", dedupeKey: `registration:${account!.id}`, to: [account!.email], ...mail }, tx);
    await recordAudit(
      {
        action: "account.registered",
        actorId: account!.id,
        actorEmail: account!.email,
        boardId: board.id,
        target: `user:${account!.id}`,
        details: { role: "proposer", verified: false },
        ipAddress,
      },
      tx,
    );
  });
  return answer;
}
