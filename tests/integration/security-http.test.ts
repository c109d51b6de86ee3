// Issue 17 over HTTP against the built app: cross-site writes (finding 3), blind review on
// the pages a reviewer reads (5), and the lesser findings that live at the HTTP boundary (6):
// NUL in paths, filters and bodies, next-auth's callbackUrl, the decision page, co-authors by
// typed address, X-Forwarded-For.
import crypto from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { auditEvents, boards, invitations, users } from "@/db/schema";
import { assignReviewers } from "@/lib/dal/assignments";
import { appUrl } from "../support/app";
import { addMember, asSessionUser, createBoardWithCast, createUser, TEST_PASSWORD, unique } from "../support/factories";
import { HttpClient, signedIn } from "../support/http";
import { createReviewRound, inFuture } from "./review-fixtures";

let base = "";
beforeAll(async () => {
  base = await appUrl();
});

describe("cross-site writes on /api/v1", () => {
  it("refuses a text/plain chair invitation posted with a chair's cookie, and one from the store's origin", async () => {
    const cast = await createBoardWithCast();
    const chair = await signedIn(cast.chair.email);
    const path = `/api/v1/boards/${cast.board.id}/invitations`;
    const email = `${unique("csrf")}@example.org`;
    const body = JSON.stringify({ email, role: "chair" });
    // What a page on the object store's origin can send without a preflight.
    const plain = await chair.request(path, { method: "POST", headers: { "content-type": "text/plain;charset=UTF-8" }, body });
    expect(plain.status).toBe(415);
    const form = await chair.request(path, {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded" },
      body: `email=${email}&role=chair`,
    });
    expect(form.status).toBe(415);
    const store = new URL(process.env.S3_ENDPOINT ?? "http://127.0.0.1:1").origin;
    const crossOrigin = await chair.request(path, {
      method: "POST",
      headers: { "content-type": "application/json", origin: store, "sec-fetch-site": "same-site" },
      body,
    });
    expect(crossOrigin.status).toBe(403);
    expect((await crossOrigin.json()).error).toMatch(/accepted only from/);
    expect(await db().select({ id: invitations.id }).from(invitations).where(eq(invitations.email, email))).toHaveLength(0);
    // The app's own page (same origin) still works.
    const own = await chair.request(path, {
      method: "POST",
      headers: { "content-type": "application/json", origin: base, "sec-fetch-site": "same-origin" },
      body,
    });
    expect(own.status).toBe(201);
  });
});

describe("blind review on the pages a reviewer reads", () => {
  it("shows no proposer name on the proposal page and in its API answer", async () => {
    const round = await createReviewRound({ hideProposerNames: true });
    const secretName = `Owner ${unique("hidden")}`;
    await db().update(users).set({ name: secretName }).where(eq(users.id, round.proposer.id));
    await assignReviewers(asSessionUser(round.chair), round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer.id],
      dueAt: inFuture(),
      confirmLikelyConflicts: true,
    });
    const reviewer = await signedIn(round.reviewer.email);
    const paths = [
      `/boards/${round.board.id}/proposals/${round.proposal.id}`,
      `/boards/${round.board.id}/proposals/${round.proposal.id}/versions/1`,
      `/boards/${round.board.id}/proposals/${round.proposal.id}/review`,
      `/boards/${round.board.id}/reviews`,
      `/api/v1/boards/${round.board.id}/proposals/${round.proposal.id}`,
    ];
    for (const path of paths) {
      const res = await reviewer.get(path);
      expect(res.status, path).toBe(200);
      const text = await res.text();
      expect(text, path).not.toContain(secretName);
      expect(text, path).not.toContain(round.proposer.email);
    }
    const chair = await signedIn(round.chair.email);
    expect(await (await chair.get(`/boards/${round.board.id}/proposals/${round.proposal.id}`)).text()).toContain(secretName);
  });
});

describe("lesser findings at the HTTP boundary", () => {
  it("answers 400 to a NUL character in a path, a list filter, a body and a page filter", async () => {
    const cast = await createBoardWithCast();
    const admin = await signedIn(cast.admin.email);
    expect((await admin.get(`/api/v1/boards/${cast.board.id}%00`)).status).toBe(400);
    expect((await admin.get(`/api/v1/admin/audit?q=a%00b`)).status).toBe(400);
    expect((await admin.get(`/api/v1/boards/${cast.board.id}/members?q=%00`)).status).toBe(400);
    expect((await admin.post(`/api/v1/boards`, { name: "Board\u0000name" })).status).toBe(400);
    expect((await admin.request(`/api/v1/boards/${cast.board.id}`, { method: "PATCH", json: { description: "x\u0000" } })).status).toBe(400);
    expect((await admin.get(`/admin/audit?q=%00`)).status).toBe(400);
    expect((await admin.get(`/admin/outbox?q=%00`)).status).toBe(400);
  });

  it("answers 400, not 500, to a malformed callbackUrl at next-auth", async () => {
    const client = new HttpClient();
    expect((await client.get(`/api/auth/signin?callbackUrl=${encodeURIComponent("http://[")}`)).status).toBe(400);
    const csrf = (await (await client.get("/api/auth/csrf")).json()) as { csrfToken: string };
    const form = new URLSearchParams({ email: "a@example.org", password: "whatever it is", csrfToken: csrf.csrfToken, callbackUrl: "http://[", json: "true" });
    const res = await client.request("/api/auth/callback/password", {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded" },
      body: form.toString(),
    });
    expect(res.status).toBe(400);
  });

  it("answers 404 on the decision page to a reviewer, the same as for an unknown proposal", async () => {
    const round = await createReviewRound();
    await assignReviewers(asSessionUser(round.chair), round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer.id],
      dueAt: inFuture(),
      confirmLikelyConflicts: true,
    });
    const reviewer = await signedIn(round.reviewer.email);
    expect((await reviewer.get(`/boards/${round.board.id}/proposals/${round.proposal.id}`)).status).toBe(200);
    expect((await reviewer.get(`/boards/${round.board.id}/proposals/${round.proposal.id}/decision`)).status).toBe(404);
    expect((await reviewer.get(`/boards/${round.board.id}/proposals/${crypto.randomUUID()}/decision`)).status).toBe(404);
  });

  it("does not list the board's proposers to a proposer; co-authors are named by their full address", async () => {
    const round = await createReviewRound();
    const other = await createUser({ name: `Other ${unique("prop")}` });
    await addMember(round.board.id, other.id, "proposer");
    const proposer = await signedIn(round.proposer.email);
    const page = await (await proposer.get(`/boards/${round.board.id}/proposals`)).text();
    expect(page).not.toContain(other.email);
    expect(page).not.toContain(other.name);
    const path = `/api/v1/boards/${round.board.id}/proposals`;
    const wrong = await proposer.post(path, { title: "Relay study", callId: round.call.id, coauthorEmails: [`x${other.email}`] });
    expect(wrong.status).toBe(422);
    const made = await proposer.post(path, { title: "Relay study", callId: round.call.id, coauthorEmails: [other.email.toUpperCase()] });
    expect(made.status).toBe(201);
    const id = ((await made.json()) as { proposal: { id: string } }).proposal.id;
    const detail = (await (await proposer.get(`${path}/${id}`)).json()) as { proposal: { coauthors: { id: string }[] } };
    expect(detail.proposal.coauthors.map((c) => c.id)).toEqual([other.id]);
  });

  it("does not take a client's own X-Forwarded-For as its address beyond the trusted hops", async () => {
    // The test profile trusts one proxy hop (the test client plays the proxy): the address is
    // the entry that proxy appended, left of the peer; whatever the client wrote before is ignored.
    const user = await createUser();
    const client = new HttpClient();
    expect(await client.signIn("password", { email: user.email, password: TEST_PASSWORD }, { "x-forwarded-for": "203.0.113.250, 10.200.0.9" })).toBeNull();
    const [row] = await db()
      .select({ ip: auditEvents.ipAddress })
      .from(auditEvents)
      .where(and(eq(auditEvents.actorEmail, user.email), eq(auditEvents.action, "sign-in")));
    expect(row?.ip).toBe("10.200.0.9");
  });
});

describe("board settings", () => {
  it("keeps blind review off by default", async () => {
    const cast = await createBoardWithCast();
    const [row] = await db().select({ hide: boards.hideProposerNames, all: boards.reviewersSeeAllVersions }).from(boards).where(eq(boards.id, cast.board.id));
    expect(row).toEqual({ hide: false, all: false });
  });
});
