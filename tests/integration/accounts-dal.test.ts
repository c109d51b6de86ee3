// Boards, members, invitations and account rules, against the real test database through
// the data-access layer the pages, actions and route handlers all call.
import { describe, expect, it } from "vitest";
import { and, eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { auditEvents, boardMembers, boards, invitations, outboxMessages, users } from "@/db/schema";
import { boardRole, createBoard, getBoard, listBoards, updateBoard } from "@/lib/dal/boards";
import { listMembers, updateMember } from "@/lib/dal/members";
import { acceptInvitation, createInvitation, invitationForToken, listInvitations, revokeInvitation } from "@/lib/dal/invitations";
import { changePassword, getMe, registerProposer, requestSignInLink, SIGN_IN_LINK_SENT } from "@/lib/dal/accounts";
import { listAuditLog } from "@/lib/dal/audit";
import { openSession, userForSession } from "@/lib/dal/sessions";
import { verifyPassword } from "@/lib/auth/passwords";
import { memberListQuerySchema, auditQuerySchema } from "@/lib/validation/accounts";
import { AppError } from "@/lib/errors";
import { addMember, asSessionUser, createBoard as makeBoard, createBoardWithCast, createUser, TEST_PASSWORD, unique } from "../support/factories";

async function failure(promise: Promise<unknown>): Promise<AppError> {
  try {
    await promise;
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
  throw new Error("expected the call to be refused");
}

const everyMember = memberListQuerySchema.parse({});

async function auditActions(boardId: string): Promise<string[]> {
  const rows = await db().select({ action: auditEvents.action }).from(auditEvents).where(eq(auditEvents.boardId, boardId));
  return rows.map((r) => r.action);
}

describe("boards", () => {
  it("shows a board to its members with their role, and answers 404 to everyone else", async () => {
    const cast = await createBoardWithCast();
    expect((await getBoard(asSessionUser(cast.reviewer), cast.board.id)).myRole).toBe("reviewer");
    expect((await getBoard(asSessionUser(cast.admin), cast.board.id)).myRole).toBeNull();
    expect((await failure(getBoard(asSessionUser(cast.outsider), cast.board.id))).status).toBe(404);
    expect((await failure(getBoard(asSessionUser(cast.chair), "not-a-uuid"))).status).toBe(404);
    const mine = await listBoards(asSessionUser(cast.proposer));
    expect(mine.map((b) => b.id)).toEqual([cast.board.id]);
    expect(mine[0]!.myRole).toBe("proposer");
    expect((await listBoards(asSessionUser(cast.admin))).map((b) => b.id)).toEqual(expect.arrayContaining([cast.board.id, cast.other.id]));
  });

  it("lets only admins create boards, records it, and refuses a taken short name with 409", async () => {
    const cast = await createBoardWithCast();
    const slug = unique("orbit-board");
    const board = await createBoard(asSessionUser(cast.admin), { name: "Pellucid Cubesat Board", slug });
    expect(board.slug).toBe(slug);
    expect(await auditActions(board.id)).toContain("board.created");
    expect((await failure(createBoard(asSessionUser(cast.admin), { name: "Another", slug }))).status).toBe(409);
    expect((await failure(createBoard(asSessionUser(cast.chair), { name: "Chair's own board" }))).status).toBe(403);
  });

  it("lets chairs change settings, refuses other members with 403 and hides the board from outsiders", async () => {
    const cast = await createBoardWithCast();
    const updated = await updateBoard(asSessionUser(cast.chair), cast.board.id, { openRegistration: true, hideProposerNames: true });
    expect(updated).toMatchObject({ openRegistration: true, hideProposerNames: true });
    expect(await auditActions(cast.board.id)).toContain("board.settings-changed");
    expect((await failure(updateBoard(asSessionUser(cast.reviewer), cast.board.id, { name: "Renamed" }))).status).toBe(403);
    expect((await failure(updateBoard(asSessionUser(cast.outsider), cast.board.id, { name: "Renamed" }))).status).toBe(404);
  });
});

describe("members", () => {
  it("pages, sorts and searches the member list on the server", async () => {
    const cast = await createBoardWithCast();
    for (let i = 0; i < 6; i++) {
      const u = await createUser({ name: `Navigator ${String.fromCharCode(70 - i)} ${unique("n")}` });
      await addMember(cast.board.id, u.id, "reviewer");
    }
    const chair = asSessionUser(cast.chair);
    const first = await listMembers(chair, cast.board.id, memberListQuerySchema.parse({ pageSize: 5, sort: "name" }));
    // Nine members, not counted: the first page of five says more follow, the second that it is the last.
    expect(first.hasMore).toBe(true);
    expect(first.members).toHaveLength(5);
    const second = await listMembers(chair, cast.board.id, memberListQuerySchema.parse({ pageSize: 5, page: 2, sort: "name" }));
    expect(second.members).toHaveLength(4);
    expect(second.hasMore).toBe(false);
    const names = [...first.members, ...second.members].map((m) => m.name.toLowerCase());
    expect(names).toEqual([...names].sort());
    const found = await listMembers(chair, cast.board.id, memberListQuerySchema.parse({ q: "navigator a" }));
    expect(found.members.map((m) => m.name)).toEqual([expect.stringMatching(/^Navigator A /)]);
    const wildcard = await listMembers(chair, cast.board.id, memberListQuerySchema.parse({ q: "%" }));
    expect(wildcard.members).toEqual([]);
    const chairs = await listMembers(chair, cast.board.id, memberListQuerySchema.parse({ role: "chair" }));
    expect(chairs.members.map((m) => m.userId)).toEqual([cast.chair.id]);
  });

  it("refuses the member list to proposers and reviewers (403) and outsiders (404)", async () => {
    const cast = await createBoardWithCast();
    expect((await failure(listMembers(asSessionUser(cast.reviewer), cast.board.id, everyMember))).status).toBe(403);
    expect((await failure(listMembers(asSessionUser(cast.proposer), cast.board.id, everyMember))).status).toBe(403);
    expect((await failure(listMembers(asSessionUser(cast.outsider), cast.board.id, everyMember))).status).toBe(404);
    expect((await listMembers(asSessionUser(cast.admin), cast.board.id, everyMember)).members).toHaveLength(3);
  });

  it("changes a role and deactivates a member, with audit rows; a deactivated member loses the board at once", async () => {
    const cast = await createBoardWithCast();
    const chair = asSessionUser(cast.chair);
    const [reviewerRow] = await db()
      .select({ id: boardMembers.id })
      .from(boardMembers)
      .where(and(eq(boardMembers.boardId, cast.board.id), eq(boardMembers.userId, cast.reviewer.id)));
    const promoted = await updateMember(chair, cast.board.id, reviewerRow!.id, { role: "chair" });
    expect(promoted.role).toBe("chair");
    await updateMember(chair, cast.board.id, reviewerRow!.id, { status: "deactivated" });
    expect(await boardRole(cast.reviewer.id, cast.board.id)).toBeNull();
    expect((await failure(getBoard(asSessionUser(cast.reviewer), cast.board.id))).status).toBe(404);
    expect(await auditActions(cast.board.id)).toEqual(expect.arrayContaining(["member.role-changed", "member.deactivated"]));
    await updateMember(chair, cast.board.id, reviewerRow!.id, { status: "active" });
    expect(await boardRole(cast.reviewer.id, cast.board.id)).toBe("chair");
  });

  it("refuses changing one's own role or status with 409", async () => {
    const cast = await createBoardWithCast();
    const second = await createUser();
    await addMember(cast.board.id, second.id, "chair");
    const [own] = await db()
      .select({ id: boardMembers.id })
      .from(boardMembers)
      .where(and(eq(boardMembers.boardId, cast.board.id), eq(boardMembers.userId, cast.chair.id)));
    const error = await failure(updateMember(asSessionUser(cast.chair), cast.board.id, own!.id, { role: "reviewer" }));
    expect(error.status).toBe(409);
    expect(error.message).toMatch(/your own role/);
    expect((await failure(updateMember(asSessionUser(cast.chair), cast.board.id, own!.id, { status: "deactivated" }))).status).toBe(409);
    expect(await boardRole(cast.chair.id, cast.board.id)).toBe("chair");
  });

  it("refuses demoting or deactivating the last active chair, even for an admin, and allows it once another chair exists", async () => {
    const cast = await createBoardWithCast();
    const admin = asSessionUser(cast.admin);
    const [chairRow] = await db()
      .select({ id: boardMembers.id })
      .from(boardMembers)
      .where(and(eq(boardMembers.boardId, cast.board.id), eq(boardMembers.userId, cast.chair.id)));
    const demote = await failure(updateMember(admin, cast.board.id, chairRow!.id, { role: "reviewer" }));
    expect(demote.status).toBe(409);
    expect(demote.message).toMatch(/last active chair/);
    expect((await failure(updateMember(admin, cast.board.id, chairRow!.id, { status: "deactivated" }))).status).toBe(409);
    const [reviewerRow] = await db()
      .select({ id: boardMembers.id })
      .from(boardMembers)
      .where(and(eq(boardMembers.boardId, cast.board.id), eq(boardMembers.userId, cast.reviewer.id)));
    await updateMember(admin, cast.board.id, reviewerRow!.id, { role: "chair" });
    expect((await updateMember(admin, cast.board.id, chairRow!.id, { role: "reviewer" })).role).toBe("reviewer");
  });

  it("lets only one of two chairs demoting each other at the same time succeed", async () => {
    const board = await makeBoard();
    const a = await createUser();
    const b = await createUser();
    const rowA = await addMember(board.id, a.id, "chair");
    const rowB = await addMember(board.id, b.id, "chair");
    const results = await Promise.allSettled([
      updateMember(asSessionUser(a), board.id, rowB.id, { role: "reviewer" }),
      updateMember(asSessionUser(b), board.id, rowA.id, { role: "reviewer" }),
    ]);
    expect(results.filter((r) => r.status === "fulfilled")).toHaveLength(1);
    const chairs = await db()
      .select({ id: boardMembers.id })
      .from(boardMembers)
      .where(and(eq(boardMembers.boardId, board.id), eq(boardMembers.role, "chair")));
    expect(chairs).toHaveLength(1);
  });

  it("answers 404 for a member id of another board", async () => {
    const cast = await createBoardWithCast();
    const [foreign] = await db().select({ id: boardMembers.id }).from(boardMembers).where(eq(boardMembers.boardId, cast.other.id));
    expect((await failure(updateMember(asSessionUser(cast.chair), cast.board.id, foreign!.id, { role: "reviewer" }))).status).toBe(404);
  });
});

describe("invitations", () => {
  it("queues the invitation mail with the link, and creates the account on first acceptance only", async () => {
    const cast = await createBoardWithCast();
    const email = `${unique("invitee")}@example.org`;
    const invitation = await createInvitation(asSessionUser(cast.chair), cast.board.id, { email, name: "Ilse Varga", role: "reviewer" });
    const [mail] = await db()
      .select()
      .from(outboxMessages)
      .where(eq(outboxMessages.dedupeKey, `invitation:${invitation.id}`));
    expect(mail?.toAddresses).toEqual([email]);
    expect(mail?.text).toContain(`/invitations/${invitation.token}`);
    expect(await invitationForToken(invitation.token)).toMatchObject({ email, role: "reviewer", status: "pending", hasAccount: false });

    const accepted = await acceptInvitation({ token: invitation.token, name: "Ilse Varga", password: "a long enough passphrase" });
    expect(accepted).toMatchObject({ email, boardId: cast.board.id, createdAccount: true });
    const [account] = await db().select().from(users).where(eq(users.email, email));
    expect(await verifyPassword(account!.passwordHash, "a long enough passphrase")).toBe(true);
    expect(await boardRole(account!.id, cast.board.id)).toBe("reviewer");

    const again = await failure(acceptInvitation({ token: invitation.token, name: "Someone Else", password: "another passphrase here" }));
    expect(again.status).toBe(409);
    expect(again.message).toMatch(/already used/);
    expect(await auditActions(cast.board.id)).toEqual(expect.arrayContaining(["invitation.sent", "invitation.accepted"]));
    expect((await invitationForToken(invitation.token))?.status).toBe("accepted");
  });

  it("accepts an invitation only once when submitted twice at the same time", async () => {
    const cast = await createBoardWithCast();
    const email = `${unique("twice")}@example.org`;
    const { token } = await createInvitation(asSessionUser(cast.chair), cast.board.id, { email, role: "proposer" });
    const results = await Promise.allSettled([
      acceptInvitation({ token, name: "First", password: "first passphrase!!" }),
      acceptInvitation({ token, name: "Second", password: "second passphrase!" }),
    ]);
    expect(results.filter((r) => r.status === "fulfilled")).toHaveLength(1);
    const accounts = await db()
      .select({ id: users.id })
      .from(users)
      .where(sql`lower(${users.email}) = ${email}`);
    expect(accounts).toHaveLength(1);
  });

  it("adds the board to an existing account without touching its password", async () => {
    const cast = await createBoardWithCast();
    const existing = await createUser();
    const { token } = await createInvitation(asSessionUser(cast.admin), cast.board.id, { email: existing.email.toUpperCase(), role: "reviewer" });
    expect((await invitationForToken(token))?.hasAccount).toBe(true);
    // Accepting for an existing account needs a session as that account (issue 17).
    expect((await failure(acceptInvitation({ token }))).status).toBe(403);
    const result = await acceptInvitation({ token }, { user: asSessionUser(existing) });
    expect(result.createdAccount).toBe(false);
    expect(await boardRole(existing.id, cast.board.id)).toBe("reviewer");
    const [row] = await db().select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, existing.id));
    expect(await verifyPassword(row!.passwordHash, TEST_PASSWORD)).toBe(true);
  });

  it("refuses an expired invitation, a withdrawn one and an unknown token", async () => {
    const cast = await createBoardWithCast();
    const chair = asSessionUser(cast.chair);
    const expired = await createInvitation(chair, cast.board.id, { email: `${unique("late")}@example.org`, role: "proposer" });
    await db()
      .update(invitations)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(invitations.id, expired.id));
    const late = await failure(acceptInvitation({ token: expired.token, name: "Late", password: "too late passphrase" }));
    expect(late.status).toBe(409);
    expect(late.message).toMatch(/expired/);

    const withdrawn = await createInvitation(chair, cast.board.id, { email: `${unique("gone")}@example.org`, role: "proposer" });
    await revokeInvitation(chair, cast.board.id, withdrawn.id);
    expect((await failure(acceptInvitation({ token: withdrawn.token, name: "Gone", password: "withdrawn passphrase" }))).message).toMatch(/withdrawn/);
    expect((await failure(acceptInvitation({ token: "x".repeat(43), name: "Nobody", password: "unknown passphrase" }))).status).toBe(404);
    const all = await listInvitations(chair, cast.board.id, { show: "all" });
    expect(all.invitations.map((i) => i.status).sort()).toEqual(["expired", "revoked"]);
    expect(all).toMatchObject({ total: 2, pendingTotal: 0 });
    expect((await listInvitations(chair, cast.board.id)).invitations).toEqual([]);
  });

  it("withdraws the older link when the same address is invited again", async () => {
    const cast = await createBoardWithCast();
    const email = `${unique("again")}@example.org`;
    const first = await createInvitation(asSessionUser(cast.chair), cast.board.id, { email, role: "proposer" });
    const second = await createInvitation(asSessionUser(cast.chair), cast.board.id, { email, role: "reviewer" });
    expect((await invitationForToken(first.token))?.status).toBe("revoked");
    await acceptInvitation({ token: second.token, name: "Again", password: "second time lucky" });
  });

  it("needs a name and password to create an account, refuses inviting an active member, and checks the inviter's rights", async () => {
    const cast = await createBoardWithCast();
    const { token } = await createInvitation(asSessionUser(cast.chair), cast.board.id, { email: `${unique("bare")}@example.org`, role: "proposer" });
    expect((await failure(acceptInvitation({ token, name: "No Password" }))).status).toBe(422);
    expect((await invitationForToken(token))?.status).toBe("pending");
    expect((await failure(createInvitation(asSessionUser(cast.chair), cast.board.id, { email: cast.reviewer.email, role: "chair" }))).status).toBe(409);
    expect((await failure(createInvitation(asSessionUser(cast.reviewer), cast.board.id, { email: "x@example.org", role: "chair" }))).status).toBe(403);
    expect((await failure(createInvitation(asSessionUser(cast.outsider), cast.board.id, { email: "x@example.org", role: "chair" }))).status).toBe(404);
  });
});

describe("my account", () => {
  it("lists my boards and roles", async () => {
    const cast = await createBoardWithCast();
    await addMember(cast.other.id, cast.reviewer.id, "proposer");
    const me = await getMe(asSessionUser(cast.reviewer));
    expect(me.boards.map((b) => [b.boardId, b.role]).sort()).toEqual(
      [
        [cast.board.id, "reviewer"],
        [cast.other.id, "proposer"],
      ].sort(),
    );
  });

  it("changes the password only with the current one, and signs out the other browsers", async () => {
    const user = await createUser();
    const here = await openSession(user.id, {});
    const elsewhere = await openSession(user.id, {});
    const me = { ...asSessionUser(user), sessionId: here };
    expect((await failure(changePassword(me, { currentPassword: "not the password", newPassword: "brand new passphrase" }))).status).toBe(422);
    const result = await changePassword(me, { currentPassword: TEST_PASSWORD, newPassword: "brand new passphrase" });
    expect(result.revokedSessions).toBe(1);
    expect(await userForSession(here)).not.toBeNull();
    expect(await userForSession(elsewhere)).toBeNull();
    const [row] = await db().select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, user.id));
    expect(await verifyPassword(row!.passwordHash, "brand new passphrase")).toBe(true);
  });
});

describe("sign-in links", () => {
  it("answers the same for known and unknown addresses, mails only the known one, and limits requests per address", async () => {
    const user = await createUser();
    const ipAddress = `10.9.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`;
    const known = await requestSignInLink({ email: user.email }, { ipAddress });
    const unknownEmail = `${unique("nobody")}@example.org`;
    const unknown = await requestSignInLink({ email: unknownEmail }, { ipAddress });
    expect(known).toEqual(unknown);
    expect(known.message).toBe(SIGN_IN_LINK_SENT);
    const mails = await db()
      .select({ to: outboxMessages.toAddresses, text: outboxMessages.text })
      .from(outboxMessages)
      .where(eq(outboxMessages.kind, "sign-in-link"));
    expect(mails.filter((m) => m.to.includes(user.email))).toHaveLength(1);
    expect(mails.filter((m) => m.to.includes(unknownEmail))).toHaveLength(0);
    expect(mails.find((m) => m.to.includes(user.email))?.text).toMatch(/\/sign-in\/link\?token=/);

    await requestSignInLink({ email: user.email }, { ipAddress });
    await requestSignInLink({ email: user.email }, { ipAddress });
    const limited = await failure(requestSignInLink({ email: user.email }, { ipAddress }));
    expect(limited.status).toBe(429);
    expect(limited.headers?.["Retry-After"]).toMatch(/^\d+$/);
    expect(limited.message).toMatch(/Try again in (under a minute|about (a|\d+) (minute|minutes|hours))\.$/);
  });
});

describe("open registration", () => {
  it("registers a proposer on a board that allows it, once per address, and not on other boards", async () => {
    const open = await makeBoard({ openRegistration: true });
    const closed = await makeBoard();
    const email = `${unique("self")}@example.org`;
    const ipAddress = `10.8.${Math.floor(Math.random() * 250)}.1`;
    const result = await registerProposer({ board: open.slug, email, name: "Tamsin Oyelaran", password: "proposer passphrase" }, { ipAddress });
    const [account] = await db().select({ id: users.id, status: users.status }).from(users).where(eq(users.email, email));
    expect(await boardRole(account!.id, open.id)).toBe("proposer");
    expect(account!.status).toBe("unverified");
    expect(result.boardId).toBe(open.id);
    // A second registration of the address answers the same (no enumeration) and adds no account.
    expect(await registerProposer({ board: open.slug, email, name: "Again", password: "proposer passphrase" }, { ipAddress })).toEqual(result);
    expect(await db().select({ id: users.id }).from(users).where(eq(users.email, email))).toHaveLength(1);
    expect(
      (await failure(registerProposer({ board: closed.slug, email: `${unique("x")}@example.org`, name: "X", password: "proposer passphrase" }, { ipAddress })))
        .status,
    ).toBe(404);
    const [board] = await db().select({ id: boards.id }).from(boards).where(eq(boards.id, open.id));
    expect(board).toBeDefined();
  });
});

describe("audit log", () => {
  it("is for admins only and can be searched", async () => {
    const cast = await createBoardWithCast();
    const email = `${unique("audited")}@example.org`;
    await createInvitation(asSessionUser(cast.chair), cast.board.id, { email, role: "proposer" });
    const found = await listAuditLog(asSessionUser(cast.admin), auditQuerySchema.parse({ action: "invitation.sent", q: cast.chair.email }));
    expect(found.events.some((e) => e.details.email === email)).toBe(true);
    expect((await failure(listAuditLog(asSessionUser(cast.chair), auditQuerySchema.parse({})))).status).toBe(403);
  });
});
