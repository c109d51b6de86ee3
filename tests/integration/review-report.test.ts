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
import { boards, checkResults, outboxMessages, proposals, reviewItemReplies, users } from "@/db/schema";
import { createDecision, letterObjectKey } from "@/lib/dal/decisions";
import { getReviewReport, getReviewReportPdf, reportObjectKey } from "@/lib/dal/reports";
import { statObjectOrNull } from "@/storage/object-store";
import { caughtFor, deliver } from "./outbox-support";
import { formatDateTime } from "@/lib/format/dates";
import { isAppError } from "@/lib/errors";
import { renderReportDocument } from "@/lib/reports/html";
import { CLOSES_QUESTION, FILE_QUESTION, NUMBERS_QUESTION, REPORT_SECTIONS } from "@/lib/reports/review-report";
import { appUrl } from "../support/app";
import { asSessionUser, unique } from "../support/factories";
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
    // No calibration in the product yet: raw figures only, never an empty "calibrated" column.
    expect(report.scores.calibration).toBeNull();
    expect(html).not.toContain("Calibrated mean");
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
    const bad = await chair.request(`${path}?format=docx`);
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { error: string }).error).toMatch(/html, pdf or json/);
  });
});
