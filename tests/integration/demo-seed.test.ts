import { describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { boardMembers, users } from "@/db/schema";
import { verifyPassword } from "@/lib/auth/passwords";
import { DEMO_ACCOUNTS, seedDemoAccounts } from "@/db/seed/accounts";
import { assertDemoMode } from "@/db/seed/index";

describe("demo accounts seed", () => {
  it("refuses to run outside the demo profile", () => {
    expect(() => assertDemoMode("production")).toThrow(/only runs with VISVIVA_MODE=demo/);
    expect(() => assertDemoMode(undefined)).toThrow(/only runs with VISVIVA_MODE=demo/);
    expect(() => assertDemoMode("demo")).not.toThrow();
  });

  it("creates one account per role on the demo board, idempotently, with the documented passwords", async () => {
    const first = await seedDemoAccounts(db());
    const second = await seedDemoAccounts(db());
    expect(second).toEqual(first);
    for (const account of DEMO_ACCOUNTS) {
      expect(account.password.length).toBeGreaterThanOrEqual(12);
      expect(account.email).toMatch(/@[a-z-]+\.example\.(org|com|net)$/);
      const [row] = await db().select({ passwordHash: users.passwordHash, isAdmin: users.isAdmin }).from(users).where(eq(users.id, first.users[account.key].id));
      expect(row?.isAdmin).toBe(account.isAdmin);
      expect(await verifyPassword(row!.passwordHash, account.password)).toBe(true);
      const [membership] = await db()
        .select({ role: boardMembers.role })
        .from(boardMembers)
        .where(and(eq(boardMembers.boardId, first.boardId), eq(boardMembers.userId, first.users[account.key].id)));
      expect(membership?.role ?? null).toBe(account.role);
    }
  });
});
