import "server-only";
import { and, eq, gt, isNull, lt, or, sql } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { accountTokens, signInAttempts, users, userSessions } from "@/db/schema";
import { hashToken } from "@/lib/auth/tokens";

export const SESSION_DAYS = 30;

export interface SessionUser {
  id: string;
  email: string;
  name: string;
  isAdmin: boolean;
  sessionId: string;
}

export async function findUserForSignIn(email: string) {
  const [user] = await db()
    .select({ id: users.id, email: users.email, name: users.name, passwordHash: users.passwordHash, status: users.status, isAdmin: users.isAdmin })
    .from(users)
    .where(sql`lower(${users.email}) = lower(${email})`)
    .limit(1);
  return user ?? null;
}

export async function openSession(userId: string, meta: { userAgent?: string | null; ipAddress?: string | null }): Promise<string> {
  const [row] = await db()
    .insert(userSessions)
    .values({
      userId,
      expiresAt: new Date(Date.now() + SESSION_DAYS * 86_400_000),
      userAgent: meta.userAgent?.slice(0, 300) ?? null,
      ipAddress: meta.ipAddress ?? null,
    })
    .returning({ id: userSessions.id });
  if (!row) throw new Error("session insert returned nothing");
  return row.id;
}

/** The user behind a session id, or null when the session was revoked, expired or the user deactivated. */
export async function userForSession(sessionId: string): Promise<SessionUser | null> {
  const [row] = await db()
    .select({ id: users.id, email: users.email, name: users.name, isAdmin: users.isAdmin, sessionId: userSessions.id })
    .from(userSessions)
    .innerJoin(users, eq(users.id, userSessions.userId))
    .where(and(eq(userSessions.id, sessionId), isNull(userSessions.revokedAt), gt(userSessions.expiresAt, new Date()), eq(users.status, "active")))
    .limit(1);
  return row ?? null;
}

export async function revokeSession(sessionId: string): Promise<void> {
  await db().update(userSessions).set({ revokedAt: new Date() }).where(eq(userSessions.id, sessionId));
}

/** Signs the user out everywhere except the current browser. */
export async function revokeOtherSessions(userId: string, keepSessionId: string): Promise<number> {
  const revoked = await db()
    .update(userSessions)
    .set({ revokedAt: new Date() })
    .where(and(eq(userSessions.userId, userId), isNull(userSessions.revokedAt), sql`${userSessions.id} <> ${keepSessionId}`))
    .returning({ id: userSessions.id });
  return revoked.length;
}

// Limits on failed sign-ins, per account and per address, over a sliding window.
export const SIGN_IN_WINDOW_SECONDS = 15 * 60;
export const MAX_FAILURES_PER_ACCOUNT = 5;
export const MAX_FAILURES_PER_ADDRESS = 20;

/** Seconds until another attempt is allowed, or 0 when one is allowed now. */
export async function signInRetryAfter(email: string, ipAddress: string): Promise<number> {
  const since = new Date(Date.now() - SIGN_IN_WINDOW_SECONDS * 1000);
  const windowed = async (column: typeof signInAttempts.email | typeof signInAttempts.ipAddress, value: string, max: number) => {
    const rows = await db()
      .select({ at: signInAttempts.attemptedAt })
      .from(signInAttempts)
      .where(and(eq(column, value), eq(signInAttempts.succeeded, false), gt(signInAttempts.attemptedAt, since)))
      .orderBy(sql`${signInAttempts.attemptedAt} desc`)
      .limit(max);
    if (rows.length < max) return 0;
    const oldest = rows[rows.length - 1]!.at.getTime();
    return Math.max(1, Math.ceil((oldest + SIGN_IN_WINDOW_SECONDS * 1000 - Date.now()) / 1000));
  };
  const [byAccount, byAddress] = await Promise.all([
    windowed(signInAttempts.email, email.toLowerCase(), MAX_FAILURES_PER_ACCOUNT),
    windowed(signInAttempts.ipAddress, ipAddress, MAX_FAILURES_PER_ADDRESS),
  ]);
  return Math.max(byAccount, byAddress);
}

export async function recordSignInAttempt(email: string, ipAddress: string, succeeded: boolean): Promise<void> {
  await db().insert(signInAttempts).values({ email: email.toLowerCase(), ipAddress, succeeded });
}

/** Uses a single-use account token; returns its e-mail, or null when unknown, used or expired. */
export async function consumeAccountToken(
  purpose: "sign-in-link" | "password-reset",
  token: string,
  tx: Database | Transaction = db(),
): Promise<string | null> {
  const [row] = await tx
    .update(accountTokens)
    .set({ usedAt: new Date() })
    .where(
      and(
        eq(accountTokens.tokenHash, hashToken(token)),
        eq(accountTokens.purpose, purpose),
        isNull(accountTokens.usedAt),
        gt(accountTokens.expiresAt, new Date()),
      ),
    )
    .returning({ email: accountTokens.email });
  return row?.email ?? null;
}

// ---------- housekeeping (run by lib/jobs/housekeeping.ts) ----------

const DAY_MS = 86_400_000;

/**
 * Deletes what no longer serves anyone: failed and successful sign-in attempts older than 30
 * days (the limits look back 15 minutes; the audit log keeps sign-ins for good), sign-in link
 * and reset tokens used or expired more than a week ago, and sessions that ended (expired or
 * signed out) more than 30 days ago.
 */
export async function pruneAccountRecords(now = new Date()): Promise<{ signInAttempts: number; accountTokens: number; sessions: number }> {
  const monthAgo = new Date(now.getTime() - 30 * DAY_MS);
  const weekAgo = new Date(now.getTime() - 7 * DAY_MS);
  const attempts = await db().delete(signInAttempts).where(lt(signInAttempts.attemptedAt, monthAgo));
  const tokens = await db()
    .delete(accountTokens)
    .where(or(lt(accountTokens.expiresAt, weekAgo), lt(accountTokens.usedAt, weekAgo)));
  const sessions = await db()
    .delete(userSessions)
    .where(or(lt(userSessions.expiresAt, monthAgo), lt(userSessions.revokedAt, monthAgo)));
  return { signInAttempts: attempts.rowCount ?? 0, accountTokens: tokens.rowCount ?? 0, sessions: sessions.rowCount ?? 0 };
}
