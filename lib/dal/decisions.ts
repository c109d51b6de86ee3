import "server-only";
import type { RequirementOutcome } from "@/lib/requirements";
import crypto from "node:crypto";
import { and, asc, desc, eq, inArray, sql } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import {
  assignments,
  boardMembers,
  boards,
  calls,
  checkResults,
  decisions,
  outboxMessages,
  proposalCoauthors,
  proposals,
  proposalVersions,
  reviewItems,
  reviews,
  users,
  type DecisionOutcome,
} from "@/db/schema";
import { authorize, can } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { compareClaims, diffText, type ClaimComparison, type TextDiff, type VersionCheck } from "@/lib/decisions/compare";
import { letterBlocks, letterIsEmpty, renderLetterHtml, renderLetterText, type LetterBlock } from "@/lib/decisions/letter";
import { countClaims, type ClaimCounts } from "@/lib/decisions/claim-counts";
import { applyMergeFields, MERGE_FIELDS, unknownMergeFields, type MergeFieldInfo } from "@/lib/decisions/merge-fields";
import { DEFAULT_LETTER_TEMPLATE, mergeValues, OUTCOME_LABELS, reviewItemLine } from "@/lib/decisions/template";
import { dossierPlainText } from "@/lib/dossier";
import { failingSentences } from "@/lib/dossier/verdict-text";
import { CONSISTENT_MEANS, kindLabel, policySummary } from "@/lib/orbit/labels";
import { env } from "@/lib/env";
import { conflict, notFound, unprocessable } from "@/lib/errors";
import { enqueueMail } from "@/lib/mail/outbox";
import { renderDecisionMail } from "@/lib/mail/templates/notices";
import { renderLetterPdf } from "@/lib/pdf/letter";
import { MIN_OVERRIDE_REASON } from "@/lib/validation/decisions";
import { deleteObject, presignDownload, writeObject } from "@/storage/object-store";
import { assignReviewers, proposalAccess, type AssignResult } from "./assignments";
import { recordAudit } from "./audit";
import { isUuid } from "./boards";
import { startRevisionDraft } from "./proposals";
import { reportObjectKey, reviewReportPdfForLetter } from "./reports";
import { reviewAggregate } from "./reviews";
import { loadTemplate } from "./rubrics";

type Db = Database | Transaction;

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

export interface DecisionView {
  id: string;
  proposalId: string;
  versionNumber: number;
  outcome: DecisionOutcome;
  outcomeLabel: string;
  letterHtml: string;
  letterText: string;
  weightedScore: number | null;
  overrideReason: string | null;
  decidedAt: string;
  decidedByName: string | null;
  hasPdf: boolean;
  /** The review report PDF went with the letter e-mail. */
  hasReportPdf: boolean;
  /** The letter e-mail's state in the outbox (null for readers who may not see it). */
  mail: { status: string; attempts: number; lastError: string | null; nextAttemptAt: string | null; sentAt: string | null } | null;
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
// What the chair sees before deciding

interface Context {
  board: { id: string; name: string; letterTemplate: Record<string, unknown> | null };
  proposal: { id: string; title: string; missionType: string; status: string; latestVersion: number; ownerId: string; ownerName: string };
  call: { id: string; title: string; reviewersPerProposal: number };
  version: { id: string; number: number; title: string; submittedAt: Date } | null;
}

async function loadContext(boardId: string, proposalId: string, tx: Db): Promise<Context> {
  const [row] = await tx
    .select({
      boardName: boards.name,
      letterTemplate: boards.letterTemplate,
      title: proposals.title,
      missionType: proposals.missionType,
      status: proposals.status,
      latestVersion: proposals.latestVersion,
      ownerId: proposals.ownerId,
      ownerName: users.name,
      callId: calls.id,
      callTitle: calls.title,
      reviewersPerProposal: calls.reviewersPerProposal,
    })
    .from(proposals)
    .innerJoin(boards, eq(boards.id, proposals.boardId))
    .innerJoin(calls, eq(calls.id, proposals.callId))
    .innerJoin(users, eq(users.id, proposals.ownerId))
    .where(and(eq(proposals.id, proposalId), eq(proposals.boardId, boardId)));
  if (!row) throw notFound("That proposal");
  const [version] =
    row.latestVersion > 0
      ? await tx
          .select({ id: proposalVersions.id, number: proposalVersions.number, title: proposalVersions.title, submittedAt: proposalVersions.submittedAt })
          .from(proposalVersions)
          .where(and(eq(proposalVersions.proposalId, proposalId), eq(proposalVersions.boardId, boardId), eq(proposalVersions.number, row.latestVersion)))
      : [];
  return {
    board: { id: boardId, name: row.boardName, letterTemplate: row.letterTemplate ?? null },
    proposal: {
      id: proposalId,
      title: row.title,
      missionType: row.missionType,
      status: row.status,
      latestVersion: row.latestVersion,
      ownerId: row.ownerId,
      ownerName: row.ownerName,
    },
    call: { id: row.callId, title: row.callTitle, reviewersPerProposal: row.reviewersPerProposal },
    version: version ?? null,
  };
}

/** The chair (or an admin) of the proposal's board; everyone else 403, non-members 404. */
async function requireChair(user: SessionUser, boardId: string, proposalId: string, tx: Db = db()) {
  const access = await proposalAccess(user, boardId, proposalId, tx);
  authorize(user, "decision.make", { role: access.role }, "That proposal");
  return access;
}

export interface WorkspaceReview {
  assignmentId: string;
  reviewerName: string;
  status: "not started" | "draft" | "submitted";
  weightedTotal: number | null;
  summary: string;
  submittedAt: string | null;
  /** In the rubric's order; `title` is the criterion's name (the id only when the rubric is gone). */
  scores: { criterion: string; title: string; score: number | null; comment: string }[];
}

export interface WorkspaceItem {
  id: string;
  severity: "major" | "minor" | "comment";
  title: string;
  body: string;
  status: "open" | "resolved";
  authorName: string;
}

export interface WorkspaceCheck {
  blockId: string;
  label: string;
  kind: string;
  status: "consistent" | "inconsistent" | "invalid";
  messages: string[];
  /** The call's requirements judged on this claim at submission. */
  requirements: RequirementOutcome[];
  /** Failing check rows as stored (with their hints, contract version 2). */
  failing: Record<string, unknown>[];
  contractVersion: number;
  tolerance: { relative: number; absolute?: Record<string, number> } | null;
}

export interface DecisionWorkspace {
  board: { id: string; name: string };
  proposal: { id: string; title: string; missionType: string; status: string; ownerName: string };
  call: { id: string; title: string; reviewersRequired: number };
  version: { id: string; number: number; submittedAt: string } | null;
  aggregate: {
    weightedMean: number | null;
    spread: number | null;
    count: number;
    assigned: number;
    totals: number[];
    scale: { min: number; max: number } | null;
  };
  reviews: WorkspaceReview[];
  reviewItems: WorkspaceItem[];
  checks: WorkspaceCheck[];
  /** Claimed values (not blocks) across the version's orbit checks, and how many are flagged. */
  claimCounts: ClaimCounts;
  /** The decision on the version under decision, once issued. */
  decision: DecisionView | null;
  /** Decisions on earlier versions, newest first. */
  earlier: DecisionView[];
  template: Record<string, unknown>;
  mergeFields: readonly MergeFieldInfo[];
  /** Why a decision cannot be issued now (null when it can). */
  blocked: string | null;
  needsOverride: boolean;
  previousVersionNumber: number | null;
}

async function decisionViews(boardId: string, proposalId: string, withMail: boolean, tx: Db): Promise<DecisionView[]> {
  const rows = await tx
    .select({
      id: decisions.id,
      proposalId: decisions.proposalId,
      versionNumber: proposalVersions.number,
      outcome: decisions.outcome,
      letterHtml: decisions.letterHtml,
      letterText: decisions.letterText,
      weightedScore: decisions.weightedScore,
      overrideReason: decisions.overrideReason,
      decidedAt: decisions.decidedAt,
      decidedByName: users.name,
      pdfKey: decisions.pdfKey,
      reportPdfKey: decisions.reportPdfKey,
    })
    .from(decisions)
    .innerJoin(proposalVersions, eq(proposalVersions.id, decisions.versionId))
    .leftJoin(users, eq(users.id, decisions.decidedBy))
    .where(and(eq(decisions.boardId, boardId), eq(decisions.proposalId, proposalId)))
    .orderBy(desc(proposalVersions.number));
  const mail = new Map<string, NonNullable<DecisionView["mail"]>>();
  if (withMail && rows.length) {
    const found = await tx
      .select({
        dedupeKey: outboxMessages.dedupeKey,
        status: outboxMessages.status,
        attempts: outboxMessages.attempts,
        lastError: outboxMessages.lastError,
        nextAttemptAt: outboxMessages.nextAttemptAt,
        sentAt: outboxMessages.sentAt,
      })
      .from(outboxMessages)
      .where(
        inArray(
          outboxMessages.dedupeKey,
          rows.map((r) => `decision:${r.id}`),
        ),
      );
    for (const m of found)
      mail.set(m.dedupeKey, {
        status: m.status,
        attempts: m.attempts,
        lastError: m.lastError,
        nextAttemptAt: m.nextAttemptAt.toISOString(),
        sentAt: m.sentAt?.toISOString() ?? null,
      });
  }
  return rows.map(({ pdfKey, reportPdfKey, decidedAt, ...r }) => ({
    ...r,
    hasReportPdf: Boolean(reportPdfKey),
    outcomeLabel: OUTCOME_LABELS[r.outcome],
    decidedAt: decidedAt.toISOString(),
    hasPdf: Boolean(pdfKey),
    overrideReason: withMail ? r.overrideReason : null,
    mail: withMail ? (mail.get(`decision:${r.id}`) ?? null) : null,
  }));
}

async function submittedReviewCount(versionId: string, tx: Db): Promise<number> {
  const [row] = await tx
    .select({ n: sql<number>`count(*)::int` })
    .from(reviews)
    .where(and(eq(reviews.versionId, versionId), eq(reviews.status, "submitted")));
  return row?.n ?? 0;
}

export async function getDecisionWorkspace(user: SessionUser, boardId: string, proposalId: string): Promise<DecisionWorkspace> {
  const tx = db();
  await requireChair(user, boardId, proposalId, tx);
  const ctx = await loadContext(boardId, proposalId, tx);
  const all = await decisionViews(boardId, proposalId, true, tx);
  const version = ctx.version;
  const decision = version ? (all.find((d) => d.versionNumber === version.number) ?? null) : null;

  let reviewList: WorkspaceReview[] = [];
  let items: WorkspaceItem[] = [];
  let checks: WorkspaceCheck[] = [];
  let claimCounts: ClaimCounts = countClaims([]);
  let aggregate: DecisionWorkspace["aggregate"] = { weightedMean: null, spread: null, count: 0, assigned: 0, totals: [], scale: null };
  if (version) {
    const agg = await reviewAggregate(boardId, proposalId, version.id, tx);
    if (agg) aggregate = { weightedMean: agg.weightedMean, spread: agg.spread, count: agg.count, assigned: agg.assigned, totals: agg.totals, scale: agg.scale };
    const rows = await tx
      .select({
        assignmentId: assignments.id,
        reviewerName: users.name,
        status: reviews.status,
        weightedTotal: reviews.weightedTotal,
        summary: reviews.summary,
        submittedAt: reviews.submittedAt,
        scores: reviews.scores,
        rubricTemplateId: reviews.rubricTemplateId,
      })
      .from(assignments)
      .innerJoin(users, eq(users.id, assignments.reviewerId))
      .leftJoin(reviews, eq(reviews.assignmentId, assignments.id))
      .where(and(eq(assignments.boardId, boardId), eq(assignments.versionId, version.id)))
      .orderBy(asc(assignments.createdAt));
    const rubrics = new Map<string, { id: string; title: string }[]>();
    for (const id of new Set(rows.map((r) => r.rubricTemplateId).filter((t): t is string => Boolean(t))))
      rubrics.set(id, (await loadTemplate(boardId, id, tx))?.criteria.map((c) => ({ id: c.id, title: c.title })) ?? []);
    const namedScores = (templateId: string | null, scores: Record<string, { score: number | null; comment: string }>) => {
      const criteria = (templateId ? rubrics.get(templateId) : undefined) ?? [];
      const order = (id: string) => {
        const at = criteria.findIndex((c) => c.id === id);
        return at < 0 ? criteria.length : at;
      };
      return Object.entries(scores)
        .map(([criterion, s]) => ({ criterion, title: criteria.find((c) => c.id === criterion)?.title ?? criterion, score: s.score, comment: s.comment }))
        .sort((a, b) => order(a.criterion) - order(b.criterion));
    };
    reviewList = rows.map((r) => ({
      assignmentId: r.assignmentId,
      reviewerName: r.reviewerName,
      status: r.status ?? "not started",
      weightedTotal: r.status === "submitted" ? r.weightedTotal : null,
      summary: r.status === "submitted" ? (r.summary ?? "") : "",
      submittedAt: r.submittedAt?.toISOString() ?? null,
      scores: r.status === "submitted" ? namedScores(r.rubricTemplateId, r.scores ?? {}) : [],
    }));
    items = (
      await tx
        .select({
          id: reviewItems.id,
          severity: reviewItems.severity,
          title: reviewItems.title,
          body: reviewItems.body,
          status: reviewItems.status,
          authorName: users.name,
        })
        .from(reviewItems)
        .innerJoin(users, eq(users.id, reviewItems.authorId))
        .where(and(eq(reviewItems.boardId, boardId), eq(reviewItems.versionId, version.id)))
        .orderBy(asc(reviewItems.createdAt))
    ).map((i) => ({ ...i }));
    const checkRows = await tx
      .select({
        blockId: checkResults.blockId,
        label: checkResults.label,
        kind: checkResults.kind,
        status: checkResults.status,
        claim: checkResults.claim,
        result: checkResults.result,
        requirements: checkResults.requirements,
        contractVersion: checkResults.contractVersion,
        tolerance: checkResults.tolerance,
      })
      .from(checkResults)
      .where(and(eq(checkResults.boardId, boardId), eq(checkResults.versionId, version.id)))
      .orderBy(asc(checkResults.createdAt));
    claimCounts = countClaims(checkRows);
    checks = checkRows.map((c) => ({
      blockId: c.blockId,
      label: c.label,
      kind: c.kind,
      status: c.status,
      requirements: c.requirements,
      contractVersion: c.contractVersion,
      tolerance: c.tolerance ?? null,
      messages: Array.isArray(c.result.messages) ? (c.result.messages as unknown[]).map(String) : [],
      failing: Array.isArray(c.result.checks) ? (c.result.checks as Record<string, unknown>[]).filter((r) => r && r.ok === false) : [],
    }));
  }

  let blocked: string | null = null;
  if (!version) blocked = "Nothing has been submitted yet.";
  else if (decision) blocked = `Version ${version.number} was decided on ${decision.decidedAt.slice(0, 10)}.`;
  else if (!["submitted", "in_review"].includes(ctx.proposal.status)) blocked = `The proposal is ${ctx.proposal.status.replace("_", " ")}.`;
  const submitted = reviewList.filter((r) => r.status === "submitted").length;

  return {
    board: { id: boardId, name: ctx.board.name },
    proposal: {
      id: proposalId,
      title: ctx.proposal.title,
      missionType: ctx.proposal.missionType,
      status: ctx.proposal.status,
      ownerName: ctx.proposal.ownerName,
    },
    call: { id: ctx.call.id, title: ctx.call.title, reviewersRequired: ctx.call.reviewersPerProposal },
    version: version ? { id: version.id, number: version.number, submittedAt: version.submittedAt.toISOString() } : null,
    aggregate,
    reviews: reviewList,
    reviewItems: items,
    checks,
    claimCounts,
    decision,
    earlier: all.filter((d) => d !== decision),
    template: ctx.board.letterTemplate ?? DEFAULT_LETTER_TEMPLATE,
    mergeFields: MERGE_FIELDS,
    blocked,
    needsOverride: submitted < ctx.call.reviewersPerProposal,
    previousVersionNumber: version && version.number > 1 ? version.number - 1 : null,
  };
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

function checkLetter(letter: unknown): LetterBlock[] {
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
  ctx: Context & { version: NonNullable<Context["version"]> },
  input: DecisionRequest,
  decidedAt: Date,
  tx: Db,
): Promise<ComposedLetter> {
  const blocks = checkLetter(input.letter);
  const selectedIds = [...new Set(input.selectedReviewItemIds ?? [])];
  const selected = selectedIds.length
    ? await tx
        .select({ id: reviewItems.id, severity: reviewItems.severity, title: reviewItems.title, body: reviewItems.body })
        .from(reviewItems)
        .where(and(eq(reviewItems.boardId, ctx.board.id), eq(reviewItems.versionId, ctx.version.id), inArray(reviewItems.id, selectedIds)))
        .orderBy(asc(reviewItems.createdAt))
    : [];
  if (selected.length !== selectedIds.length) {
    const missing = selectedIds.filter((id) => !selected.some((s) => s.id === id));
    throw unprocessable("Some selected review items do not belong to the version under decision.", {
      issues: missing.map((id) => ({ path: "selectedReviewItemIds", message: `unknown review item ${id}` })),
    });
  }
  const agg = await reviewAggregate(ctx.board.id, ctx.proposal.id, ctx.version.id, tx);
  const [openItems] = await tx
    .select({ n: sql<number>`count(*)::int` })
    .from(reviewItems)
    .where(and(eq(reviewItems.versionId, ctx.version.id), eq(reviewItems.status, "open")));
  const checkRows = await tx
    .select({
      status: checkResults.status,
      claim: checkResults.claim,
      result: checkResults.result,
      label: checkResults.label,
      kind: checkResults.kind,
      requirements: checkResults.requirements,
      tolerance: checkResults.tolerance,
    })
    .from(checkResults)
    .where(eq(checkResults.versionId, ctx.version.id))
    .orderBy(asc(checkResults.createdAt));
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
    openItemCount: openItems?.n ?? 0,
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
  const tx = db();
  await requireChair(user, boardId, proposalId, tx);
  const ctx = await loadContext(boardId, proposalId, tx);
  if (!ctx.version) throw conflict("Nothing has been submitted yet, so there is nothing to decide.");
  const now = new Date();
  const letter = await composeLetter(user, { ...ctx, version: ctx.version }, input, now, tx);
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
  const ctx = await loadContext(boardId, proposalId, db());
  const version = ctx.version;
  if (!version) throw conflict("Nothing has been submitted yet, so there is nothing to decide.");
  const [existing] = await db().select({ id: decisions.id }).from(decisions).where(eq(decisions.versionId, version.id));
  if (existing) throw conflict(`Version ${version.number} has already been decided; a decision cannot be issued twice.`, { decisionId: existing.id });
  if (!["submitted", "in_review"].includes(ctx.proposal.status))
    throw conflict(`The proposal is ${ctx.proposal.status.replace("_", " ")}; only submitted proposals can be decided.`);

  const submitted = await submittedReviewCount(version.id, db());
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
  const letter = await composeLetter(user, { ...ctx, version }, input, decidedAt, db());
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
    await db().transaction(async (tx) => {
      // Serialise decisions on one proposal; the unique key on the version backs this up.
      const [locked] = await tx
        .select({ status: proposals.status, latestVersion: proposals.latestVersion })
        .from(proposals)
        .where(and(eq(proposals.id, proposalId), eq(proposals.boardId, boardId)))
        .for("update");
      if (!locked || locked.latestVersion !== version.number || !["submitted", "in_review"].includes(locked.status)) {
        throw conflict("The proposal changed while you were deciding (a new version or another decision); reload the page.");
      }
      await tx.insert(decisions).values({
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
      await tx.update(proposals).set({ status: "decided", updatedAt: decidedAt }).where(eq(proposals.id, proposalId));
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
  const views = await decisionViews(boardId, proposalId, true, db());
  return views.find((d) => d.id === decisionId)!;
}

/** The owner and co-authors who are still active members of the board. */
async function authorEmails(proposalId: string, boardId: string, tx: Db): Promise<string[]> {
  const [owner] = await tx.select({ ownerId: proposals.ownerId }).from(proposals).where(eq(proposals.id, proposalId));
  const co = await tx.select({ userId: proposalCoauthors.userId }).from(proposalCoauthors).where(eq(proposalCoauthors.proposalId, proposalId));
  const ids = [...new Set([owner?.ownerId, ...co.map((c) => c.userId)].filter((id): id is string => Boolean(id)))];
  if (!ids.length) return [];
  const rows = await tx
    .select({ email: users.email })
    .from(users)
    .innerJoin(boardMembers, and(eq(boardMembers.userId, users.id), eq(boardMembers.boardId, boardId), eq(boardMembers.status, "active")))
    .where(and(inArray(users.id, ids), eq(users.status, "active")));
  return rows.map((r) => r.email);
}

// ---------------------------------------------------------------------------------------
// Reading decisions (chair, and authors once issued)

async function loadDecisionFor(user: SessionUser, boardId: string, decisionId: string) {
  if (!isUuid(boardId) || !isUuid(decisionId)) throw notFound("That decision");
  const [row] = await db()
    .select({
      id: decisions.id,
      proposalId: decisions.proposalId,
      pdfKey: decisions.pdfKey,
      title: proposalVersions.title,
      versionNumber: proposalVersions.number,
    })
    .from(decisions)
    .innerJoin(proposalVersions, eq(proposalVersions.id, decisions.versionId))
    .where(and(eq(decisions.id, decisionId), eq(decisions.boardId, boardId)));
  if (!row) throw notFound("That decision");
  let access;
  try {
    access = await proposalAccess(user, boardId, row.proposalId);
  } catch {
    throw notFound("That decision");
  }
  authorize(user, "decision.view", { role: access.role, isAuthor: access.isAuthor, decisionIssued: true }, "That decision");
  return { row, isChair: can(user, "decision.make", { role: access.role }) };
}

export async function getDecision(user: SessionUser, boardId: string, decisionId: string): Promise<DecisionView> {
  const { row, isChair } = await loadDecisionFor(user, boardId, decisionId);
  const views = await decisionViews(boardId, row.proposalId, isChair, db());
  return views.find((d) => d.id === decisionId)!;
}

/** Decisions of a proposal for its authors and the chair (404 for others). */
export async function listProposalDecisions(user: SessionUser, boardId: string, proposalId: string): Promise<DecisionView[]> {
  const access = await proposalAccess(user, boardId, proposalId);
  const isChair = can(user, "decision.make", { role: access.role });
  authorize(user, "decision.view", { role: access.role, isAuthor: access.isAuthor, decisionIssued: true }, "That proposal");
  return decisionViews(boardId, proposalId, isChair, db());
}

/** A short-lived download link for the letter PDF. */
export async function decisionLetterUrl(
  user: SessionUser,
  boardId: string,
  decisionId: string,
): Promise<{ url: string; filename: string; expiresInSeconds: number }> {
  const { row } = await loadDecisionFor(user, boardId, decisionId);
  if (!row.pdfKey) throw notFound("The letter PDF of that decision");
  const filename = letterFilename(row.title, row.versionNumber);
  const expiresInSeconds = 300;
  return { url: await presignDownload(row.pdfKey, filename, expiresInSeconds), filename, expiresInSeconds };
}

// ---------------------------------------------------------------------------------------
// The board's letter template

export async function getLetterTemplate(
  user: SessionUser,
  boardId: string,
): Promise<{ template: Record<string, unknown>; isDefault: boolean; mergeFields: readonly MergeFieldInfo[]; boardName: string }> {
  const board = await boardForManage(user, boardId);
  return {
    template: board.letterTemplate ?? DEFAULT_LETTER_TEMPLATE,
    isDefault: board.letterTemplate === null,
    mergeFields: MERGE_FIELDS,
    boardName: board.name,
  };
}

export async function saveLetterTemplate(
  user: SessionUser,
  boardId: string,
  template: Record<string, unknown> | null,
): Promise<{ saved: true; isDefault: boolean }> {
  await boardForManage(user, boardId);
  if (template) checkLetter(template);
  await db().transaction(async (tx) => {
    await tx.update(boards).set({ letterTemplate: template }).where(eq(boards.id, boardId));
    await recordAudit(
      { action: "board.letter-template", actorId: user.id, actorEmail: user.email, boardId, target: boardId, details: { reset: template === null } },
      tx,
    );
  });
  return { saved: true, isDefault: template === null };
}

async function boardForManage(user: SessionUser, boardId: string) {
  if (!isUuid(boardId)) throw notFound("That board");
  const [board] = await db().select({ name: boards.name, letterTemplate: boards.letterTemplate }).from(boards).where(eq(boards.id, boardId));
  const [member] = await db()
    .select({ role: boardMembers.role })
    .from(boardMembers)
    .where(and(eq(boardMembers.boardId, boardId), eq(boardMembers.userId, user.id), eq(boardMembers.status, "active")));
  if (!board) throw notFound("That board");
  authorize(user, "board.manage", { role: member?.role ?? null }, "That board");
  return { name: board.name, letterTemplate: board.letterTemplate ?? null };
}

// ---------------------------------------------------------------------------------------
// Resubmission: comparing versions, and the same reviewers again

export interface VersionComparison {
  proposal: { id: string; title: string; status: string; latestVersion: number };
  versions: { number: number; submittedAt: string }[];
  from: { number: number; submittedAt: string; decision: { outcome: DecisionOutcome; outcomeLabel: string } | null };
  to: { number: number; submittedAt: string; decision: { outcome: DecisionOutcome; outcomeLabel: string } | null };
  text: TextDiff;
  claims: ClaimComparison[];
  /** For the chair: the reviewers of the earlier version, and whether each is on the later one. */
  reviewers: { id: string; name: string; onLaterVersion: boolean; active: boolean }[] | null;
}

export async function compareVersions(
  user: SessionUser,
  boardId: string,
  proposalId: string,
  fromNumber: number,
  toNumber: number,
): Promise<VersionComparison> {
  const tx = db();
  const access = await proposalAccess(user, boardId, proposalId, tx);
  authorize(user, "proposal.view", access.facts, "That proposal");
  const all = await tx
    .select({ id: proposalVersions.id, number: proposalVersions.number, submittedAt: proposalVersions.submittedAt, document: proposalVersions.document })
    .from(proposalVersions)
    .where(and(eq(proposalVersions.proposalId, proposalId), eq(proposalVersions.boardId, boardId)))
    .orderBy(asc(proposalVersions.number));
  const from = all.find((v) => v.number === fromNumber);
  const to = all.find((v) => v.number === toNumber);
  if (!from) throw notFound(`Version ${fromNumber} of that proposal`);
  if (!to) throw notFound(`Version ${toNumber} of that proposal`);
  const checks = await tx
    .select({
      versionId: checkResults.versionId,
      blockId: checkResults.blockId,
      label: checkResults.label,
      kind: checkResults.kind,
      status: checkResults.status,
      claim: checkResults.claim,
      result: checkResults.result,
    })
    .from(checkResults)
    .where(and(eq(checkResults.boardId, boardId), inArray(checkResults.versionId, [from.id, to.id])))
    .orderBy(asc(checkResults.createdAt));
  const of = (versionId: string): VersionCheck[] => checks.filter((c) => c.versionId === versionId);
  const decided = await tx
    .select({ versionId: decisions.versionId, outcome: decisions.outcome })
    .from(decisions)
    .where(and(eq(decisions.proposalId, proposalId), inArray(decisions.versionId, [from.id, to.id])));
  const decisionOf = (versionId: string) => {
    const d = decided.find((x) => x.versionId === versionId);
    return d ? { outcome: d.outcome, outcomeLabel: OUTCOME_LABELS[d.outcome] } : null;
  };

  let reviewers: VersionComparison["reviewers"] = null;
  if (can(user, "review.assign", { role: access.role })) {
    const rows = await tx
      .select({
        id: users.id,
        name: users.name,
        versionId: assignments.versionId,
        memberStatus: boardMembers.status,
        userStatus: users.status,
        role: boardMembers.role,
      })
      .from(assignments)
      .innerJoin(users, eq(users.id, assignments.reviewerId))
      .leftJoin(boardMembers, and(eq(boardMembers.boardId, boardId), eq(boardMembers.userId, assignments.reviewerId)))
      .where(and(eq(assignments.boardId, boardId), eq(assignments.proposalId, proposalId), inArray(assignments.versionId, [from.id, to.id])))
      .orderBy(asc(assignments.createdAt));
    const earlier = rows.filter((r) => r.versionId === from.id);
    reviewers = earlier.map((r) => ({
      id: r.id,
      name: r.name,
      onLaterVersion: rows.some((x) => x.versionId === to.id && x.id === r.id),
      active: r.memberStatus === "active" && r.userStatus === "active" && r.role === "reviewer",
    }));
  }

  const [p] = await tx
    .select({ title: proposals.title, status: proposals.status, latestVersion: proposals.latestVersion })
    .from(proposals)
    .where(eq(proposals.id, proposalId));
  return {
    proposal: { id: proposalId, title: p!.title, status: p!.status, latestVersion: p!.latestVersion },
    versions: all.map((v) => ({ number: v.number, submittedAt: v.submittedAt.toISOString() })),
    from: { number: from.number, submittedAt: from.submittedAt.toISOString(), decision: decisionOf(from.id) },
    to: { number: to.number, submittedAt: to.submittedAt.toISOString(), decision: decisionOf(to.id) },
    text: diffText(dossierPlainText(from.document), dossierPlainText(to.document)),
    claims: compareClaims(of(from.id), of(to.id)),
    reviewers,
  };
}

export const REASSIGN_DAYS = 14;

/**
 * Assigns the reviewers of the previous version to the latest (resubmitted) one, through the
 * review area's assignReviewers: one transaction, one e-mail each via the outbox. Declared
 * conflicts still refuse the whole request; a likely conflict (same e-mail domain as an
 * author) counts as confirmed unless the caller says otherwise, because the chair already
 * accepted these reviewers for the previous version. Reviewers who left the board are
 * skipped and reported.
 */
export async function reassignPreviousReviewers(
  user: SessionUser,
  boardId: string,
  proposalId: string,
  input: { dueAt?: Date; confirmLikelyConflicts?: boolean } = {},
): Promise<AssignResult & { skipped: { id: string; name: string }[] }> {
  const access = await proposalAccess(user, boardId, proposalId);
  authorize(user, "review.assign", { role: access.role }, "That proposal");
  const latest = access.proposal.latestVersion;
  if (latest < 2) throw conflict("There is no resubmitted version yet: the previous reviewers can be asked again once version 2 is submitted.");
  const [prev] = await db()
    .select({ id: proposalVersions.id })
    .from(proposalVersions)
    .where(and(eq(proposalVersions.proposalId, proposalId), eq(proposalVersions.boardId, boardId), eq(proposalVersions.number, latest - 1)));
  const rows = await db()
    .select({ id: users.id, name: users.name, memberStatus: boardMembers.status, userStatus: users.status, role: boardMembers.role })
    .from(assignments)
    .innerJoin(users, eq(users.id, assignments.reviewerId))
    .leftJoin(boardMembers, and(eq(boardMembers.boardId, boardId), eq(boardMembers.userId, assignments.reviewerId)))
    .where(and(eq(assignments.boardId, boardId), eq(assignments.versionId, prev?.id ?? "00000000-0000-0000-0000-000000000000")))
    .orderBy(asc(assignments.createdAt));
  const active = rows.filter((r) => r.memberStatus === "active" && r.userStatus === "active" && r.role === "reviewer");
  const skipped = rows.filter((r) => !active.includes(r)).map((r) => ({ id: r.id, name: r.name }));
  if (!active.length)
    throw conflict("None of the previous version's reviewers is still an active reviewer on this board; assign reviewers on the call's assignment page.");
  const dueAt = input.dueAt ?? new Date(Date.now() + REASSIGN_DAYS * 86_400_000);
  const result = await assignReviewers(user, boardId, {
    proposalIds: [proposalId],
    reviewerIds: active.map((r) => r.id),
    dueAt,
    confirmLikelyConflicts: input.confirmLikelyConflicts ?? true,
  });
  return { ...result, skipped };
}
