// Choosing a new password from an e-mailed link: single use, expiring, signs out everywhere,
// and the same answer for addresses without an account.
import { and, desc, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { accountTokens, outboxMessages, users } from "@/db/schema";
import { PASSWORD_RESET_SENT, requestPasswordReset, resetPassword } from "@/lib/dal/accounts";
import { openSession, userForSession } from "@/lib/dal/sessions";
import { verifyPassword } from "@/lib/auth/passwords";
import { createUser, unique } from "../support/factories";

const NEW_PASSWORD = "a fresh pass phrase for orbit reviews";

async function resetLinkTokenFor(email: string): Promise<string> {
  const [mail] = await db()
    .select({ text: outboxMessages.text })
    .from(outboxMessages)
    .where(and(eq(outboxMessages.kind, "password-reset"), eq(outboxMessages.toAddresses, [email])))
    .orderBy(desc(outboxMessages.createdAt))
    .limit(1);
  const match = mail?.text.match(/\/sign-in\/reset\?token=([A-Za-z0-9_%-]+)/);
  if (!match) throw new Error(`no reset mail for ${email}`);
  return decodeURIComponent(match[1]!);
}

describe("password reset", () => {
  it("mails a link that sets a new password once and signs every browser out", async () => {
    const user = await createUser();
    const ip = unique("203.0.113");
    const session = await openSession(user.id, { ipAddress: ip });
    expect(await requestPasswordReset({ email: user.email }, { ipAddress: ip })).toEqual({ message: PASSWORD_RESET_SENT });
    const token = await resetLinkTokenFor(user.email);

    await expect(resetPassword({ token, password: NEW_PASSWORD, confirmPassword: NEW_PASSWORD })).resolves.toEqual({ email: user.email });
    const [row] = await db().select({ hash: users.passwordHash }).from(users).where(eq(users.id, user.id));
    expect(await verifyPassword(row!.hash, NEW_PASSWORD)).toBe(true);
    expect(await userForSession(session)).toBeNull();

    // The link works once.
    await expect(resetPassword({ token, password: "another pass phrase entirely", confirmPassword: "another pass phrase entirely" })).rejects.toMatchObject({
      status: 422,
      message: expect.stringContaining("invalid, already used or expired"),
    });
  });

  it("refuses an expired link and gives the same answer for an unknown address", async () => {
    const user = await createUser();
    const ip = unique("198.51.100");
    await requestPasswordReset({ email: user.email }, { ipAddress: ip });
    const token = await resetLinkTokenFor(user.email);
    await db()
      .update(accountTokens)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(accountTokens.email, user.email));
    await expect(resetPassword({ token, password: NEW_PASSWORD, confirmPassword: NEW_PASSWORD })).rejects.toMatchObject({ status: 422 });

    const nobody = `${unique("nobody")}@example.org`;
    expect(await requestPasswordReset({ email: nobody }, { ipAddress: ip })).toEqual({ message: PASSWORD_RESET_SENT });
    expect(
      await db()
        .select()
        .from(outboxMessages)
        .where(eq(outboxMessages.toAddresses, [nobody])),
    ).toEqual([]);
  });

  it("limits requests per address", async () => {
    const user = await createUser();
    for (let i = 0; i < 3; i += 1) await requestPasswordReset({ email: user.email }, { ipAddress: unique("192.0.2") });
    await expect(requestPasswordReset({ email: user.email }, { ipAddress: unique("192.0.2") })).rejects.toMatchObject({ status: 429 });
  });
});
