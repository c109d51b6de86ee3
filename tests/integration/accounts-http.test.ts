// Sign-in flows and the accounts API over HTTP against the built app, with next-auth's real
// credentials flow, the real database and the mail catcher.
import crypto from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { auditEvents, boardMembers, boards as boardsTable, users } from "@/db/schema";
import { requestSignInLink } from "@/lib/dal/accounts";
import { createInvitation } from "@/lib/dal/invitations";
import { appUrl } from "../support/app";
import { asSessionUser, createBoardWithCast, createUser, TEST_PASSWORD, unique } from "../support/factories";
import { HttpClient, signedIn } from "../support/http";
import { linkIn, waitForMail } from "../support/mail";

/** A made-up client address per test, so failed attempts here never throttle other tests' sign-ins. */
const clientAddress = () => ({ "x-forwarded-for": `10.${crypto.randomInt(1, 255)}.${crypto.randomInt(0, 255)}.${crypto.randomInt(1, 255)}` });

describe("sign-in over HTTP", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("signs in with the password and records the sign-in; a wrong password is refused and recorded", async () => {
    const user = await createUser();
    const client = new HttpClient();
    expect(await client.signIn("password", { email: user.email, password: "not the password at all" }, clientAddress())).toBe(
      "That e-mail and password do not match an active account.",
    );
    expect((await client.get("/api/v1/me")).status).toBe(401);
    expect(await client.signIn("password", { email: user.email.toUpperCase(), password: TEST_PASSWORD }, clientAddress())).toBeNull();
    const me = await client.get("/api/v1/me");
    expect(me.status).toBe(200);
    expect((await me.json()).email).toBe(user.email);
    const actions = await db().select({ action: auditEvents.action }).from(auditEvents).where(eq(auditEvents.actorEmail, user.email));
    expect(actions.map((a) => a.action)).toEqual(expect.arrayContaining(["sign-in.failed", "sign-in"]));
  });

  it("refuses the sixth attempt from the same client after five failures with a retry-after, even with the right password", async () => {
    const user = await createUser();
    const client = new HttpClient();
    const sameClient = clientAddress();
    for (let i = 0; i < 5; i++) {
      expect(await client.signIn("password", { email: user.email, password: `wrong guess number ${i}` }, sameClient)).toMatch(/do not match/);
    }
    const refused = await client.signIn("password", { email: user.email, password: TEST_PASSWORD }, sameClient);
    // In words, not seconds: the lockout lasts 15 minutes from the first failure.
    expect(refused).toMatch(/^Too many failed sign-in attempts\. Try again in about 1[45] minutes\.$/);
    expect((await client.get("/api/v1/me")).status).toBe(401);
  });

  it("shows the rate-limit message on the sign-in page when next-auth sends it back", async () => {
    const message = "Too many failed sign-in attempts. Try again in about 15 minutes.";
    const page = await (await new HttpClient().get(`/sign-in?error=${encodeURIComponent(message)}`)).text();
    expect(page).toContain("Try again in about 15 minutes.");
    const crafted = await (await new HttpClient().get(`/sign-in?error=${encodeURIComponent("Call +1 555 0100 to unlock your account")}`)).text();
    expect(crafted).not.toContain("555 0100");
  });

  it("cuts off a deactivated user on the next request, and a deactivated membership hides the board", async () => {
    const cast = await createBoardWithCast();
    const reviewer = await signedIn(cast.reviewer.email);
    expect((await reviewer.get(`/api/v1/boards/${cast.board.id}`)).status).toBe(200);
    await db()
      .update(boardMembers)
      .set({ status: "deactivated" })
      .where(and(eq(boardMembers.boardId, cast.board.id), eq(boardMembers.userId, cast.reviewer.id)));
    expect((await reviewer.get(`/api/v1/boards/${cast.board.id}`)).status).toBe(404);
    expect((await reviewer.get("/api/v1/me")).status).toBe(200);

    const proposer = await signedIn(cast.proposer.email);
    expect((await proposer.get("/api/v1/me")).status).toBe(200);
    await db().update(users).set({ status: "deactivated" }).where(eq(users.id, cast.proposer.id));
    const after = await proposer.get("/api/v1/me");
    expect(after.status).toBe(401);
    expect((await after.json()).error).toMatch(/Sign in/);
    expect(await new HttpClient().signIn("password", { email: cast.proposer.email, password: TEST_PASSWORD }, clientAddress())).toMatch(/do not match/);
  });

  it("signs in with an e-mail link read back from the mail catcher, once only", async () => {
    const user = await createUser({ email: `${unique("link")}@example.org` });
    await requestSignInLink({ email: user.email }, { ipAddress: clientAddress()["x-forwarded-for"] });
    const mail = await waitForMail(user.email, /sign-in link/);
    const url = new URL(linkIn(mail, "/sign-in/link"));
    const token = url.searchParams.get("token")!;
    // Opening the link (what a mail scanner does) does not spend it.
    const landing = await new HttpClient().get(`${url.pathname}${url.search}`);
    expect(landing.status).toBe(200);
    expect(await landing.text()).toContain("Sign in to VisViva");

    const client = new HttpClient();
    expect(await client.signIn("link", { token })).toBeNull();
    expect((await (await client.get("/api/v1/me")).json()).email).toBe(user.email);
    expect(await new HttpClient().signIn("link", { token })).toMatch(/invalid, already used or expired/);
  });

  it("accepts an invitation from the e-mail once, then signs in with the new password", async () => {
    const cast = await createBoardWithCast();
    const email = `${unique("invited")}@example.org`;
    await createInvitation(asSessionUser(cast.chair), cast.board.id, { email, name: "Runa Kettil", role: "reviewer" });
    const mail = await waitForMail(email, /Invitation to/);
    const link = new URL(linkIn(mail, "/invitations/"));
    const page = await new HttpClient().get(link.pathname);
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain(cast.board.name);
    expect(html).toContain("Choose a password");
    // Acceptance itself is a server action; its data function is covered in accounts-dal.test.ts.
    const { acceptInvitation } = await import("@/lib/dal/invitations");
    const token = decodeURIComponent(link.pathname.split("/").pop()!);
    await acceptInvitation({ token, name: "Runa Kettil", password: "runa's own passphrase" });
    await expect(acceptInvitation({ token, name: "Runa Kettil", password: "runa's own passphrase" })).rejects.toThrow(/already used/);
    expect(await (await new HttpClient().get(link.pathname)).text()).toContain("can no longer be used");
    const client = await new HttpClient().signInAs(email, "runa's own passphrase");
    const board = await client.get(`/api/v1/boards/${cast.board.id}`);
    expect((await board.json()).myRole).toBe("reviewer");
  });

  it("signs out the other sessions and keeps this one", async () => {
    const user = await createUser();
    const here = await signedIn(user.email);
    const elsewhere = await signedIn(user.email);
    expect((await (await here.get("/api/v1/me")).json()).otherActiveSessions).toBeGreaterThanOrEqual(1);
    const revoked = await here.post("/api/v1/me/sessions/revoke-others");
    expect(revoked.status).toBe(200);
    expect((await revoked.json()).revoked).toBeGreaterThanOrEqual(1);
    expect((await here.get("/api/v1/me")).status).toBe(200);
    expect((await elsewhere.get("/api/v1/me")).status).toBe(401);
  });

  it("changes the password through the API only with the current one", async () => {
    const user = await createUser();
    const client = await signedIn(user.email);
    const wrong = await client.post("/api/v1/me/password", { currentPassword: "a wrong current one", newPassword: "completely new passphrase" });
    expect(wrong.status).toBe(422);
    expect((await wrong.json()).error).toMatch(/current password/);
    const short = await client.post("/api/v1/me/password", { currentPassword: TEST_PASSWORD, newPassword: "short" });
    expect(short.status).toBe(422);
    expect((await short.json()).error).toMatch(/at least 12 characters/);
    expect((await client.post("/api/v1/me/password", { currentPassword: TEST_PASSWORD, newPassword: "completely new passphrase" })).status).toBe(200);
    expect(await new HttpClient().signIn("password", { email: user.email, password: "completely new passphrase" }, clientAddress())).toBeNull();
  });
});

describe("the accounts API's answers to bad input", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("answers 400/409/422 with a JSON message, never a 500", async () => {
    const cast = await createBoardWithCast();
    const chair = await signedIn(cast.chair.email);
    const board = `/api/v1/boards/${cast.board.id}`;
    const notJson = await chair.request(`${board}/invitations`, { method: "POST", headers: { "content-type": "application/json" }, body: "{not json" });
    expect(notJson.status).toBe(400);
    const badEmail = await chair.post(`${board}/invitations`, { email: "not an address", role: "reviewer" });
    expect(badEmail.status).toBe(422);
    expect((await badEmail.json()).error).toMatch(/valid e-mail/);
    const badRole = await chair.post(`${board}/invitations`, { email: "someone@example.org", role: "overlord" });
    expect(badRole.status).toBe(422);
    expect((await chair.get(`${board}/members?pageSize=100000`)).status).toBe(400);
    expect((await chair.get(`${board}/members?sort=password`)).status).toBe(400);
    expect((await chair.get("/api/v1/boards/not-a-uuid")).status).toBe(404);
    expect((await chair.request(`${board}/members/not-a-uuid`, { method: "PATCH", json: { role: "chair" } })).status).toBe(404);
    expect((await chair.request(board, { method: "PATCH", json: { openRegistration: "yes please" } })).status).toBe(422);
    expect((await chair.request(board, { method: "PATCH", json: { unknownSetting: true } })).status).toBe(422);

    const [own] = await db()
      .select({ id: boardMembers.id })
      .from(boardMembers)
      .where(and(eq(boardMembers.boardId, cast.board.id), eq(boardMembers.userId, cast.chair.id)));
    const self = await chair.request(`${board}/members/${own!.id}`, { method: "PATCH", json: { role: "reviewer" } });
    expect(self.status).toBe(409);
    expect((await self.json()).error).toMatch(/your own role/);
    const admin = await signedIn(cast.admin.email);
    const last = await admin.request(`${board}/members/${own!.id}`, { method: "PATCH", json: { status: "deactivated" } });
    expect(last.status).toBe(409);
    expect((await last.json()).error).toMatch(/last active chair/);
  });

  it("pages and searches members from the URL's query", async () => {
    const cast = await createBoardWithCast();
    const chair = await signedIn(cast.chair.email);
    const page = await (await chair.get(`/api/v1/boards/${cast.board.id}/members?q=${encodeURIComponent(cast.reviewer.email)}&pageSize=5`)).json();
    expect(page).toMatchObject({ hasMore: false, page: 1, pageSize: 5 });
    expect(page.members).toHaveLength(1);
    expect(page.members[0]).toMatchObject({ userId: cast.reviewer.id, role: "reviewer", status: "active" });
    const invite = await chair.post(`/api/v1/boards/${cast.board.id}/invitations`, { email: `${unique("api")}@example.org`, role: "proposer" });
    expect(invite.status).toBe(201);
    expect(await invite.json()).not.toHaveProperty("token");
  });

  it("lists invitations newest first in pages, pending only unless asked for all", async () => {
    const cast = await createBoardWithCast();
    const chair = await signedIn(cast.chair.email);
    const base = `/api/v1/boards/${cast.board.id}/invitations`;
    const emails: string[] = [];
    for (let i = 0; i < 7; i++) {
      const email = `${unique(`page${i}`)}@example.org`;
      emails.push(email);
      expect((await chair.post(base, { email, role: "reviewer" })).status).toBe(201);
    }
    const withdrawn = await createInvitation(asSessionUser(cast.chair), cast.board.id, { email: `${unique("gone")}@example.org`, role: "proposer" });
    expect((await chair.request(`${base}/${withdrawn.id}`, { method: "DELETE" })).status).toBe(200);

    const first = await (await chair.get(`${base}?pageSize=5`)).json();
    expect(first).toMatchObject({ total: 7, pendingTotal: 7, page: 1, pageSize: 5 });
    expect(first.invitations.map((i: { email: string }) => i.email)).toEqual(emails.slice(2).reverse());
    const second = await (await chair.get(`${base}?pageSize=5&page=2`)).json();
    expect(second.invitations.map((i: { email: string }) => i.email)).toEqual(emails.slice(0, 2).reverse());
    const all = await (await chair.get(`${base}?show=all&pageSize=5`)).json();
    expect(all).toMatchObject({ total: 8, pendingTotal: 7 });
    expect(all.invitations[0]).toMatchObject({ id: withdrawn.id, status: "revoked" });

    const bad = await chair.get(`${base}?show=everything&page=0`);
    expect(bad.status).toBe(400);
    expect((await bad.json()).error).toBeTruthy();

    const pendingPage = await (await chair.get(`/boards/${cast.board.id}/members`)).text();
    expect(pendingPage).toContain("7 pending, newest first");
    expect(pendingPage).not.toContain(withdrawn.email);
    const allPage = await (await chair.get(`/boards/${cast.board.id}/members?invitations=all`)).text();
    expect(allPage).toContain("8 in all, newest first");
    expect(allPage).toContain(withdrawn.email);
  });
});

describe("the accounts pages, rendered on the server", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("render for the roles they are for, and hide or refuse the rest", async () => {
    const cast = await createBoardWithCast();
    const chair = await signedIn(cast.chair.email);
    const proposer = await signedIn(cast.proposer.email);
    const outsider = await signedIn(cast.outsider.email);
    const admin = await signedIn(cast.admin.email);
    const board = `/boards/${cast.board.id}`;

    const members = await chair.get(`${board}/members?sort=email&dir=desc&q=${encodeURIComponent(cast.reviewer.email)}`);
    expect(members.status).toBe(200);
    const membersHtml = await members.text();
    expect(membersHtml).toContain("Board members");
    expect(membersHtml).toContain(cast.reviewer.email);
    expect(membersHtml).not.toContain(cast.proposer.email);
    expect(await (await chair.get(`${board}/members?page=-4&pageSize=lots`)).text()).toContain(cast.proposer.email);
    expect(await (await proposer.get(`${board}/members`)).text()).toContain("Not available to your role");
    expect(await (await proposer.get(`${board}/settings`)).text()).toContain("Not available to your role");
    expect((await outsider.get(`${board}/members`)).status).toBe(404);
    expect((await outsider.get(board)).status).toBe(404);
    expect(await (await chair.get(`${board}/settings`)).text()).toContain("Open registration for proposers");

    const home = await (await chair.get(board)).text();
    expect(home).toContain("Members and invitations");
    expect(await (await proposer.get(board)).text()).not.toContain("Members and invitations");

    expect(await (await proposer.get("/account")).text()).toContain(cast.board.name);
    expect(await (await admin.get("/admin/audit?q=sign-in")).text()).toContain("Audit log");
    expect(await (await chair.get("/admin/audit")).text()).toContain("for site administrators");
    expect(await (await admin.get("/boards")).text()).toContain("Create a board");
    expect(await (await chair.get("/boards")).text()).not.toContain("Create a board");

    const anonymous = new HttpClient();
    const redirected = await anonymous.get("/account");
    expect([302, 307]).toContain(redirected.status);
    expect(redirected.headers.get("location")).toContain("/sign-in?callbackUrl=%2Faccount");
    expect((await anonymous.get("/sign-in")).status).toBe(200);
    expect((await anonymous.get(`/boards/${cast.board.slug}/register`)).status).toBe(404);
    await db().update(boardsTable).set({ openRegistration: true }).where(eq(boardsTable.id, cast.board.id));
    const register = await anonymous.get(`/boards/${cast.board.slug}/register`);
    expect(register.status).toBe(200);
    expect(await register.text()).toContain("Register as a proposer");
    expect((await anonymous.get("/invitations/not-a-real-token-at-all")).status).toBe(200);
  });
});
