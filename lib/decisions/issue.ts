import "server-only";
import crypto from "node:crypto";
import type { DecisionOutcome } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/session";
import { recordAudit } from "@/lib/dal/audit";
import {
  authorEmails,
  decisionIdOfVersion,
  decisionViews,
  insertDecision,
  loadDecisionContext,
  lockProposalForDecision,
  submittedReviewCount,
  type DecisionContext,
  type DecisionView,
} from "@/lib/dal/decisions";
import { startRevisionDraft } from "@/lib/dal/proposals";
import { reviewAggregate } from "@/lib/dal/reviews";
import { reportObjectKey, reviewReportPdfForLetter } from "@/lib/dal/reports";
import { inTransaction, type Tx } from "@/lib/dal/transaction";
import { checkResultsOfVersion, openReviewItemCount, selectedReviewItems } from "@/lib/dal/versions";
import { failingSentences } from "@/lib/dossier/verdict-text";
import { env } from "@/lib/env";
import { conflict, unprocessable } from "@/lib/errors";
import { enqueueMail } from "@/lib/mail/outbox";
import { renderDecisionMail } from "@/lib/mail/templates/notices";
import { CONSISTENT_MEANS, kindLabel, policySummary } from "@/lib/orbit/labels";
import { renderLetterPdf } from "@/lib/pdf/letter";
import { MIN_OVERRIDE_REASON } from "@/lib/validation/decisions";
import { deleteObject, writeObject } from "@/storage/object-store";
import { requireChair } from "./access";
import { countClaims } from "./claim-counts";
import { letterBlocks, letterIsEmpty, renderLetterHtml, renderLetterText, type LetterBlock } from "./letter";
import { applyMergeFields, MERGE_FIELDS, unknownMergeFields } from "./merge-fields";
import { mergeValues, OUTCOME_LABELS, reviewItemLine } from "./template";

/** What the chair sends (validated at the boundary by decisionInput in lib/validation/decisions.ts). */
export interface DecisionRequest {
  outcome: DecisionOutcome;
  /** Tiptap JSON of the letter, with merge fields. */
  letter: Record<string, unknown>;
  selectedReviewItemIds?: string[];
  overrideReason?: string;
  /** Attach the version's review report (PDF, as the proposers read it) to the letter e-mail. */
  attachReport?: boolean;
}

export function letterObjectKey(boardId: string, proposalId: string, decisionId: string): string {
  return `boards/${boardId}/proposals/${proposalId}/decisions/${decisionId}/letter.pdf`;
}

export function letterFilename(title: string, versionNumber: number): string {
  const slug = title
    .toLowerCase()
    .normalize("NFKD")
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 60);
  return `decision-${slug || "proposal"}-v${versionNumber}.pdf`;
}

// ---------------------------------------------------------------------------------------
// Composing the letter

interface ComposedLetter {
  blocks: LetterBlock[];
  html: string;
  text: string;
  weightedMean: number | null;
  reviewsSubmitted: number;
}

/** The letter's blocks; 422 for an empty letter or unknown merge fields. */
export function checkLetter(letter: unknown): LetterBlock[] {
  const blocks = letterBlocks(letter);
  if (letterIsEmpty(blocks))
    throw unprocessable("The letter is empty; write the letter (or start from the board's template).", { issues: [{ path: "letter", message: "is empty" }] });
  const unknown = unknownMergeFields(blocks);
  if (unknown.length) {
    throw unprocessable(
      `The letter uses ${unknown.length === 1 ? "an unknown merge field" : "unknown merge fields"}: ${unknown.map((f) => `{{${f}}}`).join(", ")}. Known fields: ${MERGE_FIELDS.map((f) => f.name).join(", ")}.`,
      { unknownFields: unknown, issues: unknown.map((f) => ({ path: "letter", message: `unknown merge field {{${f}}}` })) },
    );
  }
  return blocks;
}

async function composeLetter(
  user: SessionUser,
  ctx: DecisionContext & { version: NonNullable<DecisionContext["version"]> },
  input: DecisionRequest,
  decidedAt: Date,
  tx?: Tx,
): Promise<ComposedLetter> {
  const blocks = checkLetter(input.letter);
  const selectedIds = [...new Set(input.selectedReviewItemIds ?? [])];
  const selected = await selectedReviewItems(ctx.board.id, ctx.version.id, selectedIds, tx);
  if (selected.length !== selectedIds.length) {
    const missing = selectedIds.filter((id) => !selected.some((s) => s.id === id));
    throw unprocessable("Some selected review items do not belong to the version under decision.", {
      issues: missing.map((id) => ({ path: "selectedReviewItemIds", message: `unknown review item ${id}` })),
    });
  }
  const agg = await reviewAggregate(ctx.board.id, ctx.proposal.id, ctx.version.id, tx);
  const openItems = await openReviewItemCount(ctx.version.id, tx);
  const checkRows = await checkResultsOfVersion(ctx.board.id, ctx.version.id, tx);
  const checks = countClaims(checkRows);
  const unmet = checkRows.flatMap((c) => c.requirements.filter((o) => o.status === "notMet").map((o) => `${c.label || c.kind}: ${o.title} — ${o.reason}`));
  const recordTolerance = checkRows.find((c) => c.tolerance)?.tolerance;
  const reviewsSubmitted = await submittedReviewCount(ctx.version.id, tx);
  const values = mergeValues({
    proposalTitle: ctx.version.title || ctx.proposal.title,
    missionType: ctx.proposal.missionType,
    proposerName: ctx.proposal.ownerName,
    boardName: ctx.board.name,
    callTitle: ctx.call.title,
    versionNumber: ctx.version.number,
    versionSubmittedAt: ctx.version.submittedAt,
    outcome: input.outcome,
    decidedAt,
    weightedMean: agg?.weightedMean ?? null,
    spread: agg?.spread ?? null,
    reviewsSubmitted,
    reviewsRequired: ctx.call.reviewersPerProposal,
    selectedItems: selected.map(reviewItemLine),
    openItemCount: openItems,
    checksTotal: checks.claims,
    checksFlagged: checks.flagged,
    checksInconsistent: checks.inconsistent,
    checksInvalid: checks.invalid,
    requirementsNotMet: unmet,
    checksFlaggedDetails: checkRows.flatMap((c) => failingSentences(c.result).map((line) => `${c.label || kindLabel(c.kind)}: ${line}`)),
    checksMeaning: `${CONSISTENT_MEANS}${recordTolerance ? ` The call's checks ran ${policySummary(recordTolerance)}.` : ""}`,
    chairName: user.name,
  });
  const merged = applyMergeFields(blocks, values);
  return { blocks: merged, html: renderLetterHtml(merged), text: renderLetterText(merged), weightedMean: agg?.weightedMean ?? null, reviewsSubmitted };
}

export interface DecisionPreview {
  subject: string;
  html: string;
  text: string;
  letterHtml: string;
  letterText: string;
}

/** The letter and its e-mail as the proposers would receive them; nothing is stored. */
export async function previewDecision(user: SessionUser, boardId: string, proposalId: string, input: DecisionRequest): Promise<DecisionPreview> {
  await requireChair(user, boardId, proposalId);
  const ctx = await loadDecisionContext(boardId, proposalId);
  if (!ctx.version) throw conflict("Nothing has been submitted yet, so there is nothing to decide.");
  const now = new Date();
  const letter = await composeLetter(user, { ...ctx, version: ctx.version }, input, now);
  const mail = await renderDecisionMail({
    boardName: ctx.board.name,
    proposalTitle: ctx.version.title || ctx.proposal.title,
    versionNumber: ctx.version.number,
    outcomeLabel: OUTCOME_LABELS[input.outcome],
    letterHtml: letter.html,
    letterText: letter.text,
    url: decisionUrl(boardId, proposalId),
  });
  return { ...mail, letterHtml: letter.html, letterText: letter.text };
}

function decisionUrl(boardId: string, proposalId: string) {
  return `${env().APP_URL.replace(/\/$/, "")}/boards/${boardId}/proposals/${proposalId}/decision`;
}

function isUniqueViolation(error: unknown): boolean {
  const e = error as { code?: string; cause?: { code?: string } } | null;
  return e?.code === "23505" || e?.cause?.code === "23505";
}

/**
 * Issues the decision on the proposal's latest version. The PDF is made and stored first;
 * then one transaction writes the decision, the proposal's new status, the e-mail to the
 * authors (outbox, dedupe key "decision:<id>", the PDF attached) and the audit event, and
 * on "revise" seeds the authors' next draft from the decided version. If that transaction
 * fails the PDF is deleted again. A second decision on the same version is 409.
 */
export async function createDecision(user: SessionUser, boardId: string, proposalId: string, input: DecisionRequest): Promise<DecisionView> {
  await requireChair(user, boardId, proposalId);
  const ctx = await loadDecisionContext(boardId, proposalId);
  const version = ctx.version;
  if (!version) throw conflict("Nothing has been submitted yet, so there is nothing to decide.");
  const existing = await decisionIdOfVersion(version.id);
  if (existing) throw conflict(`Version ${version.number} has already been decided; a decision cannot be issued twice.`, { decisionId: existing });
  if (!["submitted", "in_review"].includes(ctx.proposal.status))
    throw conflict(`The proposal is ${ctx.proposal.status.replace("_", " ")}; only submitted proposals can be decided.`);

  const submitted = await submittedReviewCount(version.id);
  const required = ctx.call.reviewersPerProposal;
  const overrideReason = input.overrideReason?.trim() || null;
  if (submitted < required) {
    if (!overrideReason) {
      throw unprocessable(
        `The call asks for ${required} submitted review${required === 1 ? "" : "s"} and this version has ${submitted}. Wait for the reviews, or give a reason to decide without them.`,
        { required, submitted, issues: [{ path: "overrideReason", message: "a reason is required to decide without the required reviews" }] },
      );
    }
    if (overrideReason.length < MIN_OVERRIDE_REASON) {
      throw unprocessable(`Give a reason of at least ${MIN_OVERRIDE_REASON} characters for deciding without the required reviews.`, {
        required,
        submitted,
        issues: [{ path: "overrideReason", message: `at least ${MIN_OVERRIDE_REASON} characters` }],
      });
    }
  }

  const decisionId = crypto.randomUUID();
  const decidedAt = new Date();
  const letter = await composeLetter(user, { ...ctx, version }, input, decidedAt);
  const title = version.title || ctx.proposal.title;
  const pdf = await renderLetterPdf({
    boardName: ctx.board.name,
    proposalTitle: title,
    versionNumber: version.number,
    outcomeLabel: OUTCOME_LABELS[input.outcome],
    decidedAt,
    blocks: letter.blocks,
  });
  const pdfKey = letterObjectKey(boardId, proposalId, decisionId);
  await writeObject(pdfKey, pdf, "application/pdf");
  // The review report as the proposers read it, stored beside the letter (issue 16 C).
  const report = input.attachReport ? await reviewReportPdfForLetter(boardId, proposalId, version.number, { outcome: input.outcome, decidedAt }) : null;
  const reportKey = report ? reportObjectKey(boardId, proposalId, decisionId) : null;
  if (report && reportKey) await writeObject(reportKey, report.pdf, "application/pdf");

  try {
    await inTransaction(async (tx) => {
      // Serialise decisions on one proposal; the unique key on the version backs this up.
      const locked = await lockProposalForDecision(tx, boardId, proposalId);
      if (!locked || locked.latestVersion !== version.number || !["submitted", "in_review"].includes(locked.status)) {
        throw conflict("The proposal changed while you were deciding (a new version or another decision); reload the page.");
      }
      await insertDecision(tx, {
        id: decisionId,
        boardId,
        proposalId,
        versionId: version.id,
        outcome: input.outcome,
        letter: input.letter,
        letterHtml: letter.html,
        letterText: letter.text,
        pdfKey,
        reportPdfKey: reportKey,
        weightedScore: letter.weightedMean,
        overrideReason: submitted < required ? overrideReason : null,
        decidedBy: user.id,
        decidedAt,
      });
      if (input.outcome === "revise") await startRevisionDraft(proposalId, tx);

      const recipients = await authorEmails(proposalId, boardId, tx);
      const mail = await renderDecisionMail({
        boardName: ctx.board.name,
        proposalTitle: title,
        versionNumber: version.number,
        outcomeLabel: OUTCOME_LABELS[input.outcome],
        letterHtml: letter.html,
        letterText: letter.text,
        url: decisionUrl(boardId, proposalId),
      });
      if (recipients.length) {
        await enqueueMail(
          {
            kind: "decision-letter",
            dedupeKey: `decision:${decisionId}`,
            to: recipients,
            boardId,
            ...mail,
            attachments: [
              { filename: letterFilename(title, version.number), objectKey: pdfKey, contentType: "application/pdf" },
              ...(report && reportKey ? [{ filename: report.filename, objectKey: reportKey, contentType: "application/pdf" }] : []),
            ],
          },
          tx,
        );
      }
      await recordAudit(
        {
          action: "decision.issue",
          actorId: user.id,
          actorEmail: user.email,
          boardId,
          target: proposalId,
          details: {
            decisionId,
            version: version.number,
            outcome: input.outcome,
            reviewsSubmitted: submitted,
            reviewsRequired: required,
            ...(submitted < required ? { overrideReason } : {}),
            recipients: recipients.length,
            ...(reportKey ? { reportAttached: true } : {}),
          },
        },
        tx,
      );
    });
  } catch (error) {
    await deleteObject(pdfKey).catch(() => undefined);
    if (reportKey) await deleteObject(reportKey).catch(() => undefined);
    if (isUniqueViolation(error)) throw conflict(`Version ${version.number} has already been decided; a decision cannot be issued twice.`);
    throw error;
  }
  const views = await decisionViews(boardId, proposalId, true);
  return views.find((d) => d.id === decisionId)!;
}
