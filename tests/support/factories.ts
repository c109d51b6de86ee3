// Test data made straight in the test database. Every call makes fresh rows with a unique
// suffix, so tests never depend on each other or on cleanup.
import crypto from "node:crypto";
import { db } from "@/db/client";
import { boardMembers, boards, users, type BoardRole } from "@/db/schema";
import { hashPassword } from "@/lib/auth/passwords";
import type { SessionUser } from "@/lib/auth/session";

export const TEST_PASSWORD = "correct horse battery staple";

export function unique(prefix: string): string {
  return `${prefix}-${crypto.randomBytes(4).toString("hex")}`;
}

let cachedHash: string | undefined;

export async function createUser(options: { name?: string; email?: string; isAdmin?: boolean; organisation?: string; status?: "active" | "deactivated" } = {}) {
  cachedHash ??= await hashPassword(TEST_PASSWORD);
  const handle = unique("user");
  const [user] = await db()
    .insert(users)
    .values({
      email: options.email ?? `${handle}@test.example.org`,
      name: options.name ?? `Tester ${handle}`,
      organisation: options.organisation ?? null,
      passwordHash: cachedHash,
      isAdmin: options.isAdmin ?? false,
      status: options.status ?? "active",
    })
    .returning();
  return user!;
}

export async function createBoard(options: { name?: string; openRegistration?: boolean } = {}) {
  const slug = unique("board");
  const [board] = await db()
    .insert(boards)
    .values({ slug, name: options.name ?? `Board ${slug}`, openRegistration: options.openRegistration ?? false })
    .returning();
  return board!;
}

export async function addMember(boardId: string, userId: string, role: BoardRole) {
  const [member] = await db().insert(boardMembers).values({ boardId, userId, role }).returning();
  return member!;
}

/** A board with one active member of each role, an admin, and an outsider on another board. */
export async function createBoardWithCast() {
  const board = await createBoard();
  const other = await createBoard();
  const chair = await createUser({ name: "Chair" });
  const reviewer = await createUser({ name: "Reviewer" });
  const proposer = await createUser({ name: "Proposer" });
  const admin = await createUser({ name: "Admin", isAdmin: true });
  const outsider = await createUser({ name: "Outsider" });
  await addMember(board.id, chair.id, "chair");
  await addMember(board.id, reviewer.id, "reviewer");
  await addMember(board.id, proposer.id, "proposer");
  await addMember(other.id, outsider.id, "chair");
  return { board, other, chair, reviewer, proposer, admin, outsider };
}

/** The SessionUser shape the data-access layer takes, for calling it directly in tests. */
export function asSessionUser(user: { id: string; email: string; name: string; isAdmin: boolean }): SessionUser {
  return { id: user.id, email: user.email, name: user.name, isAdmin: user.isAdmin, sessionId: crypto.randomUUID() };
}
