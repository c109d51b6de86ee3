// The review area's data-access layer against the real test database.
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { assignments, auditEvents, calls, checkNotes, decisions, outboxMessages, proposals, reviewItems, reviews, rubricTemplates } from "@/db/schema";
import { assignReviewers, getAssignmentBoard, removeAssignment } from "@/lib/dal/assignments";
import { declareConflict, isConflicted, listConflicts, withdrawConflict } from "@/lib/dal/conflicts";
import { createReviewItem, getReviewItem, listReviewItems, replyToReviewItem, setReviewItemStatus } from "@/lib/dal/review-items";
import {
  getCallOverview,
  getCallOverviewCsv,
  getReviewScreen,
  listProposalReviews,
  listReviewQueue,
  reopenReview,
  reviewAggregate,
  saveCheckNote,
  saveReviewDraft,
  submitReview,
} from "@/lib/dal/reviews";
import { getCallRubric, saveCallRubric } from "@/lib/dal/rubrics";
import { dossierPlainText } from "@/lib/dossier";
import { makeAnchor } from "@/lib/review/anchors";
import { asSessionUser, createUser } from "../support/factories";
import {
  addCoauthor,
  createProposalWithVersion,
  createReviewRound,
  dossierDocument,
  HOHMANN_BLOCK,
  inFuture,
  PERIOD_BLOCK,
  rubricInput,
} from "./review-fixtures";

const status = async (promise: Promise<unknown>) => {
  try {
    await promise;
    return "ok";
  } catch (error) {
    return (error as { status?: number }).status ?? error;
  }
};

const fullScores = (science: number, feasibility: number, cost: number, comment = "") => ({
  science: { score: science, comment },
  feasibility: { score: feasibility, comment: "" },
  cost: { score: cost, comment: "" },
});

async function assignAndSubmit(
  round: Awaited<ReturnType<typeof createReviewRound>>,
  reviewer: { id: string; email: string; name: string; isAdmin: boolean },
  s: [number, number, number],
) {
  const chair = asSessionUser(round.chair);
  const r = asSessionUser(reviewer);
  const result = await assignReviewers(chair, round.board.id, {
    proposalIds: [round.proposal.id],
    reviewerIds: [reviewer.id],
    dueAt: inFuture(),
    confirmLikelyConflicts: true,
  });
  const assignmentId =
    result.created[0]?.assignmentId ??
    (
      await db()
        .select({ id: assignments.id })
        .from(assignments)
        .where(and(eq(assignments.reviewerId, reviewer.id), eq(assignments.proposalId, round.proposal.id)))
    )[0]!.id;
  const saved = await saveReviewDraft(r, round.board.id, assignmentId, { revision: 0, scores: fullScores(...s, "Weak science case"), summary: "" });
  await submitReview(r, round.board.id, assignmentId, { revision: saved.revision });
  return assignmentId;
}

describe("rubric templates", () => {
  it("saves a rubric, refuses weights off 100 % with nothing written, and versions it once a review started", async () => {
    const round = await createReviewRound();
    const chair = asSessionUser(round.chair);
    const first = await getCallRubric(chair, round.board.id, round.call.id);
    expect(first.rubric).toMatchObject({ version: 1, frozenAt: null });

    const off = { ...rubricInput, criteria: rubricInput.criteria.map((c) => (c.id === "cost" ? { ...c, weight: 19 } : c)) };
    await expect(saveCallRubric(chair, round.board.id, round.call.id, off)).rejects.toMatchObject({
      status: 422,
      message: expect.stringContaining("The weights add up to 99 %"),
    });
    expect((await getCallRubric(chair, round.board.id, round.call.id)).rubric!.criteria.find((c) => c.id === "cost")!.weight).toBe(20);

    // Unfrozen: edited in place.
    const edited = await saveCallRubric(chair, round.board.id, round.call.id, { ...rubricInput, name: "Renamed rubric" });
    expect(edited).toMatchObject({ version: 1, createdVersion: false, name: "Renamed rubric" });

    // A reviewer starts: the template freezes; the next edit makes version 2 and the call points at it.
    const { created } = await assignReviewers(chair, round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id],
      dueAt: inFuture(),
      confirmLikelyConflicts: false,
    });
    await saveReviewDraft(asSessionUser(round.reviewer2), round.board.id, created[0]!.assignmentId, {
      revision: 0,
      scores: { science: { score: 4, comment: "" } },
      summary: "",
    });
    expect((await getCallRubric(chair, round.board.id, round.call.id)).rubric!.frozenAt).not.toBeNull();
    const v2 = await saveCallRubric(chair, round.board.id, round.call.id, { ...rubricInput, name: "Second edition" });
    expect(v2).toMatchObject({ version: 2, createdVersion: true });
    const [call] = await db().select({ t: calls.rubricTemplateId }).from(calls).where(eq(calls.id, round.call.id));
    expect(call!.t).toBe(v2.id);
    // The started review keeps the version it was scored against.
    const [review] = await db().select({ t: reviews.rubricTemplateId }).from(reviews).where(eq(reviews.assignmentId, created[0]!.assignmentId));
    expect(review!.t).toBe(edited.id);
    expect((await getCallRubric(chair, round.board.id, round.call.id)).history.map((h) => h.version)).toEqual([2, 1]);
  });

  it("is managed by the chair only", async () => {
    const round = await createReviewRound();
    expect(await status(saveCallRubric(asSessionUser(round.reviewer), round.board.id, round.call.id, rubricInput))).toBe(403);
    expect(await status(saveCallRubric(asSessionUser(round.outsider), round.board.id, round.call.id, rubricInput))).toBe(404);
  });
});

describe("conflicts of interest and assignment", () => {
  it("refuses a conflicted reviewer with a clear message and writes nothing for the whole request", async () => {
    const round = await createReviewRound();
    await declareConflict(asSessionUser(round.reviewer3), round.board.id, { proposalId: round.proposal.id, reason: "Co-supervised the lead author's thesis" });
    const attempt = assignReviewers(asSessionUser(round.chair), round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id, round.reviewer3.id],
      dueAt: inFuture(),
      confirmLikelyConflicts: true,
    });
    await expect(attempt).rejects.toMatchObject({ status: 409, message: expect.stringMatching(/Conflicted reviewers cannot be assigned.*Co-supervised/) });
    expect(await db().select().from(assignments).where(eq(assignments.proposalId, round.proposal.id))).toEqual([]);
    const [p] = await db().select({ status: proposals.status }).from(proposals).where(eq(proposals.id, round.proposal.id));
    expect(p!.status).toBe("submitted");
  });

  it("asks the chair to confirm a likely conflict (same e-mail domain) and assigns after confirmation", async () => {
    const round = await createReviewRound();
    // The cast's reviewer and proposer share the test domain.
    const chair = asSessionUser(round.chair);
    const input = { proposalIds: [round.proposal.id], reviewerIds: [round.reviewer.id], dueAt: inFuture() };
    await expect(assignReviewers(chair, round.board.id, { ...input, confirmLikelyConflicts: false })).rejects.toMatchObject({
      status: 409,
      details: { needsConfirmation: true },
    });
    const result = await assignReviewers(chair, round.board.id, { ...input, confirmLikelyConflicts: true });
    expect(result.created).toHaveLength(1);
    expect(await isConflicted(round.board.id, round.reviewer.id, round.proposal.id)).toBe(false);
  });

  it("treats the same organisation as a co-author, and an organisation declaration, as conflicts", async () => {
    const round = await createReviewRound();
    const coauthor = await createUser({ organisation: "Kestrel Labs", email: `${crypto.randomUUID()}@kestrel.example.net` });
    await addCoauthor(round.proposal.id, coauthor.id);
    const sameOrg = await createUser({ organisation: " kestrel labs", email: `${crypto.randomUUID()}@elsewhere.example.org` });
    const { addMember } = await import("../support/factories");
    await addMember(round.board.id, sameOrg.id, "reviewer");
    expect(await isConflicted(round.board.id, sameOrg.id, round.proposal.id)).toBe(true);

    expect(await isConflicted(round.board.id, round.reviewer2.id, round.proposal.id)).toBe(false);
    await declareConflict(asSessionUser(round.reviewer2), round.board.id, { organisation: "Kestrel Labs", reason: "Paid consultant until last year" });
    expect(await isConflicted(round.board.id, round.reviewer2.id, round.proposal.id)).toBe(true);
    const board = await getAssignmentBoard(asSessionUser(round.chair), round.board.id, round.call.id);
    expect(board.conflicts[`${round.reviewer2.id}:${round.proposal.id}`]![0]!.rule).toBe("declared-organisation");
    expect(board.conflicts[`${sameOrg.id}:${round.proposal.id}`]![0]!.rule).toBe("same-organisation");

    const mine = await listConflicts(asSessionUser(round.reviewer2), round.board.id);
    expect(mine).toHaveLength(1);
    await withdrawConflict(asSessionUser(round.reviewer2), round.board.id, mine[0]!.id);
    expect(await isConflicted(round.board.id, round.reviewer2.id, round.proposal.id)).toBe(false);
    expect(await status(declareConflict(asSessionUser(round.proposer), round.board.id, { organisation: "Kestrel Labs", reason: "n/a at all" }))).toBe(403);
  });

  it("assigns in bulk: proposal in review, one e-mail per assignment through the outbox, loads counted", async () => {
    const round = await createReviewRound();
    const chair = asSessionUser(round.chair);
    const second = await createProposalWithVersion({ boardId: round.board.id, callId: round.call.id, ownerId: round.proposer.id });
    const input = {
      proposalIds: [round.proposal.id, second.proposal.id],
      reviewerIds: [round.reviewer2.id, round.reviewer3.id],
      dueAt: inFuture(),
      confirmLikelyConflicts: false,
    };
    const result = await assignReviewers(chair, round.board.id, input);
    expect(result.created).toHaveLength(4);
    const again = await assignReviewers(chair, round.board.id, input);
    expect(again).toMatchObject({ created: [], existing: expect.arrayContaining([{ proposalId: round.proposal.id, reviewerId: round.reviewer2.id }]) });
    const mail = (await db().select().from(outboxMessages).where(eq(outboxMessages.boardId, round.board.id))).filter((m) =>
      m.dedupeKey.startsWith("assignment:"),
    );
    expect(mail.filter((m) => m.dedupeKey.startsWith("assignment:"))).toHaveLength(4);
    expect(mail.map((m) => m.dedupeKey).sort()).toEqual(result.created.map((c) => `assignment:${c.assignmentId}`).sort());
    expect(mail.find((m) => m.toAddresses[0] === round.reviewer2.email)!.text).toContain("/review");
    const states = await db().select({ status: proposals.status }).from(proposals).where(eq(proposals.callId, round.call.id));
    expect(states.map((s) => s.status)).toEqual(["in_review", "in_review"]);
    const board = await getAssignmentBoard(chair, round.board.id, round.call.id);
    expect(board.reviewers.find((r) => r.id === round.reviewer2.id)).toMatchObject({ openLoad: 2, submitted: 0 });
    expect(board.proposals.find((p) => p.id === round.proposal.id)!.assigned.map((a) => a.reviewStatus)).toEqual(["not started", "not started"]);

    await removeAssignment(chair, round.board.id, result.created[0]!.assignmentId);
    expect((await getAssignmentBoard(chair, round.board.id, round.call.id)).reviewers.find((r) => r.id === result.created[0]!.reviewerId)!.openLoad).toBe(1);
  });

  it("refuses a past due date, a non-reviewer, and a draft proposal", async () => {
    const round = await createReviewRound();
    const chair = asSessionUser(round.chair);
    const base = { proposalIds: [round.proposal.id], reviewerIds: [round.reviewer2.id], confirmLikelyConflicts: false };
    expect(await status(assignReviewers(chair, round.board.id, { ...base, dueAt: new Date(Date.now() - 1000) }))).toBe(422);
    expect(await status(assignReviewers(chair, round.board.id, { ...base, reviewerIds: [round.proposer.id], dueAt: inFuture() }))).toBe(422);
    const draft = await createProposalWithVersion({ boardId: round.board.id, callId: round.call.id, ownerId: round.proposer.id, status: "draft" });
    expect(await status(assignReviewers(chair, round.board.id, { ...base, proposalIds: [draft.proposal.id], dueAt: inFuture() }))).toBe(409);
    expect(await status(assignReviewers(asSessionUser(round.reviewer2), round.board.id, { ...base, dueAt: inFuture() }))).toBe(403);
  });
});

describe("reviews", () => {
  it("autosaves with optimistic concurrency, validates scores, submits, locks, and the chair reopens (audited)", async () => {
    const round = await createReviewRound();
    const chair = asSessionUser(round.chair);
    const reviewer = asSessionUser(round.reviewer2);
    const { created } = await assignReviewers(chair, round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id],
      dueAt: inFuture(),
      confirmLikelyConflicts: false,
    });
    const assignmentId = created[0]!.assignmentId;

    // Someone else's assignment is invisible to another reviewer.
    expect(await status(getReviewScreen(asSessionUser(round.reviewer3), round.board.id, assignmentId))).toBe(404);
    expect(await status(saveReviewDraft(asSessionUser(round.reviewer3), round.board.id, assignmentId, { revision: 0, scores: {}, summary: "" }))).toBe(404);

    const screen = await getReviewScreen(reviewer, round.board.id, assignmentId);
    expect(screen.review).toMatchObject({ status: "not started", revision: 0 });
    expect(screen.canEdit).toBe(true);
    expect(screen.checks.map((c) => [c.blockId, c.status])).toEqual([
      [PERIOD_BLOCK, "consistent"],
      [HOHMANN_BLOCK, "inconsistent"],
    ]);
    expect(screen.version.html).toContain(`data-block-id="${HOHMANN_BLOCK}"`);
    expect(screen.version.plainText).toContain("95.6 minutes");

    const first = await saveReviewDraft(reviewer, round.board.id, assignmentId, {
      revision: 0,
      scores: { science: { score: 4, comment: "" } },
      summary: "Good start",
    });
    expect(first).toMatchObject({ status: "draft", revision: 1, weightedTotal: 4 });

    // Stale revision: 409 with the saved state, nothing changed.
    await expect(
      saveReviewDraft(reviewer, round.board.id, assignmentId, { revision: 0, scores: { science: { score: 1, comment: "" } }, summary: "" }),
    ).rejects.toMatchObject({
      status: 409,
      details: { review: { revision: 1 } },
    });
    // A score outside the scale: 422, nothing changed.
    await expect(
      saveReviewDraft(reviewer, round.board.id, assignmentId, { revision: 1, scores: { science: { score: 7, comment: "" } }, summary: "" }),
    ).rejects.toMatchObject({
      status: 422,
      message: '"Science return": 7 is outside the scale 1..5.',
    });
    const [kept] = await db().select().from(reviews).where(eq(reviews.assignmentId, assignmentId));
    expect(kept).toMatchObject({ revision: 1, summary: "Good start", scores: { science: { score: 4, comment: "" } } });

    // Submitting with a low science score and no comment, and a criterion unscored: 422 listing both.
    const second = await saveReviewDraft(reviewer, round.board.id, assignmentId, {
      revision: 1,
      scores: { science: { score: 2, comment: "" }, feasibility: { score: 3, comment: "" } },
      summary: "",
    });
    await expect(submitReview(reviewer, round.board.id, assignmentId, { revision: second.revision })).rejects.toMatchObject({
      status: 422,
      message: expect.stringMatching(/a score below 3 needs a comment.*"Cost realism" is not scored yet/),
    });

    const third = await saveReviewDraft(reviewer, round.board.id, assignmentId, {
      revision: second.revision,
      scores: fullScores(2, 3, 5, "Thin science case"),
      summary: "Solid engineering.",
    });
    // 50·2 + 30·3 + 20·5 = 100 + 90 + 100 = 290 → 2.9
    expect(third.weightedTotal).toBeCloseTo(2.9, 6);
    const submitted = await submitReview(reviewer, round.board.id, assignmentId, { revision: third.revision });
    expect(submitted).toMatchObject({ status: "submitted", weightedTotal: 2.9 });

    // Editing a submitted review: 409.
    await expect(
      saveReviewDraft(reviewer, round.board.id, assignmentId, { revision: submitted.revision, scores: fullScores(5, 5, 5), summary: "" }),
    ).rejects.toMatchObject({
      status: 409,
      message: expect.stringContaining("submitted and locked"),
    });

    expect(await status(reopenReview(reviewer, round.board.id, assignmentId, { reason: "let me fix it" }))).toBe(403);
    const reopened = await reopenReview(chair, round.board.id, assignmentId, { reason: "Cost score was entered on the wrong criterion" });
    expect(reopened.status).toBe("draft");
    const audit = await db()
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.boardId, round.board.id), eq(auditEvents.action, "review.reopen")));
    expect(audit[0]!.details).toMatchObject({ reason: "Cost score was entered on the wrong criterion" });
    const again = await saveReviewDraft(reviewer, round.board.id, assignmentId, {
      revision: reopened.revision,
      scores: fullScores(2, 4, 5, "Thin science case"),
      summary: "",
    });
    expect(again.status).toBe("draft");

    const queue = await listReviewQueue(reviewer, round.board.id);
    expect(queue).toEqual([expect.objectContaining({ assignmentId, status: "draft", scored: 3, criteria: 3, overdue: false })]);
  });

  it("keeps a conflicted reviewer out of a proposal they were assigned to (404)", async () => {
    const round = await createReviewRound();
    const { created } = await assignReviewers(asSessionUser(round.chair), round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id],
      dueAt: inFuture(),
      confirmLikelyConflicts: false,
    });
    await declareConflict(asSessionUser(round.reviewer2), round.board.id, {
      proposalId: round.proposal.id,
      reason: "Discovered a family tie to the lead author",
    });
    expect(await status(getReviewScreen(asSessionUser(round.reviewer2), round.board.id, created[0]!.assignmentId))).toBe(404);
    expect(
      await status(saveReviewDraft(asSessionUser(round.reviewer2), round.board.id, created[0]!.assignmentId, { revision: 0, scores: {}, summary: "" })),
    ).toBe(404);
    expect((await listReviewQueue(asSessionUser(round.reviewer2), round.board.id))[0]!.conflicted).toBe(true);
  });

  it("refuses to start a review before the chair sets up the rubric", async () => {
    const round = await createReviewRound({ rubric: false });
    const { created } = await assignReviewers(asSessionUser(round.chair), round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id],
      dueAt: inFuture(),
      confirmLikelyConflicts: false,
    });
    await expect(
      saveReviewDraft(asSessionUser(round.reviewer2), round.board.id, created[0]!.assignmentId, { revision: 0, scores: {}, summary: "" }),
    ).rejects.toMatchObject({
      status: 409,
      message: expect.stringContaining("has not set up the rubric"),
    });
  });

  it("stores a note on an orbit-check verdict and removes it when emptied", async () => {
    const round = await createReviewRound();
    const { created } = await assignReviewers(asSessionUser(round.chair), round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id],
      dueAt: inFuture(),
      confirmLikelyConflicts: false,
    });
    const reviewer = asSessionUser(round.reviewer2);
    const saved = await saveCheckNote(reviewer, round.board.id, created[0]!.assignmentId, round.checks.inconsistent.id, {
      note: "Explained in section 4: finite-burn losses.",
    });
    expect(saved.review.revision).toBe(1);
    const screen = await getReviewScreen(reviewer, round.board.id, created[0]!.assignmentId);
    expect(screen.checks.find((c) => c.blockId === HOHMANN_BLOCK)!.note).toBe("Explained in section 4: finite-burn losses.");
    await saveCheckNote(reviewer, round.board.id, created[0]!.assignmentId, round.checks.inconsistent.id, { note: "" });
    expect(await db().select().from(checkNotes).where(eq(checkNotes.checkResultId, round.checks.inconsistent.id))).toEqual([]);
    const other = await createProposalWithVersion({ boardId: round.board.id, callId: round.call.id, ownerId: round.proposer.id });
    expect(await status(saveCheckNote(reviewer, round.board.id, created[0]!.assignmentId, other.checks.inconsistent.id, { note: "x" }))).toBe(404);
  });
});

describe("aggregates for the chair", () => {
  it("gives the weighted mean and sample standard deviation of submitted reviews, worked by hand", async () => {
    const round = await createReviewRound();
    // Reviewer A: 50·4 + 30·3 + 20·5 = 390 → 3.9.  Reviewer B: 50·3 + 30·3 + 20·4 = 320 → 3.2.
    // Reviewer C: 50·5 + 30·3 + 20·5 = 440 → 4.4.  Mean 11.5/3 = 3.833333; sample s = √(109/300) = 0.602771.
    await assignAndSubmit(round, round.reviewer2, [4, 3, 5]);
    await assignAndSubmit(round, round.reviewer3, [3, 3, 4]);
    await assignAndSubmit(round, round.reviewer, [5, 3, 5]);
    const aggregate = await reviewAggregate(round.board.id, round.proposal.id);
    expect(aggregate).toMatchObject({ count: 3, assigned: 3, versionNumber: 1, scale: { min: 1, max: 5 } });
    expect(aggregate!.weightedMean).toBeCloseTo(3.833333, 6);
    expect(aggregate!.spread).toBeCloseTo(0.602771, 6);

    const overview = await getCallOverview(asSessionUser(round.chair), round.board.id, round.call.id);
    expect(overview.rows).toHaveLength(1);
    expect(overview.rows[0]).toMatchObject({ reviews: 3, target: 2, checks: { inconsistent: 1, invalid: 0 }, openItems: { major: 0, minor: 0, comment: 0 } });
    expect(overview.rows[0]!.distribution).toEqual([
      { level: 1, count: 0 },
      { level: 2, count: 0 },
      { level: 3, count: 1 },
      { level: 4, count: 2 },
      { level: 5, count: 0 },
    ]);
    const { csv, filename } = await getCallOverviewCsv(asSessionUser(round.chair), round.board.id, round.call.id);
    expect(filename).toMatch(/-overview\.csv$/);
    const [header, line] = csv.trim().split("\r\n");
    expect(header).toContain("weighted_mean,sample_std_dev");
    expect(line).toContain(",3.833,0.603,");
    expect(await status(getCallOverview(asSessionUser(round.reviewer), round.board.id, round.call.id))).toBe(403);
    const list = await listProposalReviews(asSessionUser(round.chair), round.board.id, round.proposal.id);
    expect(list.map((r) => r.weightedTotal).sort()).toEqual([3.2, 3.9, 4.4]);
  });
});

describe("review items", () => {
  it("anchors an item to the server's text, refuses a range outside it, and threads replies", async () => {
    const round = await createReviewRound();
    const { created } = await assignReviewers(asSessionUser(round.chair), round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id, round.reviewer3.id],
      dueAt: inFuture(),
      confirmLikelyConflicts: false,
    });
    const r2 = asSessionUser(round.reviewer2);
    const text = dossierPlainText(dossierDocument(round.proposal.title));
    const from = text.indexOf("95.6 minutes");
    const anchor = makeAnchor(text, from, from + 12);

    await expect(
      createReviewItem(r2, round.board.id, {
        proposalId: round.proposal.id,
        severity: "major",
        title: "Period",
        body: "Check",
        anchor: { ...anchor, from: text.length, to: text.length + 5 },
      }),
    ).rejects.toMatchObject({
      status: 422,
      message: expect.stringContaining("lies outside the dossier text"),
    });
    await expect(
      createReviewItem(r2, round.board.id, {
        proposalId: round.proposal.id,
        severity: "major",
        title: "Period",
        body: "Check",
        anchor: { ...anchor, quote: "96.5 minutes" },
      }),
    ).rejects.toMatchObject({
      status: 422,
    });
    expect(await db().select().from(reviewItems).where(eq(reviewItems.proposalId, round.proposal.id))).toEqual([]);

    // Offsets a little off (the browser's text differs): found again by quote and context.
    const item = await createReviewItem(r2, round.board.id, {
      proposalId: round.proposal.id,
      severity: "major",
      title: "Period disagrees with altitude",
      body: "At 550 km the period is about 95.7 minutes.",
      anchor: { ...anchor, from: anchor.from + 3, to: anchor.to + 3 },
    });
    expect(item.anchor).toMatchObject({ from, to: from + 12, quote: "95.6 minutes" });
    expect(item.authorLabel).toMatch(/\(you\)$/);

    // Visibility: the chair sees it; the other reviewer only after submitting their own (board shares); the proposer only after a decision.
    expect((await listReviewItems(asSessionUser(round.chair), round.board.id, round.proposal.id)).map((i) => i.authorLabel)).toEqual([
      `Reviewer 1 · ${round.reviewer2.name}`,
    ]);
    expect(await listReviewItems(asSessionUser(round.reviewer3), round.board.id, round.proposal.id)).toEqual([]);
    expect(await status(getReviewItem(asSessionUser(round.reviewer3), round.board.id, item.id))).toBe(404);
    expect(await listReviewItems(asSessionUser(round.proposer), round.board.id, round.proposal.id)).toEqual([]);

    const r3 = asSessionUser(round.reviewer3);
    const saved = await saveReviewDraft(r3, round.board.id, created[1]!.assignmentId, { revision: 0, scores: fullScores(4, 4, 4), summary: "" });
    await submitReview(r3, round.board.id, created[1]!.assignmentId, { revision: saved.revision });
    expect((await listReviewItems(r3, round.board.id, round.proposal.id)).map((i) => i.authorLabel)).toEqual(["Reviewer 1"]);
    await replyToReviewItem(r3, round.board.id, item.id, { body: "Agreed; 95.7 min with the standard Earth radius." });

    // After a decision on the version, the proposer sees the item with reviewers numbered, never named.
    await db().insert(decisions).values({
      boardId: round.board.id,
      proposalId: round.proposal.id,
      versionId: round.version.id,
      outcome: "revise",
      letter: {},
      letterHtml: "",
      letterText: "",
    });
    const seen = await listReviewItems(asSessionUser(round.proposer), round.board.id, round.proposal.id);
    expect(seen).toHaveLength(1);
    expect(seen[0]!.authorLabel).toBe("Reviewer 1");
    expect(seen[0]!.replies.map((r) => r.authorLabel)).toEqual(["Reviewer 2"]);
    expect(JSON.stringify(seen)).not.toContain(round.reviewer2.name);
    const replied = await replyToReviewItem(asSessionUser(round.proposer), round.board.id, item.id, { body: "Corrected in version 2." });
    expect(replied.replies.at(-1)!.authorLabel).toMatch(/\(you\)$/);
    expect((await getReviewItem(r2, round.board.id, item.id)).replies.at(-1)!.authorLabel).toBe(round.proposer.name);

    expect(await status(setReviewItemStatus(r3, round.board.id, item.id, { status: "resolved" }))).toBe(403);
    expect((await setReviewItemStatus(asSessionUser(round.chair), round.board.id, item.id, { status: "resolved" })).status).toBe("resolved");
  });

  it("hides proposers' names from reviewers when the board says so, and keeps items private when it does not share", async () => {
    const round = await createReviewRound({ hideProposerNames: true, shareItems: false });
    const { created } = await assignReviewers(asSessionUser(round.chair), round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id, round.reviewer3.id],
      dueAt: inFuture(),
      confirmLikelyConflicts: false,
    });
    const screen = await getReviewScreen(asSessionUser(round.reviewer2), round.board.id, created[0]!.assignmentId);
    expect(screen.proposal.proposerName).toBeNull();
    expect((await getReviewScreen(asSessionUser(round.chair), round.board.id, created[0]!.assignmentId)).proposal.proposerName).toBe(round.proposer.name);

    const text = dossierPlainText(dossierDocument(round.proposal.title));
    const from = text.indexOf("141 m/s");
    await createReviewItem(asSessionUser(round.reviewer2), round.board.id, {
      proposalId: round.proposal.id,
      severity: "minor",
      title: "Δv",
      body: "Recheck.",
      anchor: makeAnchor(text, from, from + 7),
    });
    const r3 = asSessionUser(round.reviewer3);
    const saved = await saveReviewDraft(r3, round.board.id, created[1]!.assignmentId, { revision: 0, scores: fullScores(4, 4, 4), summary: "" });
    await submitReview(r3, round.board.id, created[1]!.assignmentId, { revision: saved.revision });
    expect(await listReviewItems(r3, round.board.id, round.proposal.id)).toEqual([]);
    // A submitted reviewer cannot raise more items until reopened.
    expect(
      await status(
        createReviewItem(r3, round.board.id, {
          proposalId: round.proposal.id,
          severity: "comment",
          title: "x",
          body: "y",
          anchor: makeAnchor(text, from, from + 7),
        }),
      ),
    ).toBe(409);
    // An unassigned reviewer cannot open the proposal at all.
    const stranger = await createUser();
    const { addMember } = await import("../support/factories");
    await addMember(round.board.id, stranger.id, "reviewer");
    expect(await status(listReviewItems(asSessionUser(stranger), round.board.id, round.proposal.id))).toBe(404);
    const templates = await db().select().from(rubricTemplates).where(eq(rubricTemplates.callId, round.call.id));
    expect(templates).toHaveLength(1);
  });
});
