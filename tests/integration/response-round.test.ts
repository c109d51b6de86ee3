// The response round (issue 16 A): the chair's window on a call, the proposers' answers under
// the blind rules, dispositions with their history, reviewer confidence and expertise, the
// window's e-mails through the outbox into the local mail catcher, and bad input over HTTP.
import { and, eq, like } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { decisions, outboxMessages, proposalVersions, reviewItemAnswers, reviewItemDispositions } from "@/db/schema";
import { assignReviewers } from "@/lib/dal/assignments";
import {
  answerReviewItem,
  closeResponseWindow,
  enqueueResponseWindowMails,
  getResponseWindow,
  recordDisposition,
  setResponseWindow,
} from "@/lib/dal/responses";
import { createReviewItem, listReviewItems } from "@/lib/dal/review-items";
import { getReviewScreen, listProposalReviews, saveReviewDraft, submitReview } from "@/lib/dal/reviews";
import { dossierPlainText } from "@/lib/dossier";
import { makeAnchor } from "@/lib/review/anchors";
import { answerInput, dispositionInput, responseWindowInput } from "@/lib/validation/responses";
import { reviewDraftInput } from "@/lib/validation/review";
import { appUrl } from "../support/app";
import { addMember, asSessionUser, createUser, unique } from "../support/factories";
import { signedIn } from "../support/http";
import { deliver } from "./outbox-support";
import { caughtMessages } from "../support/mail";
import { createReviewRound, dossierDocument, inFuture } from "./review-fixtures";

const HOUR = 3_600_000;
const DAY = 24 * HOUR;
const fullScores = { science: { score: 4, comment: "" }, feasibility: { score: 3, comment: "" }, cost: { score: 5, comment: "" } };

async function expectStatus(promise: Promise<unknown>, status: number, message?: RegExp) {
  const error = await promise.then(
    () => null,
    (e: unknown) => e as { status?: number; message?: string },
  );
  expect(error, "expected the call to be refused").not.toBeNull();
  expect(error!.status).toBe(status);
  if (message) expect(error!.message).toMatch(message);
}

/** A review round with two assigned reviewers: the first submitted their review and raised an item, the second raised one but has not submitted. */
async function roundWithItems() {
  const round = await createReviewRound();
  const chair = asSessionUser(round.chair);
  await assignReviewers(chair, round.board.id, {
    proposalIds: [round.proposal.id],
    reviewerIds: [round.reviewer2.id, round.reviewer3.id],
    dueAt: inFuture(),
    confirmLikelyConflicts: false,
  });
  const text = dossierPlainText(dossierDocument(round.proposal.title));
  const from = text.indexOf("95.6 minutes");
  const r2 = asSessionUser(round.reviewer2);
  const r3 = asSessionUser(round.reviewer3);
  const released = await createReviewItem(r2, round.board.id, {
    proposalId: round.proposal.id,
    severity: "major",
    title: unique("Period disagrees with the altitude"),
    body: "Recompute the period from the orbit radius.",
    anchor: makeAnchor(text, from, from + 12),
  });
  const pending = await createReviewItem(r3, round.board.id, {
    proposalId: round.proposal.id,
    severity: "minor",
    title: unique("Draft remark"),
    body: "Not ready yet.",
    anchor: makeAnchor(text, from, from + 12),
  });
  const screen = await getReviewScreen(
    r2,
    round.board.id,
    (await listProposalReviews(chair, round.board.id, round.proposal.id)).find((r) => r.reviewerId === round.reviewer2.id)!.assignmentId,
  );
  const saved = await saveReviewDraft(r2, round.board.id, screen.assignment.id, {
    revision: 0,
    scores: fullScores,
    summary: "Sound",
    confidence: "high",
    expertise: "medium",
  });
  await submitReview(r2, round.board.id, screen.assignment.id, { revision: saved.revision });
  return { ...round, chairUser: chair, r2, r3, released, pending, text };
}

async function mailsFor(windowId: string) {
  return db()
    .select({
      id: outboxMessages.id,
      dedupeKey: outboxMessages.dedupeKey,
      to: outboxMessages.toAddresses,
      subject: outboxMessages.subject,
      kind: outboxMessages.kind,
    })
    .from(outboxMessages)
    .where(like(outboxMessages.dedupeKey, `response-%:${windowId}:%`))
    .orderBy(outboxMessages.createdAt);
}

describe("response window", () => {
  it("the chair opens it; proposers then see released items (reviewers anonymous) and answer; mails go out at opening, two days before the end (once) and at closing", async () => {
    const s = await roundWithItems();
    const proposer = asSessionUser(s.proposer);

    // Before any window: the proposer sees no item and cannot answer one (it does not exist for them).
    expect(await listReviewItems(proposer, s.board.id, s.proposal.id)).toEqual([]);
    await expectStatus(answerReviewItem(proposer, s.board.id, s.released.id, { body: "Early" }), 404);

    // Only the chair opens it.
    const now = new Date();
    const dates = { opensAt: new Date(now.getTime() - HOUR), closesAt: new Date(now.getTime() + 5 * DAY) };
    await expectStatus(setResponseWindow(asSessionUser(s.reviewer), s.board.id, s.call.id, dates), 403);
    await expectStatus(setResponseWindow(proposer, s.board.id, s.call.id, dates), 403);
    const outsider = asSessionUser(await createUser());
    await expectStatus(setResponseWindow(outsider, s.board.id, s.call.id, dates), 404);
    await expectStatus(setResponseWindow(s.chairUser, s.board.id, s.call.id, { opensAt: dates.closesAt, closesAt: dates.opensAt }), 422, /end after it starts/);
    await expectStatus(
      setResponseWindow(s.chairUser, s.board.id, s.call.id, { opensAt: new Date(now.getTime() - 3 * DAY), closesAt: new Date(now.getTime() - DAY) }),
      422,
      /has passed/,
    );
    expect(await getResponseWindow(s.chairUser, s.board.id, s.call.id)).toBeNull();

    const window = await setResponseWindow(s.chairUser, s.board.id, s.call.id, dates, now);
    expect(window.state).toBe("open");
    expect(window.openingMailedAt).not.toBeNull();

    // Opening mail: one per proposal, to its authors, in the outbox and then in the catcher.
    let mails = await mailsFor(window.id);
    expect(mails.map((m) => [m.kind, m.to])).toEqual([["response-opening", [s.proposer.email]]]);
    await deliver(mails.map((m) => m.id));
    const caught = (await caughtMessages()).filter((m) => m.to.includes(s.proposer.email) && m.subject.includes(s.proposal.title));
    expect(caught.map((m) => m.subject)).toEqual([expect.stringMatching(/^Answer the review items on/)]);
    expect(caught[0]!.text).toContain(`/boards/${s.board.id}/proposals/${s.proposal.id}/responses`);
    expect(caught[0]!.text).not.toContain(s.reviewer2.name);

    // The proposer sees the released item, not the unsubmitted reviewer's, and no reviewer name.
    const seen = await listReviewItems(proposer, s.board.id, s.proposal.id);
    expect(seen.map((i) => i.id)).toEqual([s.released.id]);
    expect(seen[0]!.authorLabel).toBe("Reviewer 1");
    expect(JSON.stringify(seen)).not.toContain(s.reviewer2.name);
    expect(seen[0]!.canAnswer).toBe(true);
    await expectStatus(answerReviewItem(proposer, s.board.id, s.pending.id, { body: "Hidden item" }), 404);

    // Another proposer of the board cannot answer it (nor see it).
    const otherProposer = await createUser({ name: unique("Other proposer") });
    await addMember(s.board.id, otherProposer.id, "proposer");
    await expectStatus(answerReviewItem(asSessionUser(otherProposer), s.board.id, s.released.id, { body: "Not mine" }), 404);
    // A reviewer who sees the item is not its proposal's author.
    await expectStatus(answerReviewItem(s.r2, s.board.id, s.released.id, { body: "Reviewer answering" }), 403);

    // An answer may point at a section of a newer version, by its heading.
    const [v2] = await db()
      .insert(proposalVersions)
      .values({
        proposalId: s.proposal.id,
        boardId: s.board.id,
        number: 2,
        title: s.proposal.title,
        document: dossierDocument(s.proposal.title),
        documentKey: `test/${s.proposal.id}/2.json`,
        htmlKey: `test/${s.proposal.id}/2.html`,
      })
      .returning();
    await expectStatus(
      answerReviewItem(proposer, s.board.id, s.released.id, { body: "See v1", sectionVersionId: s.version.id, sectionHeading: "Transfer" }),
      422,
      /newer version/,
    );
    await expectStatus(
      answerReviewItem(proposer, s.board.id, s.released.id, { body: "See v2", sectionVersionId: v2!.id, sectionHeading: "Budget" }),
      422,
      /no section headed/,
    );
    expect(await db().select().from(reviewItemAnswers).where(eq(reviewItemAnswers.reviewItemId, s.released.id))).toEqual([]);
    const answered = await answerReviewItem(proposer, s.board.id, s.released.id, {
      body: "The period now uses the orbit radius.",
      sectionVersionId: v2!.id,
      sectionHeading: "  mission   ORBIT ",
    });
    expect(answered.answer).toMatchObject({ body: "The period now uses the orbit radius.", section: { versionNumber: 2, heading: "Mission orbit" } });
    // A second answer replaces the first (one per item).
    await answerReviewItem(proposer, s.board.id, s.released.id, { body: "Revised answer." });
    const rows = await db().select().from(reviewItemAnswers).where(eq(reviewItemAnswers.reviewItemId, s.released.id));
    expect(rows.map((r) => [r.body, r.sectionHeading])).toEqual([["Revised answer.", null]]);

    // The reviewer and the chair see the answer.
    expect((await listReviewItems(s.r2, s.board.id, s.proposal.id)).find((i) => i.id === s.released.id)!.answer!.body).toBe("Revised answer.");

    // The reminder: not yet three days before the end; once at two days, never twice.
    await enqueueResponseWindowMails(new Date(now.getTime() + 2 * DAY));
    expect((await mailsFor(window.id)).filter((m) => m.kind === "response-reminder")).toEqual([]);
    await enqueueResponseWindowMails(new Date(now.getTime() + 3.5 * DAY));
    await enqueueResponseWindowMails(new Date(now.getTime() + 4 * DAY));
    // Everything is answered, so the one proposal has nothing to be reminded of: the stage is still claimed once.
    expect((await mailsFor(window.id)).filter((m) => m.kind === "response-reminder")).toEqual([]);
    expect((await getResponseWindow(s.chairUser, s.board.id, s.call.id))!.reminderMailedAt).not.toBeNull();

    // Closing: the chair closes it now; proposers and the proposal's reviewers are told, once.
    const closed = await closeResponseWindow(s.chairUser, s.board.id, s.call.id);
    expect(closed.state).toBe("closed");
    await expectStatus(closeResponseWindow(s.chairUser, s.board.id, s.call.id), 409);
    await enqueueResponseWindowMails(new Date(Date.now() + HOUR));
    mails = await mailsFor(window.id);
    const closing = mails.filter((m) => m.kind === "response-closing");
    expect(closing.map((m) => m.to[0]).sort()).toEqual([s.proposer.email, s.reviewer2.email, s.reviewer3.email].sort());
    await deliver(closing.map((m) => m.id));
    const closingCaught = (await caughtMessages()).filter(
      (m) => m.to.includes(s.reviewer2.email) && m.subject === `Response round closed: “${s.proposal.title}”`,
    );
    expect(closingCaught).toHaveLength(1);
    expect(closingCaught[0]!.text).toContain("Please record a disposition for each item you raised.");

    // After closing: answers are refused, the earlier one stays.
    await expectStatus(answerReviewItem(proposer, s.board.id, s.released.id, { body: "Too late" }), 409, /closed on/);
    expect(
      (await db().select({ body: reviewItemAnswers.body }).from(reviewItemAnswers).where(eq(reviewItemAnswers.reviewItemId, s.released.id)))[0]!.body,
    ).toBe("Revised answer.");
    // Still visible to the proposer after the round.
    expect((await listReviewItems(proposer, s.board.id, s.proposal.id)).map((i) => [i.id, i.canAnswer])).toEqual([[s.released.id, false]]);
  });

  it("sends the reminder once to proposers with unanswered items, and a future window mails at its start", async () => {
    const s = await roundWithItems();
    const base = new Date(Date.now() + 400 * DAY + Math.floor(Math.random() * 1000) * HOUR);
    // A window that starts in the future: no mail on setting it.
    const window = await setResponseWindow(s.chairUser, s.board.id, s.call.id, { opensAt: base, closesAt: new Date(base.getTime() + 6 * DAY) }, new Date());
    expect(window.state).toBe("upcoming");
    expect(await mailsFor(window.id)).toEqual([]);
    // Upcoming: the proposer sees nothing yet.
    expect(await listReviewItems(asSessionUser(s.proposer), s.board.id, s.proposal.id)).toEqual([]);
    await enqueueResponseWindowMails(new Date(base.getTime() + HOUR));
    await enqueueResponseWindowMails(new Date(base.getTime() + 2 * HOUR));
    expect((await mailsFor(window.id)).map((m) => m.kind)).toEqual(["response-opening"]);
    await enqueueResponseWindowMails(new Date(base.getTime() + 4.5 * DAY));
    await enqueueResponseWindowMails(new Date(base.getTime() + 5 * DAY));
    const reminders = (await mailsFor(window.id)).filter((m) => m.kind === "response-reminder");
    expect(reminders.map((m) => m.to)).toEqual([[s.proposer.email]]);
    expect(reminders[0]!.subject).toBe(`Two days left to answer the review items on “${s.proposal.title}”`);
    await deliver(reminders.map((m) => m.id));
    expect((await caughtMessages()).filter((m) => m.to.includes(s.proposer.email) && m.subject.startsWith("Two days left"))).toHaveLength(1);
    // Moving the end re-arms the reminder and closing mails for the new end.
    await setResponseWindow(
      s.chairUser,
      s.board.id,
      s.call.id,
      { opensAt: base, closesAt: new Date(base.getTime() + 9 * DAY) },
      new Date(base.getTime() + 5 * DAY),
    );
    await enqueueResponseWindowMails(new Date(base.getTime() + 7.5 * DAY));
    expect((await mailsFor(window.id)).filter((m) => m.kind === "response-reminder")).toHaveLength(2);
    await enqueueResponseWindowMails(new Date(base.getTime() + 10 * DAY));
    await enqueueResponseWindowMails(new Date(base.getTime() + 11 * DAY));
    expect((await mailsFor(window.id)).filter((m) => m.kind === "response-closing")).toHaveLength(3);
  });
});

describe("dispositions", () => {
  it("only the item's reviewer or the chair records one; not accepted needs a reason; the history keeps who, when and why", async () => {
    const s = await roundWithItems();
    const proposer = asSessionUser(s.proposer);
    await setResponseWindow(s.chairUser, s.board.id, s.call.id, { opensAt: new Date(Date.now() - HOUR), closesAt: new Date(Date.now() + 5 * DAY) });
    await answerReviewItem(proposer, s.board.id, s.released.id, { body: "Fixed in the next version." });

    await expectStatus(recordDisposition(proposer, s.board.id, s.released.id, { disposition: "agreed" }), 403);
    // Another reviewer of the same proposal who did not raise the item.
    await expectStatus(recordDisposition(s.r3, s.board.id, s.released.id, { disposition: "agreed" }), 404);
    await expectStatus(recordDisposition(asSessionUser(s.reviewer), s.board.id, s.released.id, { disposition: "agreed" }), 404);
    await expectStatus(recordDisposition(s.chairUser, s.board.id, s.released.id, { disposition: "not-accepted", reason: "   " }), 422, /reason is required/);
    expect(await db().select().from(reviewItemDispositions).where(eq(reviewItemDispositions.reviewItemId, s.released.id))).toEqual([]);

    const first = await recordDisposition(s.r2, s.board.id, s.released.id, { disposition: "fix-next-version", reason: "" });
    expect(first.disposition).toMatchObject({ disposition: "fix-next-version", label: "Will be fixed in the next version", actorRole: "reviewer", mine: true });
    const second = await recordDisposition(s.chairUser, s.board.id, s.released.id, {
      disposition: "not-accepted",
      reason: "The radius is still wrong in table 2.",
    });
    expect(second.dispositionHistory.map((d) => [d.disposition, d.actorRole, d.reason])).toEqual([
      ["fix-next-version", "reviewer", ""],
      ["not-accepted", "chair", "The radius is still wrong in table 2."],
    ]);
    expect(second.disposition!.disposition).toBe("not-accepted");

    // The proposer sees the history with the blind labels.
    const mine = (await listReviewItems(proposer, s.board.id, s.proposal.id))[0]!;
    expect(mine.dispositionHistory.map((d) => d.actorLabel)).toEqual(["Reviewer 1", "Chair"]);
    expect(JSON.stringify(mine)).not.toContain(s.reviewer2.name);
    expect(JSON.stringify(mine)).not.toContain(s.chair.email);
    expect(mine.canDispose).toBe(false);

    // A decided version's items are settled.
    await db()
      .insert(decisions)
      .values({ boardId: s.board.id, proposalId: s.proposal.id, versionId: s.version.id, outcome: "revise", letter: {}, letterHtml: "", letterText: "" });
    await expectStatus(recordDisposition(s.chairUser, s.board.id, s.released.id, { disposition: "closed" }), 409);
    expect(
      await db()
        .select()
        .from(reviewItemDispositions)
        .where(and(eq(reviewItemDispositions.reviewItemId, s.released.id))),
    ).toHaveLength(2);
  });
});

describe("reviewer confidence and expertise", () => {
  it("are saved with the review, shown to the chair, and refuse anything but the three levels", async () => {
    const s = await roundWithItems();
    const reviews = await listProposalReviews(s.chairUser, s.board.id, s.proposal.id);
    expect(reviews.find((r) => r.reviewerId === s.reviewer2.id)).toMatchObject({ confidence: "high", expertise: "medium", status: "submitted" });
    expect(reviews.find((r) => r.reviewerId === s.reviewer3.id)).toMatchObject({ confidence: null, expertise: null });
    expect(reviewDraftInput.safeParse({ revision: 0, scores: {}, confidence: "certain" }).success).toBe(false);
    // A save without the fields leaves them as they were.
    const r3Assignment = reviews.find((r) => r.reviewerId === s.reviewer3.id)!.assignmentId;
    const a = await saveReviewDraft(s.r3, s.board.id, r3Assignment, { revision: 0, scores: {}, summary: "", expertise: "low" });
    const b = await saveReviewDraft(s.r3, s.board.id, r3Assignment, { revision: a.revision, scores: {}, summary: "more" });
    expect([b.confidence, b.expertise]).toEqual([null, "low"]);
  });
});

describe("schemas", () => {
  it("read dates as people write them, and refuse over-long text", () => {
    const parsed = responseWindowInput.parse({ opensAt: "12 Dec 2026", closesAt: "2026-12-26" });
    expect(parsed.opensAt.toISOString()).toBe("2026-12-12T00:00:00.000Z");
    expect(parsed.closesAt.toISOString()).toBe("2026-12-26T23:59:00.000Z");
    expect(responseWindowInput.safeParse({ opensAt: "31 Feb 2026", closesAt: "2026-12-26" }).success).toBe(false);
    expect(answerInput.safeParse({ body: "x".repeat(8001) }).success).toBe(false);
    expect(dispositionInput.safeParse({ disposition: "closed", reason: "x".repeat(2001) }).success).toBe(false);
    expect(dispositionInput.safeParse({ disposition: "accepted" }).success).toBe(false);
  });
});

describe("response round over HTTP", () => {
  beforeAll(async () => {
    await appUrl();
  }, 900_000);

  it("answers 4xx with a sentence for bad input and saves nothing", async () => {
    const s = await roundWithItems();
    const chair = await signedIn(s.chair.email);
    const proposer = await signedIn(s.proposer.email);
    const reviewer3 = await signedIn(s.reviewer3.email);
    const windowPath = `/api/v1/boards/${s.board.id}/calls/${s.call.id}/response-window`;
    const itemPath = `/api/v1/boards/${s.board.id}/review-items/${s.released.id}`;

    let response = await chair.request(windowPath, { method: "PUT", json: { opensAt: "yesterday-ish", closesAt: "26 Dec 2099" } });
    expect(response.status).toBe(422);
    expect(((await response.json()) as { error: string }).error).toMatch(/is not a date we can read/);
    response = await chair.request(windowPath, { method: "PUT", json: { opensAt: "1 Jan 2020", closesAt: "5 Jan 2020" } });
    expect(response.status).toBe(422);
    response = await chair.request(windowPath, { method: "PUT", json: { opensAt: "1 Jan 2020\u0000", closesAt: "5 Jan 2099" } });
    expect(response.status).toBe(400);
    expect((await (await chair.get(windowPath)).json()) as unknown).toEqual({ window: null });

    // Outside the window: the proposer cannot see the item, so cannot answer it.
    response = await proposer.request(`${itemPath}/answer`, { method: "PUT", json: { body: "Early" } });
    expect(response.status).toBe(404);

    const today = new Date();
    response = await chair.request(windowPath, {
      method: "PUT",
      json: { opensAt: `${today.getUTCFullYear()}-${today.getUTCMonth() + 1}-${today.getUTCDate()}`, closesAt: "31 Dec 2099" },
    });
    expect(response.status).toBe(200);
    expect(((await response.json()) as { window: { state: string } }).window.state).toBe("open");

    response = await proposer.request(`${itemPath}/answer`, { method: "PUT", json: { body: "x".repeat(8001) } });
    expect(response.status).toBe(422);
    expect(((await response.json()) as { error: string }).error).toMatch(/under 8000 characters/);
    response = await proposer.request(`${itemPath}/answer`, { method: "PUT", json: { body: "with a \u0000 byte" } });
    expect(response.status).toBe(400);
    expect(await db().select().from(reviewItemAnswers).where(eq(reviewItemAnswers.reviewItemId, s.released.id))).toEqual([]);
    response = await proposer.request(`${itemPath}/answer`, { method: "PUT", json: { body: "Answered over HTTP." } });
    expect(response.status).toBe(200);

    response = await reviewer3.post(`${itemPath}/dispositions`, { disposition: "agreed" });
    expect(response.status).toBe(404);
    response = await proposer.post(`${itemPath}/dispositions`, { disposition: "agreed" });
    expect(response.status).toBe(403);
    response = await chair.post(`${itemPath}/dispositions`, { disposition: "not-accepted" });
    expect(response.status).toBe(422);
    expect(((await response.json()) as { error: string }).error).toMatch(/reason is required/);
    response = await chair.post(`${itemPath}/dispositions`, { disposition: "closed", reason: "y".repeat(2001) });
    expect(response.status).toBe(422);
    expect(await db().select().from(reviewItemDispositions).where(eq(reviewItemDispositions.reviewItemId, s.released.id))).toEqual([]);
    response = await chair.post(`${itemPath}/dispositions`, { disposition: "agreed", reason: "Settled by the answer." });
    expect(response.status).toBe(201);
    const history = (await (await proposer.get(`${itemPath}/dispositions`)).json()) as { history: { label: string; actorLabel: string; reason: string }[] };
    expect(history.history).toEqual([expect.objectContaining({ label: "Agreed", actorLabel: "Chair", reason: "Settled by the answer." })]);
  });
});
