import "server-only";
import { and, asc, eq, inArray } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { assignments, boards, calls, checkResults, decisions, proposals, proposalVersions, reviewItemReplies, reviewItems, reviews, users } from "@/db/schema";
import { authorize, can, type ResourceFacts } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { compareClaims, diffText, type VersionCheck } from "@/lib/decisions/compare";
import { OUTCOME_LABELS } from "@/lib/decisions/template";
import { dossierPlainText } from "@/lib/dossier";
import { allowanceText, orbitCheckNotice, rowHint, storedRows } from "@/lib/dossier/verdict-text";
import { notFound } from "@/lib/errors";
import { displayUnit, kindLabel, plainQuantities, policySummary, quantityName } from "@/lib/orbit/labels";
import { mean, sampleStandardDeviation } from "@/lib/review/stats";
import { calibrateScores, rankChangeNote } from "@/lib/review/calibration";
import { renderReviewReportPdf } from "@/lib/pdf/review-report";
import {
  formatFigure,
  changeLabel,
  reportFilename,
  type ReportAudience,
  type ReportChanges,
  type ReportCheck,
  type ReportCriterion,
  type ReportItem,
  type ReportRequirement,
  type ReviewReport,
} from "@/lib/reports/review-report";
import { proposalAccess, type ProposalAccess } from "./assignments";
import { authorsOf } from "./conflicts";
import { itemResponses } from "./item-responses";
import { callScoreRows } from "./meetings";
import { loadTemplate } from "./rubrics";

type Db = Database | Transaction;

/**
 * The review report of one version (issue 16 C). Who may read it is the policy's
 * "report.view": the chair (and site admins); the proposal's authors once that version is
 * decided; a reviewer assigned to that version, not in conflict, whose own review is
 * submitted, on a board that shares review items after submission. Everyone else gets 404.
 *
 * Blind rules, per reader: the chair sees reviewers named ("Reviewer 2 · Name"); proposers
 * and reviewers see them numbered ("Reviewer 2"; a reviewer sees themself as "(you)"), the
 * numbering being the order of first assignment to the proposal, as on the review items.
 * A reviewer on a board that hides proposers' names sees no proposer name anywhere.
 */

interface VersionRow {
  id: string;
  number: number;
  title: string;
  document: unknown;
  submittedAt: Date;
}

async function loadVersion(boardId: string, proposalId: string, number: number, tx: Db): Promise<VersionRow | null> {
  if (!Number.isInteger(number) || number < 1 || number > 1_000_000) return null;
  const [row] = await tx
    .select({
      id: proposalVersions.id,
      number: proposalVersions.number,
      title: proposalVersions.title,
      document: proposalVersions.document,
      submittedAt: proposalVersions.submittedAt,
    })
    .from(proposalVersions)
    .where(and(eq(proposalVersions.boardId, boardId), eq(proposalVersions.proposalId, proposalId), eq(proposalVersions.number, number)));
  return row ?? null;
}

async function reportFacts(user: SessionUser, access: ProposalAccess, versionId: string, tx: Db): Promise<ResourceFacts> {
  const assigned = access.myAssignments.find((a) => a.versionId === versionId);
  let ownReviewSubmitted = false;
  if (assigned) {
    const [r] = await tx.select({ status: reviews.status }).from(reviews).where(eq(reviews.assignmentId, assigned.id));
    ownReviewSubmitted = r?.status === "submitted";
  }
  const [decided] = await tx.select({ id: decisions.id }).from(decisions).where(eq(decisions.versionId, versionId));
  return {
    role: access.role,
    isAuthor: access.isAuthor,
    isAssigned: Boolean(assigned),
    isConflicted: access.isConflicted,
    ownReviewSubmitted,
    shareItemsAfterSubmit: access.board.shareReviewItemsAfterSubmit,
    decisionIssued: Boolean(decided),
  };
}

function audienceOf(user: SessionUser, access: ProposalAccess): ReportAudience {
  if (access.role === "chair" || (user.isAdmin && !access.isAuthor && access.role !== "reviewer")) return "chair";
  if (access.isAuthor) return "proposer";
  return "reviewer";
}

interface Reader {
  audience: ReportAudience;
  viewerId: string | null;
  hideProposerNames: boolean;
}

/** Names as the reader may see them (the same numbering as the review items). */
async function namer(proposalId: string, boardId: string, reader: Reader, tx: Db) {
  const order = await tx
    .select({ reviewerId: assignments.reviewerId, name: users.name })
    .from(assignments)
    .innerJoin(users, eq(users.id, assignments.reviewerId))
    .where(and(eq(assignments.proposalId, proposalId), eq(assignments.boardId, boardId)))
    .orderBy(asc(assignments.createdAt));
  const ordinal = new Map<string, number>();
  const names = new Map<string, string>();
  for (const o of order) {
    if (!ordinal.has(o.reviewerId)) ordinal.set(o.reviewerId, ordinal.size + 1);
    names.set(o.reviewerId, o.name);
  }
  const authorList = (await authorsOf([proposalId], tx)).get(proposalId) ?? [];
  for (const a of authorList) names.set(a.id, a.name ?? "Proposer");
  const authorIds = new Set(authorList.map((a) => a.id));
  const chair = reader.audience === "chair";
  return {
    async load(ids: string[]) {
      const missing = [...new Set(ids)].filter((id) => !names.has(id));
      if (missing.length)
        for (const u of await tx.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, missing))) names.set(u.id, u.name);
    },
    label(id: string): string {
      const name = names.get(id) ?? "Someone";
      const n = ordinal.get(id);
      if (n !== undefined) {
        if (chair) return `Reviewer ${n} · ${name}`;
        return id === reader.viewerId ? `Reviewer ${n} (you)` : `Reviewer ${n}`;
      }
      if (authorIds.has(id)) return reader.audience === "reviewer" && reader.hideProposerNames ? "Proposer" : name;
      return chair ? `Chair · ${name}` : "Chair";
    },
  };
}

function checkOf(row: {
  label: string;
  kind: string;
  status: "consistent" | "inconsistent" | "invalid";
  result: Record<string, unknown>;
  tolerance: unknown;
}): ReportCheck {
  const rows = storedRows(row.result).map((r) => {
    const u = displayUnit(r.unit);
    const withUnit = (v: unknown) => `${formatFigure(v)}${u && v !== null && v !== undefined ? ` ${u}` : ""}`;
    return {
      quantity: quantityName(r.quantity),
      claimed: withUnit(r.claimed),
      computed: withUnit(r.computed),
      allowance: allowanceText(r) ?? "the call's tolerance",
      verdict: r.ok ? ("within" as const) : ("outside" as const),
      hint: rowHint(r),
    };
  });
  const messages = Array.isArray(row.result.messages) ? (row.result.messages as unknown[]).map((m) => plainQuantities(String(m))) : [];
  const tolerance = row.tolerance as Parameters<typeof policySummary>[0] | null;
  return {
    label: row.label,
    kind: row.kind === "fileAgainstText" ? "file against the text" : kindLabel(row.kind),
    status: row.status,
    rows,
    messages,
    policy: row.kind === "fileAgainstText" ? null : tolerance ? policySummary(tolerance) : null,
  };
}

function claimDetails(c: ReturnType<typeof compareClaims>[number]): string[] {
  const out: string[] = [];
  if (c.before && c.after && c.before.status !== c.after.status) out.push(`verdict was ${c.before.status}, now ${c.after.status}`);
  for (const q of c.quantities) {
    const u = displayUnit(q.unit);
    const b = q.before?.claimed;
    const a = q.after?.claimed;
    if (b !== a && (b !== undefined || a !== undefined))
      out.push(
        `${quantityName(q.quantity)} claimed ${b === null || b === undefined ? "nothing" : `${formatFigure(b)}${u ? ` ${u}` : ""}`}, now ${a === null || a === undefined ? "nothing" : `${formatFigure(a)}${u ? ` ${u}` : ""}`}`,
      );
  }
  if (!c.before && c.after) out.push(`new claim, ${c.after.status}`);
  if (c.before && !c.after) out.push("no longer in the dossier");
  return out;
}

const PASSAGE_LIMIT = 40;
const PASSAGE_CHARS = 600;

async function changesOf(boardId: string, proposalId: string, version: VersionRow, mayReadPrevious: boolean, tx: Db): Promise<ReportChanges | null> {
  if (version.number < 2) return null;
  const previous = await loadVersion(boardId, proposalId, version.number - 1, tx);
  if (!previous) return null;
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
    .where(and(eq(checkResults.boardId, boardId), inArray(checkResults.versionId, [previous.id, version.id])))
    .orderBy(asc(checkResults.createdAt));
  const of = (versionId: string): VersionCheck[] => checks.filter((c) => c.versionId === versionId && c.kind !== "fileAgainstText");
  const text = diffText(dossierPlainText(previous.document), dossierPlainText(version.document));
  const claims = compareClaims(of(previous.id), of(version.id));
  const changed = claims.filter((c) => c.change !== "unchanged");
  const edits = text.changes.filter((c) => c.kind !== "same" && c.text.trim());
  return {
    previousNumber: previous.number,
    wordsAdded: text.wordsAdded,
    wordsRemoved: text.wordsRemoved,
    // A reviewer who may not read the previous version learns how much changed, not what.
    withheld: !mayReadPrevious,
    passages: mayReadPrevious
      ? edits.slice(0, PASSAGE_LIMIT).map((c) => ({
          kind: c.kind as "added" | "removed",
          text: c.text.trim().length > PASSAGE_CHARS ? `${c.text.trim().slice(0, PASSAGE_CHARS)}…` : c.text.trim(),
        }))
      : [],
    more: mayReadPrevious ? Math.max(0, edits.length - PASSAGE_LIMIT) : 0,
    claims: mayReadPrevious ? changed.map((c) => ({ label: c.label || kindLabel(c.kind), change: changeLabel(c.change), details: claimDetails(c) })) : [],
    unchangedClaims: claims.length - changed.length,
  };
}

/** Builds the report of one version for one reader; no policy check here (callers check). */
async function buildReport(
  boardId: string,
  proposalId: string,
  version: VersionRow,
  reader: Reader & { mayReadPrevious: boolean },
  tx: Db,
  decisionOverride?: { outcomeLabel: string; decidedAt: Date },
): Promise<ReviewReport> {
  const [access] = await tx
    .select({
      title: proposals.title,
      missionType: proposals.missionType,
      latestVersion: proposals.latestVersion,
      ownerId: proposals.ownerId,
      boardName: boards.name,
      callTitle: calls.title,
      callId: calls.id,
    })
    .from(proposals)
    .innerJoin(boards, eq(boards.id, proposals.boardId))
    .innerJoin(calls, eq(calls.id, proposals.callId))
    .where(and(eq(proposals.id, proposalId), eq(proposals.boardId, boardId)));
  if (!access) throw notFound("That proposal");
  const names = await namer(proposalId, boardId, reader, tx);

  // Scores: submitted reviews of this version, in the order of assignment.
  const reviewRows = await tx
    .select({
      reviewerId: reviews.reviewerId,
      scores: reviews.scores,
      summary: reviews.summary,
      weightedTotal: reviews.weightedTotal,
      rubricTemplateId: reviews.rubricTemplateId,
      status: reviews.status,
      confidence: reviews.confidence,
      expertise: reviews.expertise,
    })
    .from(assignments)
    .leftJoin(reviews, eq(reviews.assignmentId, assignments.id))
    .where(and(eq(assignments.boardId, boardId), eq(assignments.versionId, version.id)))
    .orderBy(asc(assignments.createdAt));
  const submitted = reviewRows.filter((r) => r.status === "submitted");
  const templateId = submitted.map((r) => r.rubricTemplateId).find((t): t is string => Boolean(t));
  const template = templateId ? await loadTemplate(boardId, templateId, tx) : null;
  const criteria: ReportCriterion[] = (template?.criteria ?? []).map((c) => ({
    id: c.id,
    title: c.title,
    weight: c.weight,
    scaleMin: c.scaleMin,
    scaleMax: c.scaleMax,
  }));
  // Criteria scored but missing from the template (a damaged record) still show, by id.
  for (const r of submitted)
    for (const id of Object.keys(r.scores ?? {})) if (!criteria.some((c) => c.id === id)) criteria.push({ id, title: id, weight: 0, scaleMin: 0, scaleMax: 0 });
  const scoreOf = (r: (typeof submitted)[number], id: string): number | null => {
    const v = r.scores?.[id]?.score;
    return typeof v === "number" && Number.isFinite(v) ? v : null;
  };
  // Calibration across the call (the panel's ridge fit of reviewer effects, docs/calibration.md):
  // the call's latest reviewed versions, with this proposal's scores taken from this version.
  const callRows = (await callScoreRows(boardId, access.callId, tx)).filter((r) => r.proposalId !== proposalId);
  const mine = submitted
    .filter((r) => r.weightedTotal !== null && r.weightedTotal !== undefined && r.reviewerId)
    .map((r) => ({ proposalId, reviewerId: r.reviewerId!, total: Number(r.weightedTotal), scores: r.scores ?? {} }));
  const observed = [...callRows, ...mine];
  const fit = mine.length ? calibrateScores(observed.map((r) => ({ proposalId: r.proposalId, reviewerId: r.reviewerId, score: r.total }))) : null;
  const fitted = fit?.proposals.find((p) => p.proposalId === proposalId) ?? null;
  const calibratedOf = (criterionId: string): number | null => {
    if (!fit) return null;
    const byCriterion = calibrateScores(
      observed.flatMap((r) => {
        const v = r.scores[criterionId]?.score;
        return typeof v === "number" && Number.isFinite(v) ? [{ proposalId: r.proposalId, reviewerId: r.reviewerId, score: v }] : [];
      }),
    );
    return byCriterion.proposals.find((p) => p.proposalId === proposalId)?.calibratedMean ?? null;
  };
  const flags = new Map(
    (fit?.outliers ?? [])
      .filter((o) => o.proposalId === proposalId)
      .map((o) => [
        o.reviewerId,
        `outlying: ${Math.abs(o.deviations).toFixed(1)} standard deviations ${o.deviations > 0 ? "above" : "below"} the other reviewers`,
      ]),
  );
  const totals = submitted
    .map((r) => r.weightedTotal)
    .filter((t): t is number => t !== null && t !== undefined)
    .map(Number);
  const scores: ReviewReport["scores"] = {
    criteria,
    reviews: submitted.map((r) => ({
      reviewerLabel: names.label(r.reviewerId!),
      weightedTotal: r.weightedTotal === null || r.weightedTotal === undefined ? null : Number(r.weightedTotal),
      scores: Object.fromEntries(criteria.map((c) => [c.id, scoreOf(r, c.id)])),
      summary: r.summary ?? "",
      // Shown to the chair only (issue 16: confidence and expertise weigh nothing and are the chair's to read).
      confidence: reader.audience === "chair" ? (r.confidence ?? null) : null,
      expertise: reader.audience === "chair" ? (r.expertise ?? null) : null,
      flag: flags.get(r.reviewerId!) ?? null,
    })),
    assigned: reviewRows.length,
    perCriterion: criteria.map((c) => {
      const values = submitted.map((r) => scoreOf(r, c.id)).filter((v): v is number => v !== null);
      return {
        criterionId: c.id,
        title: c.title,
        weight: c.weight,
        rawMean: mean(values),
        min: values.length ? Math.min(...values) : null,
        max: values.length ? Math.max(...values) : null,
        calibratedMean: calibratedOf(c.id),
      };
    }),
    overall: { rawMean: mean(totals), spread: sampleStandardDeviation(totals), calibratedMean: fitted?.calibratedMean ?? null },
    calibration:
      fit && fitted
        ? {
            method: `each reviewer's leniency estimated across the call's ${fit.proposals.length} reviewed ${fit.proposals.length === 1 ? "proposal" : "proposals"} as an additive effect shrunk toward zero (ridge, λ = ${fit.lambda}) and taken out of their scores.`,
            // Where the proposal stands among the others is the chair's to know.
            note: reader.audience === "chair" ? rankChangeNote(fitted) : null,
            proposals: fit.proposals.length,
          }
        : null,
  };

  // Review items of this version with their discussion.
  const itemRows = await tx
    .select({
      id: reviewItems.id,
      authorId: reviewItems.authorId,
      severity: reviewItems.severity,
      title: reviewItems.title,
      body: reviewItems.body,
      status: reviewItems.status,
      createdAt: reviewItems.createdAt,
    })
    .from(reviewItems)
    .where(and(eq(reviewItems.boardId, boardId), eq(reviewItems.versionId, version.id)))
    .orderBy(asc(reviewItems.createdAt));
  const replies = itemRows.length
    ? await tx
        .select({
          itemId: reviewItemReplies.reviewItemId,
          authorId: reviewItemReplies.authorId,
          body: reviewItemReplies.body,
          createdAt: reviewItemReplies.createdAt,
        })
        .from(reviewItemReplies)
        .where(
          inArray(
            reviewItemReplies.reviewItemId,
            itemRows.map((i) => i.id),
          ),
        )
        .orderBy(asc(reviewItemReplies.createdAt))
    : [];
  const responses = await itemResponses(
    itemRows.map((i) => i.id),
    tx,
  );
  const answers = [...responses.answers.values()];
  const dispositionList = [...responses.dispositions.values()].flat();
  await names.load([
    ...itemRows.map((i) => i.authorId),
    ...replies.map((r) => r.authorId),
    ...answers.map((a) => a.authorId),
    ...dispositionList.flatMap((d) => (d.actorId ? [d.actorId] : [])),
  ]);
  const items: ReportItem[] = itemRows.map((i) => ({
    severity: i.severity,
    title: i.title,
    body: i.body,
    status: i.status,
    authorLabel: names.label(i.authorId),
    createdAt: i.createdAt.toISOString(),
    replies: replies
      .filter((r) => r.itemId === i.id)
      .map((r) => ({ authorLabel: names.label(r.authorId), body: r.body, createdAt: r.createdAt.toISOString() })),
    answer: (() => {
      const a = responses.answers.get(i.id);
      if (!a) return null;
      return {
        authorLabel: names.label(a.authorId),
        body: a.body,
        updatedAt: a.updatedAt,
        pointsAt: a.section ? `version ${a.section.versionNumber}, section “${a.section.heading}”` : null,
      };
    })(),
    dispositions: (responses.dispositions.get(i.id) ?? []).map((d) => ({
      label: d.label,
      reason: d.reason,
      actorLabel: d.actorId ? names.label(d.actorId) : d.actorRole === "chair" ? "Chair" : "A reviewer",
      createdAt: d.createdAt,
    })),
  }));

  // Orbit checks as stored at submission (the record is never rewritten).
  const checkRows = await tx
    .select({
      label: checkResults.label,
      kind: checkResults.kind,
      status: checkResults.status,
      result: checkResults.result,
      requirements: checkResults.requirements,
      tolerance: checkResults.tolerance,
    })
    .from(checkResults)
    .where(and(eq(checkResults.boardId, boardId), eq(checkResults.versionId, version.id)))
    .orderBy(asc(checkResults.createdAt));
  const requirements: ReportRequirement[] = checkRows.flatMap((c) =>
    (c.requirements ?? []).map((o) => ({ claimLabel: c.label || kindLabel(c.kind), title: o.title, status: o.status, reason: o.reason })),
  );

  const [decided] = decisionOverride
    ? [decisionOverride]
    : await tx.select({ outcome: decisions.outcome, decidedAt: decisions.decidedAt }).from(decisions).where(eq(decisions.versionId, version.id));
  const decision = decided
    ? { outcomeLabel: "outcomeLabel" in decided ? decided.outcomeLabel : OUTCOME_LABELS[decided.outcome], decidedAt: decided.decidedAt.toISOString() }
    : null;

  return {
    audience: reader.audience,
    generatedAt: new Date().toISOString(),
    board: { name: access.boardName },
    call: { title: access.callTitle },
    proposal: {
      title: version.title || access.title,
      missionType: access.missionType,
      proposerName: reader.audience === "reviewer" && reader.hideProposerNames ? null : names.label(access.ownerId),
    },
    version: { number: version.number, submittedAt: version.submittedAt.toISOString(), latest: version.number === access.latestVersion },
    decision,
    scores,
    items,
    checks: checkRows.filter((c) => c.kind !== "fileAgainstText").map(checkOf),
    fileChecks: checkRows.filter((c) => c.kind === "fileAgainstText").map(checkOf),
    requirements,
    changes: await changesOf(boardId, proposalId, version, reader.mayReadPrevious, tx),
    notice: orbitCheckNotice(),
  };
}

/** The review report of version `versionNumber` as the caller may read it (404 when they may not). */
export async function getReviewReport(user: SessionUser, boardId: string, proposalId: string, versionNumber: number): Promise<ReviewReport> {
  const tx = db();
  const access = await proposalAccess(user, boardId, proposalId, tx);
  const version = await loadVersion(boardId, proposalId, versionNumber, tx);
  if (!version) throw notFound(`Version ${versionNumber} of that proposal`);
  const facts = await reportFacts(user, access, version.id, tx);
  authorize(user, "report.view", facts, "That review report");
  const audience = audienceOf(user, access);
  let mayReadPrevious = true;
  if (audience === "reviewer" && version.number > 1) {
    const [board] = await tx.select({ all: boards.reviewersSeeAllVersions }).from(boards).where(eq(boards.id, boardId));
    const previous = await loadVersion(boardId, proposalId, version.number - 1, tx);
    mayReadPrevious = Boolean(board?.all) || Boolean(previous && access.myAssignments.some((a) => a.versionId === previous.id));
  }
  return buildReport(boardId, proposalId, version, { audience, viewerId: user.id, hideProposerNames: access.board.hideProposerNames, mayReadPrevious }, tx);
}

/** Whether the caller may open the report of a version (for links); never throws for a reader without the right. */
export async function canReadReviewReport(user: SessionUser, access: ProposalAccess, versionId: string): Promise<boolean> {
  return can(user, "report.view", await reportFacts(user, access, versionId, db()));
}

/** The report PDF of a version as the caller may read it. */
export async function getReviewReportPdf(
  user: SessionUser,
  boardId: string,
  proposalId: string,
  versionNumber: number,
): Promise<{ pdf: Buffer; filename: string }> {
  const report = await getReviewReport(user, boardId, proposalId, versionNumber);
  return { pdf: await renderReviewReportPdf(report), filename: reportFilename(report.proposal.title, report.version.number) };
}

export function reportObjectKey(boardId: string, proposalId: string, decisionId: string): string {
  return `boards/${boardId}/proposals/${proposalId}/decisions/${decisionId}/review-report.pdf`;
}

/**
 * The report PDF as the proposers will read it (reviewers numbered, not named), for the
 * decision letter e-mail: the decision is not stored yet, so its outcome and date are given.
 * No policy check: the caller (createDecision) has checked that the user is the chair.
 */
export async function reviewReportPdfForLetter(
  boardId: string,
  proposalId: string,
  versionNumber: number,
  decision: { outcome: keyof typeof OUTCOME_LABELS; decidedAt: Date },
  tx: Db = db(),
): Promise<{ pdf: Buffer; filename: string }> {
  const version = await loadVersion(boardId, proposalId, versionNumber, tx);
  if (!version) throw notFound(`Version ${versionNumber} of that proposal`);
  const report = await buildReport(
    boardId,
    proposalId,
    version,
    { audience: "proposer", viewerId: null, hideProposerNames: false, mayReadPrevious: true },
    tx,
    {
      outcomeLabel: OUTCOME_LABELS[decision.outcome],
      decidedAt: decision.decidedAt,
    },
  );
  return { pdf: await renderReviewReportPdf(report), filename: reportFilename(report.proposal.title, report.version.number) };
}
