// The review report of a version (issue 16 C) against real PostgreSQL: its sections (scores
// by criterion, review items, orbit checks with flags, hints, requirement verdicts and the
// question each answers, the two-body caution, changes since the previous version), who may
// read it, the blind rules per reader, the PDF's text (extracted with pdf-parse) and the API's
// answers by ?format= and Accept.
import { createRequire } from "node:module";
import crypto from "node:crypto";
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import {
  assignments,
  boards,
  checkResults,
  outboxMessages,
  proposals,
  proposalVersions,
  responseWindows,
  reviewItemAnswers,
  reviewItemDispositions,
  reviewItemReplies,
  reviews,
  users,
} from "@/db/schema";
import { calibrateScores } from "@/lib/review/calibration";
import { createDecision, letterObjectKey } from "@/lib/decisions";
import { getReviewReport, getReviewReportPdf, reportObjectKey } from "@/lib/dal/reports";
import { statObjectOrNull } from "@/storage/object-store";
import { caughtFor, deliver } from "./outbox-support";
import { formatDateTime } from "@/lib/format/dates";
import { isAppError } from "@/lib/errors";
import { renderReportDocument } from "@/lib/reports/html";
import { CLOSES_QUESTION, FILE_QUESTION, NUMBERS_QUESTION, REPORT_SECTIONS } from "@/lib/reports/review-report";
import { appUrl } from "../support/app";
import { addMember, asSessionUser, createUser, unique } from "../support/factories";
import { HttpClient } from "../support/http";
import { addVersion, decisionScenario, dossierDoc, parkingOrbitBlock } from "./decision-fixtures";

const pdfParse = createRequire(import.meta.url)("pdf-parse/lib/pdf-parse.js") as (data: Buffer) => Promise<{ text: string; numpages: number }>;

const letter = { type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text: "Decision on {{proposal.title}}." }] }] };
type Person = { id: string; name: string; email: string; isAdmin: boolean };
const CAUTION = "Two-body screening estimates, not flight-qualified analysis.";

async function status(promise: Promise<unknown>): Promise<number> {
  try {
    await promise;
  } catch (error) {
    if (isAppError(error)) return error.status;
    throw error;
  }
  return 200;
}

/** The cast's default names ("Reviewer", "Proposer") would hide a leak behind the report's own labels: give everyone a name of their own. */
async function named<T extends { reviewer: Person; reviewer2: Person; proposer: Person; chair: Person }>(s: T): Promise<T> {
  const out = { ...s };
  for (const [key, first] of [
    ["reviewer", "Ines Halvorsen"],
    ["reviewer2", "Tomas Okafor"],
    ["proposer", "Marit Casellas"],
    ["chair", "Yuki Brandt"],
  ] as const) {
    const name = `${first} ${unique("n").slice(-6)}`;
    await db().update(users).set({ name }).where(eq(users.id, s[key].id));
    out[key] = { ...s[key], name } as T[typeof key];
  }
  return out;
}

/** The decision fixture plus what the report shows beyond it: a reply, a requirement verdict, a hint and a file comparison. */
async function scenario() {
  const s = await named(await decisionScenario());
  await db()
    .insert(reviewItemReplies)
    .values({ reviewItemId: s.items.major.id, authorId: s.proposer.id, body: "The period in the table used minutes; fixed in the next version." });
  const [drift] = await db()
    .select({ id: checkResults.id, result: checkResults.result })
    .from(checkResults)
    .where(and(eq(checkResults.versionId, s.version.id), eq(checkResults.blockId, s.blockIds.transferId)));
  const result = drift!.result as { checks: Record<string, unknown>[] };
  result.checks[0] = { ...result.checks[0], allowance: 5.86, basis: "relative", hint: { code: "solar-day" } };
  await db()
    .update(checkResults)
    .set({
      result,
      contractVersion: 2,
      tolerance: { relative: 0.001 },
      requirements: [
        {
          requirementId: crypto.randomUUID(),
          type: "minLifetime",
          title: "Orbit lifetime at least 2 years",
          status: "notMet",
          reason: "the drift orbit decays in 1.2 years",
          rows: [],
        },
      ],
    })
    .where(eq(checkResults.id, drift!.id));
  await db()
    .insert(checkResults)
    .values({
      versionId: s.version.id,
      boardId: s.board.id,
      blockId: `file:${s.blockIds.parkingId}:${crypto.randomUUID()}`,
      label: "the parking orbit against parking.opm",
      kind: "fileAgainstText",
      status: "inconsistent",
      claim: { blockId: s.blockIds.parkingId, filename: "parking.opm" },
      result: {
        kind: "fileAgainstText",
        question: FILE_QUESTION,
        status: "inconsistent",
        computed: {},
        checks: [{ quantity: "periapsisAltitude", claimed: 500, computed: 512.4, unit: "km", ok: false }],
        messages: [],
      },
    });
  return s;
}

describe("the review report", () => {
  it("gives the chair every section: raw scores by criterion, items with their discussion, checks with flags, hints and the question each verdict answers", async () => {
    const s = await scenario();
    const report = await getReviewReport(asSessionUser(s.chair), s.board.id, s.proposal.id, 1);
    expect(report.audience).toBe("chair");
    // Mission return: 4 and 4; feasibility: 3 and 5 (decision-fixtures.ts).
    expect(report.scores.perCriterion.map((c) => [c.title, c.rawMean, c.min, c.max])).toEqual([
      ["Mission return", 4, 4, 4],
      ["Feasibility", 4, 3, 5],
    ]);
    expect(report.scores.overall.rawMean).toBeCloseTo(4.0, 10);
    expect(report.scores.overall.spread).toBeCloseTo(0.8 / Math.SQRT2, 10);
    expect(report.scores.reviews.map((r) => r.reviewerLabel)).toEqual([`Reviewer 1 · ${s.reviewer.name}`, `Reviewer 2 · ${s.reviewer2.name}`]);
    expect(report.proposal.proposerName).toBe(s.proposer.name);
    expect(report.items.map((i) => [i.severity, i.title, i.authorLabel])).toEqual([
      ["major", "Drift orbit period", `Reviewer 1 · ${s.reviewer.name}`],
      ["minor", "Eclipse season", `Reviewer 2 · ${s.reviewer2.name}`],
    ]);
    expect(report.items[0]!.replies.map((r) => [r.authorLabel, r.body])).toEqual([
      [s.proposer.name, "The period in the table used minutes; fixed in the next version."],
    ]);
    expect(report.checks.map((c) => [c.label, c.status])).toEqual([
      ["the parking orbit", "consistent"],
      ["the drift orbit", "inconsistent"],
    ]);
    const driftRow = report.checks[1]!.rows[0]!;
    expect(driftRow).toMatchObject({ quantity: "Orbital period", claimed: "6100 s", computed: "5863.69 s", verdict: "outside" });
    expect(driftRow.hint).toMatch(/solar day/);
    expect(report.requirements).toEqual([
      { claimLabel: "the drift orbit", title: "Orbit lifetime at least 2 years", status: "notMet", reason: "the drift orbit decays in 1.2 years" },
    ]);
    expect(report.fileChecks.map((c) => [c.label, c.status])).toEqual([["the parking orbit against parking.opm", "inconsistent"]]);
    expect(report.changes).toBeNull();
    expect(report.notice).toContain(CAUTION);

    const html = renderReportDocument(report, formatDateTime);
    for (const title of Object.values(REPORT_SECTIONS)) expect(html).toContain(title);
    expect(html).toContain("Raw mean");
    expect(html).toContain(`Verdict: inconsistent. Answers: ${NUMBERS_QUESTION}`);
    expect(html).toContain(`Requirement verdicts (each answers: ${CLOSES_QUESTION})`);
    expect(html).toContain(`Answers: ${FILE_QUESTION}`);
    expect(html).toContain("outside — flagged");
    expect(html).toContain(CAUTION);
    expect(html).toContain("This is the first version");
    expect(html).toContain(`Reviewer 1 · ${s.reviewer.name}`);
    expect(html).not.toMatch(/<script/i);
    // One reviewed proposal in the call: its calibrated means are its raw means (the proposal effect absorbs the reviewers').
    expect(report.scores.calibration).not.toBeNull();
    expect(report.scores.overall.calibratedMean).toBeCloseTo(4.0, 10);
    expect(report.scores.perCriterion.map((c) => c.calibratedMean)).toEqual([expect.closeTo(4, 10), expect.closeTo(4, 10)]);
    expect(html).toContain("Calibrated mean");
  });

  it("lets proposers read it only once their version is decided, and never names the reviewers to them", async () => {
    const s = await scenario();
    const proposer = asSessionUser(s.proposer);
    expect(await status(getReviewReport(proposer, s.board.id, s.proposal.id, 1))).toBe(404);
    await createDecision(asSessionUser(s.chair), s.board.id, s.proposal.id, { outcome: "revise", letter });
    const report = await getReviewReport(proposer, s.board.id, s.proposal.id, 1);
    expect(report.audience).toBe("proposer");
    expect(report.decision?.outcomeLabel).toBe("revise and resubmit");
    expect(report.scores.reviews.map((r) => r.reviewerLabel)).toEqual(["Reviewer 1", "Reviewer 2"]);
    const html = renderReportDocument(report, formatDateTime);
    const pdf = (await pdfParse((await getReviewReportPdf(proposer, s.board.id, s.proposal.id, 1)).pdf)).text;
    for (const text of [html, pdf, JSON.stringify(report)]) {
      expect(text).not.toContain(s.reviewer.name);
      expect(text).not.toContain(s.reviewer2.name);
      expect(text).not.toContain(s.reviewer.email);
      expect(text).toContain("Reviewer 2");
    }
  });

  it("follows the board's rules for reviewers: own review submitted and items shared; others numbered; proposers hidden on a blind board", async () => {
    const s = await scenario();
    await db().update(boards).set({ hideProposerNames: true }).where(eq(boards.id, s.board.id));
    const reviewer = asSessionUser(s.reviewer);
    const report = await getReviewReport(reviewer, s.board.id, s.proposal.id, 1);
    expect(report.audience).toBe("reviewer");
    expect(report.scores.reviews.map((r) => r.reviewerLabel)).toEqual(["Reviewer 1 (you)", "Reviewer 2"]);
    expect(report.proposal.proposerName).toBeNull();
    expect(report.items[0]!.replies[0]!.authorLabel).toBe("Proposer");
    const html = renderReportDocument(report, formatDateTime);
    const pdf = (await pdfParse((await getReviewReportPdf(reviewer, s.board.id, s.proposal.id, 1)).pdf)).text;
    for (const text of [html, pdf]) {
      expect(text).not.toContain(s.reviewer2.name);
      expect(text).not.toContain(s.proposer.name);
      expect(text).not.toContain(s.proposer.email);
    }
    // The board keeps items among reviewers private: the report stays with the chair.
    await db().update(boards).set({ shareReviewItemsAfterSubmit: false }).where(eq(boards.id, s.board.id));
    expect(await status(getReviewReport(reviewer, s.board.id, s.proposal.id, 1))).toBe(404);
  });

  it("is refused to a reviewer whose review is still a draft, to other boards, and for a version that does not exist", async () => {
    const s = await named(await decisionScenario({ submitted: 1 }));
    expect(await status(getReviewReport(asSessionUser(s.reviewer2), s.board.id, s.proposal.id, 1))).toBe(404);
    expect(await status(getReviewReport(asSessionUser(s.reviewer), s.board.id, s.proposal.id, 1))).toBe(200);
    expect(await status(getReviewReport(asSessionUser(s.outsider), s.board.id, s.proposal.id, 1))).toBe(404);
    expect(await status(getReviewReport(asSessionUser(s.chair), s.board.id, s.proposal.id, 7))).toBe(404);
    expect(await status(getReviewReport(asSessionUser(s.admin), s.board.id, s.proposal.id, 1))).toBe(200);
  });

  it("lists the changes since the previous version with the version comparison's pairing of claims", async () => {
    const s = await scenario();
    await createDecision(asSessionUser(s.chair), s.board.id, s.proposal.id, { outcome: "revise", letter });
    await addVersion(
      s.board,
      s.proposal,
      2,
      dossierDoc("The relay rides a higher parking orbit before the transfer burn, with eclipse seasons modelled.", [
        parkingOrbitBlock(s.blockIds.parkingId, "the parking orbit", 5864),
      ]),
      [{ blockId: s.blockIds.parkingId, label: "the parking orbit", status: "consistent", claimedPeriod: 5864, computedPeriod: 5863.69 }],
      s.proposer.id,
    );
    await db().update(proposals).set({ status: "submitted", latestVersion: 2 }).where(eq(proposals.id, s.proposal.id));
    const report = await getReviewReport(asSessionUser(s.chair), s.board.id, s.proposal.id, 2);
    expect(report.changes).not.toBeNull();
    expect(report.changes!.previousNumber).toBe(1);
    expect(report.changes!.wordsAdded).toBeGreaterThan(0);
    expect(report.changes!.claims.map((c) => [c.label, c.change])).toEqual([
      ["the parking orbit", "values changed"],
      ["the drift orbit", "removed"],
    ]);
    expect(report.changes!.claims[0]!.details).toEqual(["Orbital period claimed 5827 s, now 5864 s"]);
    expect(report.changes!.passages.some((p) => p.kind === "added" && p.text.includes("higher"))).toBe(true);
    const pdf = (await pdfParse((await getReviewReportPdf(asSessionUser(s.chair), s.board.id, s.proposal.id, 2)).pdf)).text;
    expect(pdf).toContain(REPORT_SECTIONS.changes);
    expect(pdf).toContain("Compared with version 1");
  });

  it("draws the PDF with every section, the verdicts' questions and the two-body caution (text extracted with pdf-parse)", async () => {
    const s = await scenario();
    const { pdf, filename } = await getReviewReportPdf(asSessionUser(s.chair), s.board.id, s.proposal.id, 1);
    expect(filename).toMatch(/^review-report-selene-relay-pathfinder-[0-9a-f]+-v1\.pdf$/);
    expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
    const text = (await pdfParse(pdf)).text.replace(/\s+/g, " ");
    for (const title of Object.values(REPORT_SECTIONS)) expect(text).toContain(title);
    for (const words of [
      NUMBERS_QUESTION,
      CLOSES_QUESTION,
      FILE_QUESTION,
      "Mission return",
      "Feasibility",
      "Drift orbit period",
      "Orbit lifetime at least 2 years",
      "not met",
    ])
      expect(text).toContain(words);
    expect(text).toContain(CAUTION);
    expect(text).toContain(s.reviewer.name);
  });
});

/**
 * Two more proposals in the scenario's call, scored by the scenario's second reviewer and a
 * third one, so that the call's calibration has something to fit: the second reviewer scores
 * two points above the third on both.
 */
async function otherProposalsInTheCall(s: Awaited<ReturnType<typeof scenario>>) {
  const third = await createUser({ name: `Lena Vasquez ${unique("n").slice(-6)}` });
  await addMember(s.board.id, third.id, "reviewer");
  const observations: { proposalId: string; reviewerId: string; total: number; science: number; feasibility: number }[] = [];
  for (const [title, lenient, strict] of [
    ["Tarn weather sounder", 5, 3],
    ["Fjell ice mapper", 4.6, 2.6],
  ] as const) {
    const [proposal] = await db()
      .insert(proposals)
      .values({
        boardId: s.board.id,
        callId: s.call.id,
        ownerId: s.proposer.id,
        title: unique(title),
        missionType: "earth observation",
        status: "in_review",
        latestVersion: 1,
      })
      .returning();
    const [version] = await db()
      .insert(proposalVersions)
      .values({
        proposalId: proposal!.id,
        boardId: s.board.id,
        number: 1,
        title: proposal!.title,
        document: { type: "doc", content: [] },
        documentKey: `boards/${s.board.id}/proposals/${proposal!.id}/versions/1/document.json`,
        htmlKey: `boards/${s.board.id}/proposals/${proposal!.id}/versions/1/document.html`,
        submittedBy: s.proposer.id,
      })
      .returning();
    for (const [reviewer, total] of [
      [s.reviewer2, lenient],
      [third, strict],
    ] as const) {
      const [a] = await db()
        .insert(assignments)
        .values({
          boardId: s.board.id,
          proposalId: proposal!.id,
          versionId: version!.id,
          reviewerId: reviewer.id,
          dueAt: new Date(Date.now() + 86_400_000),
          assignedBy: s.chair.id,
        })
        .returning();
      const science = Math.round(total);
      const feasibility = Math.max(1, Math.round(total) - 1);
      await db()
        .insert(reviews)
        .values({
          assignmentId: a!.id,
          boardId: s.board.id,
          proposalId: proposal!.id,
          versionId: version!.id,
          reviewerId: reviewer.id,
          rubricTemplateId: s.rubric.id,
          scores: { science: { score: science, comment: "" }, feasibility: { score: feasibility, comment: "" } },
          weightedTotal: total,
          status: "submitted",
          submittedAt: new Date(),
        });
      observations.push({ proposalId: proposal!.id, reviewerId: reviewer.id, total, science, feasibility });
    }
  }
  // The scenario's own proposal (decision-fixtures.ts): totals 3.6 and 4.4; feasibility 3 and 5; mission return 4 and 4.
  observations.push({ proposalId: s.proposal.id, reviewerId: s.reviewer.id, total: 3.6, science: 4, feasibility: 3 });
  observations.push({ proposalId: s.proposal.id, reviewerId: s.reviewer2.id, total: 4.4, science: 4, feasibility: 5 });
  return observations;
}

describe("the review report: calibrated scores, confidence, answers and dispositions", () => {
  it("shows calibrated means beside the raw ones, computed over the whole call with the panel's calibration", async () => {
    const s = await scenario();
    const observations = await otherProposalsInTheCall(s);
    const chair = await getReviewReport(asSessionUser(s.chair), s.board.id, s.proposal.id, 1);
    // The same observations through lib/review/calibration.ts (its arithmetic is checked against a hand-worked example there).
    const expected = (pick: (o: (typeof observations)[number]) => number) =>
      calibrateScores(observations.map((o) => ({ proposalId: o.proposalId, reviewerId: o.reviewerId, score: pick(o) }))).proposals.find(
        (p) => p.proposalId === s.proposal.id,
      )!.calibratedMean;
    expect(chair.scores.calibration).not.toBeNull();
    expect(chair.scores.calibration!.proposals).toBe(3);
    expect(chair.scores.overall.rawMean).toBeCloseTo(4.0, 10);
    expect(chair.scores.overall.calibratedMean).toBeCloseTo(
      expected((o) => o.total),
      10,
    );
    // The second reviewer scores high across the call, so taking out their leniency lowers this proposal's mean.
    expect(chair.scores.overall.calibratedMean!).toBeLessThan(4.0);
    expect(chair.scores.perCriterion.map((c) => c.title)).toEqual(["Mission return", "Feasibility"]);
    expect(chair.scores.perCriterion[0]!.calibratedMean).toBeCloseTo(
      expected((o) => o.science),
      10,
    );
    expect(chair.scores.perCriterion[1]!.calibratedMean).toBeCloseTo(
      expected((o) => o.feasibility),
      10,
    );
    const html = renderReportDocument(chair, formatDateTime);
    expect(html).toContain("Scores by criterion, raw and calibrated");
    expect(html).toContain("Calibrated mean");
    expect(html).toContain("ridge, λ = 2");
    const pdf = (await pdfParse((await getReviewReportPdf(asSessionUser(s.chair), s.board.id, s.proposal.id, 1)).pdf)).text;
    expect(pdf).toContain("Calibrated mean");
    expect(pdf).toContain(chair.scores.overall.calibratedMean!.toFixed(2));
  });

  it("shows the reviewers' confidence and expertise to the chair only", async () => {
    const s = await scenario();
    await db().update(reviews).set({ confidence: "high", expertise: "medium" }).where(eq(reviews.assignmentId, s.assignments[0]!.id));
    const chair = await getReviewReport(asSessionUser(s.chair), s.board.id, s.proposal.id, 1);
    expect(chair.scores.reviews.map((r) => [r.confidence, r.expertise])).toEqual([
      ["high", "medium"],
      [null, null],
    ]);
    const html = renderReportDocument(chair, formatDateTime);
    expect(html).toContain(">Confidence<");
    expect(html).toContain(">not stated<");
    await createDecision(asSessionUser(s.chair), s.board.id, s.proposal.id, { outcome: "revise", letter });
    const theirs = await getReviewReport(asSessionUser(s.proposer), s.board.id, s.proposal.id, 1);
    expect(theirs.scores.reviews.map((r) => [r.confidence, r.expertise])).toEqual([
      [null, null],
      [null, null],
    ]);
    expect(renderReportDocument(theirs, formatDateTime)).not.toContain(">Confidence<");
  });

  it("lists each item's answer and its disposition history (who, when, why), with names as the reader may see them", async () => {
    const s = await scenario();
    const [window] = await db()
      .insert(responseWindows)
      .values({
        boardId: s.board.id,
        callId: s.call.id,
        opensAt: new Date(Date.now() - 2 * 86_400_000),
        closesAt: new Date(Date.now() - 86_400_000),
        openedBy: s.chair.id,
      })
      .returning();
    await db().insert(reviewItemAnswers).values({
      boardId: s.board.id,
      reviewItemId: s.items.major.id,
      windowId: window!.id,
      authorId: s.proposer.id,
      body: "The period was computed with a solar day; version 2 uses the sidereal day.",
    });
    await db()
      .insert(reviewItemDispositions)
      .values([
        {
          boardId: s.board.id,
          reviewItemId: s.items.major.id,
          disposition: "fix-next-version",
          reason: "The answer is right; the table must change.",
          actorId: s.reviewer.id,
          actorRole: "reviewer",
          createdAt: new Date(Date.now() - 3_600_000),
        },
        {
          boardId: s.board.id,
          reviewItemId: s.items.major.id,
          disposition: "closed",
          reason: "Settled in the panel meeting.",
          actorId: s.chair.id,
          actorRole: "chair",
        },
      ]);
    const chair = await getReviewReport(asSessionUser(s.chair), s.board.id, s.proposal.id, 1);
    const major = chair.items[0]!;
    expect(major.answer).toMatchObject({
      authorLabel: s.proposer.name,
      body: "The period was computed with a solar day; version 2 uses the sidereal day.",
      pointsAt: null,
    });
    expect(major.dispositions.map((d) => [d.label, d.actorLabel, d.reason])).toEqual([
      ["Will be fixed in the next version", `Reviewer 1 · ${s.reviewer.name}`, "The answer is right; the table must change."],
      ["Closed", `Chair · ${s.chair.name}`, "Settled in the panel meeting."],
    ]);
    expect(chair.items[1]!.answer).toBeNull();
    expect(chair.items[1]!.dispositions).toEqual([]);
    const html = renderReportDocument(chair, formatDateTime);
    expect(html).toContain("Disposition history of item 1");
    expect(html).toContain("Closed — Settled in the panel meeting.");
    expect(html).toContain(`Answer by ${s.proposer.name}`);
    expect(html).toContain("No answer from the proposers.");

    await createDecision(asSessionUser(s.chair), s.board.id, s.proposal.id, { outcome: "revise", letter });
    const theirs = await getReviewReport(asSessionUser(s.proposer), s.board.id, s.proposal.id, 1);
    expect(theirs.items[0]!.dispositions.map((d) => d.actorLabel)).toEqual(["Reviewer 1", "Chair"]);
    const pdf = (await pdfParse((await getReviewReportPdf(asSessionUser(s.proposer), s.board.id, s.proposal.id, 1)).pdf)).text.replace(/\s+/g, " ");
    expect(pdf).toContain("Disposition history of item 1");
    expect(pdf).toContain("Will be fixed in the next version");
    expect(pdf).toContain("version 2 uses the sidereal day");
    expect(pdf).not.toContain(s.reviewer.name);
    expect(pdf).not.toContain(s.chair.name);
  });
});

describe("the review report with the decision letter", () => {
  it("goes with the letter e-mail when the chair ticks it: stored like the letter, two PDFs in the mail catcher, reviewers not named", async () => {
    const s = await scenario();
    const view = await createDecision(asSessionUser(s.chair), s.board.id, s.proposal.id, { outcome: "accept", letter, attachReport: true });
    expect(view.hasReportPdf).toBe(true);
    const key = reportObjectKey(s.board.id, s.proposal.id, view.id);
    expect((await statObjectOrNull(key))?.size).toBeGreaterThan(1000);
    const [message] = await db()
      .select()
      .from(outboxMessages)
      .where(eq(outboxMessages.dedupeKey, `decision:${view.id}`));
    expect(message!.attachments.map((a) => [a.objectKey, a.contentType])).toEqual([
      [letterObjectKey(s.board.id, s.proposal.id, view.id), "application/pdf"],
      [key, "application/pdf"],
    ]);
    await deliver([message!.id]);
    const caught = await caughtFor(message!.id);
    expect(caught).toHaveLength(1);
    expect(caught[0]!.attachments.map((a) => [a.filename, a.contentType])).toEqual([
      [expect.stringMatching(/^decision-.*-v1\.pdf$/), "application/pdf"],
      [expect.stringMatching(/^review-report-selene-relay-pathfinder-[0-9a-f]+-v1\.pdf$/), "application/pdf"],
    ]);
    const text = (await pdfParse(Buffer.from(caught[0]!.attachments[1]!.contentBase64, "base64"))).text.replace(/\s+/g, " ");
    for (const title of Object.values(REPORT_SECTIONS)) expect(text).toContain(title);
    expect(text).toContain("accept");
    expect(text).toContain("Reviewer 1");
    expect(text).not.toContain(s.reviewer.name);
    expect(text).not.toContain(s.reviewer2.name);
    expect(text).toContain(CAUTION);
  });

  it("sends the letter alone when the box is left unticked", async () => {
    const s = await scenario();
    const view = await createDecision(asSessionUser(s.chair), s.board.id, s.proposal.id, { outcome: "decline", letter });
    expect(view.hasReportPdf).toBe(false);
    expect(await statObjectOrNull(reportObjectKey(s.board.id, s.proposal.id, view.id))).toBeNull();
    const [message] = await db()
      .select()
      .from(outboxMessages)
      .where(eq(outboxMessages.dedupeKey, `decision:${view.id}`));
    expect(message!.attachments).toHaveLength(1);
  });
});

describe("the review report over HTTP", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("answers HTML by default, PDF and JSON by ?format= or Accept, and refuses an unknown format with 400", async () => {
    const s = await scenario();
    const chair = await new HttpClient().signInAs(s.chair.email);
    const path = `/api/v1/boards/${s.board.id}/proposals/${s.proposal.id}/versions/1/report`;
    const html = await chair.request(path);
    expect(html.status).toBe(200);
    expect(html.headers.get("content-type")).toMatch(/^text\/html/);
    expect(html.headers.get("content-security-policy")).toMatch(/default-src 'none'/);
    const body = await html.text();
    expect(body).toContain(REPORT_SECTIONS.scores);
    expect(body).toContain(CAUTION);
    const pdf = await chair.request(path, { headers: { accept: "application/pdf" } });
    expect(pdf.status).toBe(200);
    expect(pdf.headers.get("content-type")).toBe("application/pdf");
    expect(pdf.headers.get("content-disposition")).toMatch(/attachment; filename="review-report-.*-v1\.pdf"/);
    expect((await pdfParse(Buffer.from(await pdf.arrayBuffer()))).text).toContain(REPORT_SECTIONS.items);
    const asJson = await chair.request(`${path}?format=json`);
    expect(asJson.status).toBe(200);
    expect(((await asJson.json()) as { report: { version: { number: number } } }).report.version.number).toBe(1);
    // A reviewer of the version (own review submitted, the board shares items) reaches it from their review page.
    const reviewer = await new HttpClient().signInAs(s.reviewer.email);
    const reviewPage = await (await reviewer.request(`/boards/${s.board.id}/proposals/${s.proposal.id}/review`)).text();
    expect(reviewPage).toContain(`href="/boards/${s.board.id}/proposals/${s.proposal.id}/versions/1/report"`);
    expect((await reviewer.request(path)).status).toBe(200);
    const bad = await chair.request(`${path}?format=docx`);
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { error: string }).error).toMatch(/html, pdf or json/);
  });
});
