// Decisions through the data-access layer against real PostgreSQL, the S3 store and the mail
// catcher: validation (twice, unknown merge field, missing reviews with and without an
// override), the one-transaction write with its outbox message and PDF, the PDF's text
// (extracted with pdf-parse), resubmission, version comparison and re-assignment.
import { createRequire } from "node:module";
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { assignments, auditEvents, decisions, outboxMessages, proposalDrafts, proposals } from "@/db/schema";
import {
  compareVersions,
  createDecision,
  decisionLetterUrl,
  getDecision,
  getDecisionWorkspace,
  getLetterTemplate,
  letterObjectKey,
  previewDecision,
  saveLetterTemplate,
} from "@/lib/decisions";
import { reassignPreviousReviewers } from "@/lib/review/reassign";
import { getReviewScreen, listReviewQueue, saveReviewDraft } from "@/lib/dal/reviews";
import { DEFAULT_LETTER_TEMPLATE } from "@/lib/decisions/template";
import { isAppError } from "@/lib/errors";
import { readObject, statObjectOrNull } from "@/storage/object-store";
import { asSessionUser } from "../support/factories";
import { addVersion, decisionScenario, dossierDoc, parkingOrbitBlock } from "./decision-fixtures";
import { caughtFor, deliver } from "./outbox-support";
import { formatDate } from "@/lib/format/dates";

const pdfParse = createRequire(import.meta.url)("pdf-parse/lib/pdf-parse.js") as (data: Buffer) => Promise<{ text: string; numpages: number }>;

async function failure(promise: Promise<unknown>): Promise<{ status: number; message: string; details: unknown }> {
  try {
    await promise;
  } catch (error) {
    if (isAppError(error)) return { status: error.status, message: error.message, details: error.details };
    throw error;
  }
  throw new Error("expected the call to fail");
}

const letter = (text: string) => ({ type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text }] }] });

describe("deciding on a proposal", () => {
  it("shows the chair the scores, reviews, open items and orbit-check flags of the version under decision", async () => {
    const s = await decisionScenario();
    const w = await getDecisionWorkspace(asSessionUser(s.chair), s.board.id, s.proposal.id);
    expect(w.version?.number).toBe(1);
    expect(w.aggregate.count).toBe(2);
    expect(w.aggregate.weightedMean).toBeCloseTo(4.0, 10);
    // Sample standard deviation of 3.6 and 4.4 (n − 1 = 1): |4.4 − 3.6| / √2.
    expect(w.aggregate.spread).toBeCloseTo(0.8 / Math.SQRT2, 10);
    expect(w.reviews.map((r) => r.status)).toEqual(["submitted", "submitted"]);
    expect(w.reviewItems.map((i) => [i.severity, i.status])).toEqual([
      ["major", "open"],
      ["minor", "open"],
    ]);
    expect(w.checks.map((c) => [c.label, c.status])).toEqual([
      ["the parking orbit", "consistent"],
      ["the drift orbit", "inconsistent"],
    ]);
    expect(w.blocked).toBeNull();
    expect(w.needsOverride).toBe(false);
    expect(w.template).toEqual(DEFAULT_LETTER_TEMPLATE);
    for (const who of [s.proposer, s.reviewer]) expect((await failure(getDecisionWorkspace(asSessionUser(who), s.board.id, s.proposal.id))).status).toBe(403);
    expect((await failure(getDecisionWorkspace(asSessionUser(s.outsider), s.board.id, s.proposal.id))).status).toBe(404);
  });

  it("issues the decision, the status change, the audit event and the e-mail with the PDF in one go; the letter arrives once", async () => {
    const s = await decisionScenario();
    const chair = asSessionUser(s.chair);
    const view = await createDecision(chair, s.board.id, s.proposal.id, {
      outcome: "revise",
      letter: DEFAULT_LETTER_TEMPLATE,
      selectedReviewItemIds: [s.items.major.id],
    });
    expect(view).toMatchObject({
      outcome: "revise",
      outcomeLabel: "revise and resubmit",
      versionNumber: 1,
      weightedScore: 4,
      overrideReason: null,
      hasPdf: true,
    });
    expect(view.letterText).toContain(`Dear ${s.proposer.name},`);
    expect(view.letterText).toContain("- [major] Drift orbit period: The stated period does not follow from the altitudes.");
    expect(view.letterText).not.toContain("Eclipse season");
    expect(view.letterText).toContain("The server checked the 2 orbit claims of this version and flagged 1 as inconsistent.");
    expect(view.letterHtml).toContain("<strong>revise and resubmit</strong>");

    const [proposal] = await db().select({ status: proposals.status }).from(proposals).where(eq(proposals.id, s.proposal.id));
    expect(proposal?.status).toBe("decided");
    // "revise" seeds the authors' next draft from the decided version.
    const [draft] = await db()
      .select({ basedOnVersion: proposalDrafts.basedOnVersion, document: proposalDrafts.document })
      .from(proposalDrafts)
      .where(eq(proposalDrafts.proposalId, s.proposal.id));
    expect(draft?.basedOnVersion).toBe(1);
    expect(draft?.document).toEqual(s.version.document);
    const [audit] = await db()
      .select({ details: auditEvents.details })
      .from(auditEvents)
      .where(and(eq(auditEvents.action, "decision.issue"), eq(auditEvents.target, s.proposal.id)));
    expect(audit?.details).toMatchObject({ decisionId: view.id, outcome: "revise", reviewsSubmitted: 2, reviewsRequired: 2 });

    const [message] = await db()
      .select()
      .from(outboxMessages)
      .where(eq(outboxMessages.dedupeKey, `decision:${view.id}`));
    expect(message).toMatchObject({ kind: "decision-letter", toAddresses: [s.proposer.email], status: expect.stringMatching(/queued|sending|sent/) });
    expect(message?.attachments).toEqual([
      {
        filename: expect.stringMatching(/^decision-selene-relay-pathfinder-[0-9a-f]+-v1\.pdf$/),
        objectKey: letterObjectKey(s.board.id, s.proposal.id, view.id),
        contentType: "application/pdf",
      },
    ]);

    await deliver([message!.id]);
    const caught = await caughtFor(message!.id);
    expect(caught).toHaveLength(1);
    expect(caught[0]!.to).toEqual([s.proposer.email]);
    expect(caught[0]!.subject).toBe(`Decision on “${s.proposal.title}” (version 1): revise and resubmit`);
    expect(caught[0]!.text).toContain("[major] Drift orbit period");
    // The orbit-check contract's notice travels with the decision e-mail (version 2).
    expect(caught[0]!.text).toContain("About the orbit checks: Two-body screening estimates, not flight-qualified analysis.");
    expect(caught[0]!.attachments.map((a) => a.contentType)).toEqual(["application/pdf"]);
    const attached = await pdfParse(Buffer.from(caught[0]!.attachments[0]!.contentBase64, "base64"));
    expect(attached.text).toContain("revise and resubmit");
  });

  it("closes the reviews of a decided version: the queue marks them, the screen is read-only and the server refuses writes (409)", async () => {
    const s = await decisionScenario({ submitted: 1, required: 1 });
    const draftReviewer = asSessionUser(s.reviewer2);
    const assignmentId = s.assignments[1]!.id;
    const before = await listReviewQueue(draftReviewer, s.board.id);
    expect(before.find((q) => q.assignmentId === assignmentId)?.decidedAt).toBeNull();
    await createDecision(asSessionUser(s.chair), s.board.id, s.proposal.id, { outcome: "accept", letter: DEFAULT_LETTER_TEMPLATE, selectedReviewItemIds: [] });

    const queue = await listReviewQueue(draftReviewer, s.board.id);
    const entry = queue.find((q) => q.assignmentId === assignmentId);
    expect(entry?.decidedAt).toEqual(expect.any(String));
    expect(entry?.overdue).toBe(false);
    const screen = await getReviewScreen(draftReviewer, s.board.id, assignmentId);
    expect(screen.canEdit).toBe(false);
    expect(screen.closedReason).toMatch(/^The board decided on version 1 on .+, so this review is closed/);
    const refused = await failure(
      saveReviewDraft(draftReviewer, s.board.id, assignmentId, { revision: screen.review.revision, scores: screen.review.scores, summary: "Late words" }),
    );
    expect(refused.status).toBe(409);
    expect(refused.message).toContain("can no longer be changed");
    expect(refused.details).toEqual({ closed: true });
  });

  it("draws the letter PDF with the letterhead, the merged letter and the two-body caution (text extracted with pdf-parse)", async () => {
    const s = await decisionScenario();
    const view = await createDecision(asSessionUser(s.chair), s.board.id, s.proposal.id, {
      outcome: "accept",
      letter: {
        type: "doc",
        content: [
          { type: "heading", attrs: { level: 2 }, content: [{ type: "text", text: "Decision on {{proposal.title}}" }] },
          {
            type: "paragraph",
            content: [
              { type: "text", text: "Version {{version.number}} is {{decision.outcome}}; weighted score {{score.weighted}}; Δv margins were checked." },
            ],
          },
          { type: "paragraph", content: [{ type: "text", text: "{{reviewItems.selected}}" }] },
        ],
      },
      selectedReviewItemIds: [s.items.minor.id, s.items.major.id],
    });
    const pdf = await readObject(letterObjectKey(s.board.id, s.proposal.id, view.id));
    expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
    const { text, numpages } = await pdfParse(pdf);
    expect(numpages).toBe(1);
    const flat = text.replace(/\s+/g, " ");
    expect(flat).toContain("VisViva");
    expect(flat).toContain(s.board.name);
    expect(flat).toContain(`Decision on ${s.proposal.title}`);
    expect(flat).toContain("Version 1 is accepted; weighted score 4.00; Δv margins were checked.");
    expect(flat).toContain("[major] Drift orbit period");
    expect(flat).toContain("[minor] Eclipse season");
    // The footer carries the orbit-check contract's notice (version 2).
    expect(flat).toContain("Two-body screening estimates, not flight-qualified analysis");
    expect(flat).toContain("Page 1 of 1");
    expect(flat).toContain(formatDate(view.decidedAt));

    // Authors and the chair may download it; a reviewer may not even see the decision.
    for (const who of [s.chair, s.proposer]) {
      const link = await decisionLetterUrl(asSessionUser(who), s.board.id, view.id);
      const response = await fetch(link.url);
      expect(response.status).toBe(200);
      expect(response.headers.get("content-disposition")).toContain(link.filename);
      expect(Buffer.from(await response.arrayBuffer()).equals(pdf)).toBe(true);
    }
    expect((await failure(decisionLetterUrl(asSessionUser(s.reviewer), s.board.id, view.id))).status).toBe(404);
    expect((await failure(decisionLetterUrl(asSessionUser(s.outsider), s.board.id, view.id))).status).toBe(404);
    const forProposer = await getDecision(asSessionUser(s.proposer), s.board.id, view.id);
    expect(forProposer.mail).toBeNull(); // the outbox state is the chair's business
  });

  it("refuses to decide twice (409), also when two requests race; only one PDF and one message remain", async () => {
    const s = await decisionScenario();
    const chair = asSessionUser(s.chair);
    const input = { outcome: "decline" as const, letter: letter("We decline {{proposal.title}}."), selectedReviewItemIds: [] };
    const results = await Promise.allSettled([
      createDecision(chair, s.board.id, s.proposal.id, input),
      createDecision(chair, s.board.id, s.proposal.id, input),
    ]);
    const ok = results.filter((r) => r.status === "fulfilled");
    const refused = results.filter((r): r is PromiseRejectedResult => r.status === "rejected");
    expect(ok).toHaveLength(1);
    expect(refused).toHaveLength(1);
    expect(refused[0]!.reason).toMatchObject({ status: 409 });
    const again = await failure(createDecision(chair, s.board.id, s.proposal.id, input));
    expect(again.status).toBe(409);
    expect(again.message).toMatch(/already been decided/);
    const rows = await db().select({ id: decisions.id }).from(decisions).where(eq(decisions.proposalId, s.proposal.id));
    expect(rows).toHaveLength(1);
    const messages = await db()
      .select({ id: outboxMessages.id })
      .from(outboxMessages)
      .where(eq(outboxMessages.dedupeKey, `decision:${rows[0]!.id}`));
    expect(messages).toHaveLength(1);
  });

  it("refuses a letter with an unknown merge field (422 naming it), in the preview too, and stores nothing", async () => {
    const s = await decisionScenario();
    const chair = asSessionUser(s.chair);
    const bad = {
      outcome: "accept" as const,
      letter: letter("Dear {{proposer.name}}, your {{ proposal.budget }} and {{score.median}} ..."),
      selectedReviewItemIds: [],
    };
    const refused = await failure(createDecision(chair, s.board.id, s.proposal.id, bad));
    expect(refused.status).toBe(422);
    expect(refused.message).toContain("{{proposal.budget}}");
    expect(refused.message).toContain("{{score.median}}");
    expect(refused.details).toMatchObject({ unknownFields: ["proposal.budget", "score.median"] });
    expect((await failure(previewDecision(chair, s.board.id, s.proposal.id, bad))).status).toBe(422);
    expect(await db().select({ id: decisions.id }).from(decisions).where(eq(decisions.proposalId, s.proposal.id))).toEqual([]);
    const [p] = await db().select({ status: proposals.status }).from(proposals).where(eq(proposals.id, s.proposal.id));
    expect(p?.status).toBe("in_review");
    // An empty letter is refused as well.
    expect(
      (await failure(createDecision(chair, s.board.id, s.proposal.id, { ...bad, letter: { type: "doc", content: [{ type: "paragraph" }] } }))).status,
    ).toBe(422);
  });

  it("refuses to decide without the required reviews unless the chair gives a reason, which is kept and audited", async () => {
    const s = await decisionScenario({ submitted: 1 });
    const chair = asSessionUser(s.chair);
    const input = { outcome: "accept" as const, letter: letter("Accepted: {{proposal.title}}."), selectedReviewItemIds: [] };
    const without = await failure(createDecision(chair, s.board.id, s.proposal.id, input));
    expect(without.status).toBe(422);
    expect(without.message).toMatch(/asks for 2 submitted reviews and this version has 1/);
    expect(without.details).toMatchObject({ required: 2, submitted: 1 });
    expect((await failure(createDecision(chair, s.board.id, s.proposal.id, { ...input, overrideReason: "soon" }))).status).toBe(422);
    expect((await getDecisionWorkspace(chair, s.board.id, s.proposal.id)).needsOverride).toBe(true);

    const reason = "Second reviewer withdrew; the first review and the server checks are conclusive.";
    const view = await createDecision(chair, s.board.id, s.proposal.id, { ...input, overrideReason: reason });
    expect(view.overrideReason).toBe(reason);
    const [audit] = await db()
      .select({ details: auditEvents.details })
      .from(auditEvents)
      .where(and(eq(auditEvents.action, "decision.issue"), eq(auditEvents.target, s.proposal.id)));
    expect(audit?.details).toMatchObject({ overrideReason: reason, reviewsSubmitted: 1, reviewsRequired: 2 });
  });

  it("lets only the chair decide, and deletes the stored PDF when the transaction fails", async () => {
    const s = await decisionScenario();
    const input = { outcome: "accept" as const, letter: letter("Accepted."), selectedReviewItemIds: [] };
    expect((await failure(createDecision(asSessionUser(s.proposer), s.board.id, s.proposal.id, input))).status).toBe(403);
    expect((await failure(createDecision(asSessionUser(s.reviewer), s.board.id, s.proposal.id, input))).status).toBe(403);
    expect((await failure(createDecision(asSessionUser(s.outsider), s.board.id, s.proposal.id, input))).status).toBe(404);
    expect((await failure(createDecision(asSessionUser(s.chair), s.other.id, s.proposal.id, input))).status).toBe(404);
    // A review item of another proposal is refused before anything is stored.
    const other = await decisionScenario();
    expect(
      (await failure(createDecision(asSessionUser(s.chair), s.board.id, s.proposal.id, { ...input, selectedReviewItemIds: [other.items.major.id] }))).status,
    ).toBe(422);

    // The proposal is withdrawn between the checks and the transaction: the transaction
    // refuses, and the PDF made for it is removed again.
    const chair = asSessionUser(s.chair);
    const before = new Set((await db().select({ id: decisions.id }).from(decisions)).map((d) => d.id));
    const { objectStore } = await import("@/storage/object-store");
    const original = objectStore().putObject.bind(objectStore());
    let storedKey = "";
    objectStore().putObject = (async (...args: Parameters<typeof original>) => {
      storedKey = String(args[1]);
      const result = await original(...args);
      await db().update(proposals).set({ status: "withdrawn" }).where(eq(proposals.id, s.proposal.id));
      return result;
    }) as typeof original;
    try {
      const refused = await failure(createDecision(chair, s.board.id, s.proposal.id, input));
      expect(refused.status).toBe(409);
    } finally {
      objectStore().putObject = original;
    }
    expect(storedKey).toMatch(new RegExp(`^boards/${s.board.id}/proposals/${s.proposal.id}/decisions/[0-9a-f-]+/letter\\.pdf$`));
    expect(await statObjectOrNull(storedKey)).toBeNull();
    const after = (await db().select({ id: decisions.id }).from(decisions)).filter((d) => !before.has(d.id));
    expect(after).toEqual([]);
  });

  it("previews the letter and its e-mail without storing anything", async () => {
    const s = await decisionScenario();
    const preview = await previewDecision(asSessionUser(s.chair), s.board.id, s.proposal.id, {
      outcome: "decline",
      letter: DEFAULT_LETTER_TEMPLATE,
      selectedReviewItemIds: [s.items.minor.id],
    });
    expect(preview.subject).toContain("declined");
    expect(preview.letterText).toContain("[minor] Eclipse season");
    // The letter's merge fields name each value found outside tolerance, and what "consistent" means.
    expect(preview.letterText).toMatch(/Orbital period: claimed [\d.]+ s, recomputed [\d.]+ s, outside tolerance\./);
    expect(preview.letterText).toContain("does not say the mission is feasible or compliant");
    expect(preview.html).toContain("Eclipse season");
    expect(preview.text).toContain("Open the decision:");
    expect(await db().select({ id: decisions.id }).from(decisions).where(eq(decisions.proposalId, s.proposal.id))).toEqual([]);
  });

  it("keeps a per-board letter template, refusing unknown merge fields", async () => {
    const s = await decisionScenario();
    const chair = asSessionUser(s.chair);
    expect((await getLetterTemplate(chair, s.board.id)).isDefault).toBe(true);
    const mine = letter("From the board: {{decision.outcome}} for {{proposal.title}}.");
    await saveLetterTemplate(chair, s.board.id, mine);
    expect(await getLetterTemplate(chair, s.board.id)).toMatchObject({ template: mine, isDefault: false });
    expect((await getDecisionWorkspace(chair, s.board.id, s.proposal.id)).template).toEqual(mine);
    const bad = await failure(saveLetterTemplate(chair, s.board.id, letter("{{decision.mood}}")));
    expect(bad.status).toBe(422);
    expect(bad.message).toContain("{{decision.mood}}");
    expect((await failure(saveLetterTemplate(asSessionUser(s.reviewer), s.board.id, mine))).status).toBe(403);
    expect((await failure(getLetterTemplate(asSessionUser(s.outsider), s.board.id))).status).toBe(404);
    await saveLetterTemplate(chair, s.board.id, null);
    expect((await getLetterTemplate(chair, s.board.id)).isDefault).toBe(true);
  });

  it("compares a resubmitted version with the decided one and asks the same reviewers again", async () => {
    const s = await decisionScenario();
    const chair = asSessionUser(s.chair);
    await createDecision(chair, s.board.id, s.proposal.id, { outcome: "revise", letter: letter("Please revise."), selectedReviewItemIds: [] });
    // The authors resubmit: the drift orbit now claims the right period, a new block is added.
    const newBlock = "b7c5a0f4-6a61-4d3e-9d59-2f0c1c8e5a11";
    const v2 = await addVersion(
      s.board,
      s.proposal,
      2,
      dossierDoc("The relay rides a circular parking orbit before the single transfer burn.", [
        parkingOrbitBlock(s.blockIds.parkingId, "the parking orbit", 5827),
        parkingOrbitBlock(s.blockIds.transferId, "the drift orbit", 5864),
        parkingOrbitBlock(newBlock, "the disposal orbit", 5900),
      ]),
      [
        { blockId: s.blockIds.parkingId, label: "the parking orbit", status: "consistent", claimedPeriod: 5827, computedPeriod: 5863.69 },
        { blockId: s.blockIds.transferId, label: "the drift orbit", status: "consistent", claimedPeriod: 5864, computedPeriod: 5863.69 },
        { blockId: newBlock, label: "the disposal orbit", status: "consistent", claimedPeriod: 5900, computedPeriod: 5890 },
      ],
      s.proposer.id,
    );
    await db().update(proposals).set({ status: "submitted", latestVersion: 2 }).where(eq(proposals.id, s.proposal.id));

    const cmp = await compareVersions(chair, s.board.id, s.proposal.id, 1, 2);
    expect(cmp.from.decision?.outcome).toBe("revise");
    expect(cmp.text.changes.filter((c) => c.kind === "added").map((c) => c.text.trim())).toEqual(expect.arrayContaining(["circular", "single"]));
    expect(cmp.text.changes.filter((c) => c.kind === "removed").map((c) => c.text.trim())).toEqual(expect.arrayContaining(["low"]));
    expect(cmp.claims.map((c) => [c.label, c.change, c.matchedBy])).toEqual([
      ["the parking orbit", "unchanged", "blockId"],
      ["the drift orbit", "verdict-changed", "blockId"],
      ["the disposal orbit", "added", "none"],
    ]);
    const drift = cmp.claims[1]!;
    expect(drift.before?.status).toBe("inconsistent");
    expect(drift.after?.status).toBe("consistent");
    expect(drift.quantities).toEqual([
      { quantity: "period", unit: "s", before: { claimed: 6100, computed: 5863.69, ok: false }, after: { claimed: 5864, computed: 5863.69, ok: true } },
    ]);
    expect(cmp.reviewers?.map((r) => [r.name, r.onLaterVersion])).toEqual([
      [s.reviewer.name, false],
      ["Second Reviewer", false],
    ]);
    // The proposers may compare too, without the reviewer list; a reviewer of another board may not.
    expect((await compareVersions(asSessionUser(s.proposer), s.board.id, s.proposal.id, 1, 2)).reviewers).toBeNull();
    expect((await failure(compareVersions(asSessionUser(s.outsider), s.board.id, s.proposal.id, 1, 2))).status).toBe(404);
    expect((await failure(compareVersions(chair, s.board.id, s.proposal.id, 1, 3))).status).toBe(404);

    const result = await reassignPreviousReviewers(chair, s.board.id, s.proposal.id);
    expect(result.created).toHaveLength(2);
    const onV2 = await db().select({ reviewerId: assignments.reviewerId, id: assignments.id }).from(assignments).where(eq(assignments.versionId, v2.id));
    expect(onV2.map((a) => a.reviewerId).sort()).toEqual([s.reviewer.id, s.reviewer2.id].sort());
    const mails = await db()
      .select({ to: outboxMessages.toAddresses })
      .from(outboxMessages)
      .where(eq(outboxMessages.dedupeKey, `assignment:${onV2[0]!.id}`));
    expect(mails).toHaveLength(1);
    // Pressing the button again assigns nobody twice.
    const again = await reassignPreviousReviewers(chair, s.board.id, s.proposal.id);
    expect(again.created).toEqual([]);
    expect(again.existing).toHaveLength(2);
    expect((await failure(reassignPreviousReviewers(asSessionUser(s.proposer), s.board.id, s.proposal.id))).status).toBe(403);
  });
});
