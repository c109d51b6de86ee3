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

/**
 * The address of an unverified account was proven (a mailed link was used): it becomes an
 * ordinary active account. Returns whether it was unverified.
 */
export async function markAddressVerified(userId: string): Promise<boolean> {
  const rows = await db()
    .update(users)
    .set({ status: "active", updatedAt: new Date() })
    .where(and(eq(users.id, userId), eq(users.status, "unverified")))
    .returning({ id: users.id });
  return rows.length > 0;
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

// Limits on failed sign-ins, over sliding windows. Nobody can lock anyone out:
// - per address AND client: 5 failures in 15 minutes stop that client for that address;
// - per client: 20 failures in 15 minutes stop that client for every address;
// - per address, from all clients: from 10 failures in an hour a slower back-off starts
//   (30 s after the latest failure, doubling with each further failure, at most 15 minutes).
//   It holds back clients that already failed for the address; a client that has not
//   failed for it (the owner on another network) is still let through to check its password.
// A completed password reset clears the address's failures (clearSignInFailures).
export const SIGN_IN_WINDOW_SECONDS = 15 * 60;
export const MAX_FAILURES_PER_ACCOUNT_AND_CLIENT = 5;
export const MAX_FAILURES_PER_ADDRESS = 20;
export const GLOBAL_BACKOFF_WINDOW_SECONDS = 60 * 60;
export const GLOBAL_BACKOFF_AFTER_FAILURES = 10;
const GLOBAL_BACKOFF_BASE_SECONDS = 30;

/** The back-off (seconds) that `failures` failures for one address in the last hour call for. */
export function globalBackoffSeconds(failures: number): number {
  if (failures < GLOBAL_BACKOFF_AFTER_FAILURES) return 0;
  const steps = Math.min(failures - GLOBAL_BACKOFF_AFTER_FAILURES, 10);
  return Math.min(SIGN_IN_WINDOW_SECONDS, GLOBAL_BACKOFF_BASE_SECONDS * 2 ** steps);
}

/** Seconds until another attempt is allowed for this address from this client, or 0 now. */
export async function signInRetryAfter(email: string, ipAddress: string): Promise<number> {
  const address = email.toLowerCase();
  const now = Date.now();
  const since = new Date(now - SIGN_IN_WINDOW_SECONDS * 1000);
  const failures = (where: ReturnType<typeof and>, from: Date, limit: number) =>
    db()
      .select({ at: signInAttempts.attemptedAt })
      .from(signInAttempts)
      .where(and(where, eq(signInAttempts.succeeded, false), gt(signInAttempts.attemptedAt, from)))
      .orderBy(sql`${signInAttempts.attemptedAt} desc`)
      .limit(limit);
  const windowed = (rows: { at: Date }[], max: number) => {
    if (rows.length < max) return 0;
    const oldest = rows[rows.length - 1]!.at.getTime();
    return Math.max(1, Math.ceil((oldest + SIGN_IN_WINDOW_SECONDS * 1000 - now) / 1000));
  };
  const [pair, client, global] = await Promise.all([
    failures(and(eq(signInAttempts.email, address), eq(signInAttempts.ipAddress, ipAddress)), since, MAX_FAILURES_PER_ACCOUNT_AND_CLIENT),
    failures(eq(signInAttempts.ipAddress, ipAddress), since, MAX_FAILURES_PER_ADDRESS),
    failures(eq(signInAttempts.email, address), new Date(now - GLOBAL_BACKOFF_WINDOW_SECONDS * 1000), 200),
  ]);
  let backoff = 0;
  if (pair.length > 0) {
    const wait = globalBackoffSeconds(global.length);
    const latest = global[0]?.at.getTime() ?? 0;
    if (wait > 0) backoff = Math.max(0, Math.ceil((latest + wait * 1000 - now) / 1000));
  }
  return Math.max(windowed(pair, MAX_FAILURES_PER_ACCOUNT_AND_CLIENT), windowed(client, MAX_FAILURES_PER_ADDRESS), backoff);
}

/** Forgets the failed sign-ins of an address (after its owner proved it with a reset link). */
export async function clearSignInFailures(email: string, tx: Database | Transaction = db()): Promise<void> {
  await tx.delete(signInAttempts).where(and(eq(signInAttempts.email, email.toLowerCase()), eq(signInAttempts.succeeded, false)));
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
