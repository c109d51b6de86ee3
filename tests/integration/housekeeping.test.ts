// The 15-minute housekeeping pass against the real database: what has outlived its use goes,
// what still serves a limit, a session or a link stays.
import crypto from "node:crypto";
import { eq, inArray } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { accountTokens, rateLimitBuckets, signInAttempts, userSessions } from "@/db/schema";
import { openSession } from "@/lib/dal/sessions";
import { housekeeping } from "@/lib/jobs/housekeeping";
import { createUser, unique } from "../support/factories";

const DAY = 86_400_000;
const ago = (ms: number) => new Date(Date.now() - ms);

describe("housekeeping", () => {
  it("prunes old attempts, spent tokens, ended sessions and closed rate windows, and keeps the rest", async () => {
    const user = await createUser();
    const email = `${unique("house")}@example.org`;
    const [oldAttempt, freshAttempt] = await db()
      .insert(signInAttempts)
      .values([
        { email, ipAddress: "192.0.2.40", succeeded: false, attemptedAt: ago(40 * DAY) },
        { email, ipAddress: "192.0.2.40", succeeded: false, attemptedAt: ago(60_000) },
      ])
      .returning({ id: signInAttempts.id });
    const token = (purpose: "sign-in-link" | "password-reset", expiresAt: Date, usedAt: Date | null = null) => ({
      email: user.email,
      purpose,
      tokenHash: crypto.randomBytes(32).toString("hex"),
      expiresAt,
      usedAt,
    });
    const [expiredToken, usedToken, liveToken] = await db()
      .insert(accountTokens)
      .values([
        token("sign-in-link", ago(10 * DAY)),
        token("password-reset", ago(9 * DAY), ago(10 * DAY)),
        token("sign-in-link", new Date(Date.now() + 600_000)),
      ])
      .returning({ id: accountTokens.id });
    const live = await openSession(user.id, {});
    const signedOutLongAgo = await openSession(user.id, {});
    const expiredLongAgo = await openSession(user.id, {});
    await db()
      .update(userSessions)
      .set({ revokedAt: ago(40 * DAY) })
      .where(eq(userSessions.id, signedOutLongAgo));
    await db()
      .update(userSessions)
      .set({ expiresAt: ago(31 * DAY) })
      .where(eq(userSessions.id, expiredLongAgo));
    const oldWindow = `test:${unique("old-window")}`;
    const openWindow = `test:${unique("open-window")}`;
    await db()
      .insert(rateLimitBuckets)
      .values([
        { key: oldWindow, windowStart: ago(2 * DAY), count: 5 },
        { key: openWindow, windowStart: ago(30_000), count: 5 },
      ]);

    const report = await housekeeping();
    expect(report.signInAttempts).toBeGreaterThanOrEqual(1);
    expect(report.accountTokens).toBeGreaterThanOrEqual(2);
    expect(report.sessions).toBeGreaterThanOrEqual(2);
    expect(report.rateLimitWindows).toBeGreaterThanOrEqual(1);

    const ids = async <T extends { id: string }>(rows: Promise<T[]>) => (await rows).map((r) => r.id).sort();
    expect(
      await ids(
        db()
          .select({ id: signInAttempts.id })
          .from(signInAttempts)
          .where(inArray(signInAttempts.id, [oldAttempt!.id, freshAttempt!.id])),
      ),
    ).toEqual([freshAttempt!.id]);
    expect(
      await ids(
        db()
          .select({ id: accountTokens.id })
          .from(accountTokens)
          .where(inArray(accountTokens.id, [expiredToken!.id, usedToken!.id, liveToken!.id])),
      ),
    ).toEqual([liveToken!.id]);
    expect(
      await ids(
        db()
          .select({ id: userSessions.id })
          .from(userSessions)
          .where(inArray(userSessions.id, [live, signedOutLongAgo, expiredLongAgo])),
      ),
    ).toEqual([live]);
    const windows = await db()
      .select({ key: rateLimitBuckets.key })
      .from(rateLimitBuckets)
      .where(inArray(rateLimitBuckets.key, [oldWindow, openWindow]));
    expect(windows.map((w) => w.key)).toEqual([openWindow]);

    // A second pass keeps the live session.
    await housekeeping();
    expect(await ids(db().select({ id: userSessions.id }).from(userSessions).where(eq(userSessions.userId, user.id)))).toEqual([live]);
  });
});
