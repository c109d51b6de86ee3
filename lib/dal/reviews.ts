import "server-only";
import { formatDate } from "@/lib/format/dates";
import { csvCell } from "@/lib/review/csv";
import { and, asc, desc, eq, inArray, sql } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import {
  assignments,
  calls,
  checkNotes,
  checkResults,
  decisions,
  proposals,
  proposalVersions,
  reviewItems,
  reviews,
  users,
  type CriterionScore,
  type ReviewerLevel,
  type RubricCriterion,
} from "@/db/schema";
import { authorize, can } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { dossierPlainText, renderDossierHtml, type BlockVerdict } from "@/lib/dossier";
import { conflict, notFound, unprocessable } from "@/lib/errors";
import { scoreProblems, submitProblems, weightedTotal } from "@/lib/review/rubric";
import { aggregateTotals, histogram, type ScoreAggregate } from "@/lib/review/stats";
import type { ReviewDraftInput } from "@/lib/validation/review";
import { proposalAccess, type ProposalAccess } from "./assignments";
import { recordAudit } from "./audit";
import { boardRole, isUuid } from "./boards";
import { isConflicted } from "./conflicts";
import { freezeTemplate, loadTemplate, type RubricView } from "./rubrics";
import { loadCall } from "./calls";
import { orbitCheckNotice } from "@/lib/dossier/verdict-text";

type Db = Database | Transaction;

export type ReviewStatus = "not started" | "draft" | "submitted";

export interface ReviewState {
  id: string | null;
  status: ReviewStatus;
  scores: Record<string, CriterionScore>;
  summary: string;
  /** 0 before the first save; the next save must send the revision it last saw. */
  revision: number;
  weightedTotal: number | null;
  submittedAt: string | null;
  updatedAt: string | null;
  /** The reviewer's confidence in their judgement and expertise in the subject (null: not stated). Weight nothing. */
  confidence: ReviewerLevel | null;
  expertise: ReviewerLevel | null;
}

export interface CheckRow {
  id: string;
  blockId: string;
  label: string;
  kind: string;
  status: "consistent" | "inconsistent" | "invalid";
  verdict: BlockVerdict;
  note: string;
  /** The tolerance policy the verdict was found under (recorded since contract version 2). */
  tolerance?: { relative: number; absolute?: Record<string, number> } | null;
}

export interface ReviewScreen {
  assignment: { id: string; dueAt: string; reviewerId: string; reviewerName: string };
  proposal: { id: string; title: string; callId: string; callTitle: string; proposerName: string | null };
  version: { id: string; number: number; submittedAt: string; html: string; plainText: string };
  rubric: RubricView | null;
  review: ReviewState;
  checks: CheckRow[];
  /** The caller is the assigned reviewer, the review is not submitted and its version is not decided. */
  canEdit: boolean;
  /** Set once the reviewed version has a decision: the review is closed to further work. */
  closedReason: string | null;
  canReopen: boolean;
}

const emptyReview: ReviewState = {
  id: null,
  status: "not started",
  scores: {},
  summary: "",
  revision: 0,
  weightedTotal: null,
  submittedAt: null,
  updatedAt: null,
  confidence: null,
  expertise: null,
};

const reviewColumns = {
  id: reviews.id,
  status: reviews.status,
  scores: reviews.scores,
  summary: reviews.summary,
  revision: reviews.revision,
  weightedTotal: reviews.weightedTotal,
  submittedAt: reviews.submittedAt,
  updatedAt: reviews.updatedAt,
  rubricTemplateId: reviews.rubricTemplateId,
  confidence: reviews.confidence,
  expertise: reviews.expertise,
};

type ReviewRow = { [K in keyof typeof reviewColumns]: (typeof reviews.$inferSelect)[K] };

function toState(row: ReviewRow | undefined): ReviewState {
  if (!row) return emptyReview;
  return {
    id: row.id,
    status: row.status,
    scores: row.scores,
    summary: row.summary,
    revision: row.revision,
    weightedTotal: row.weightedTotal,
    submittedAt: row.submittedAt?.toISOString() ?? null,
    updatedAt: row.updatedAt.toISOString(),
    confidence: row.confidence,
    expertise: row.expertise,
  };
}

/** The decision on a version, if there is one: a decided version's reviews are closed. */
async function versionDecision(boardId: string, versionId: string, tx: Db): Promise<{ decidedAt: Date } | null> {
  const [row] = await tx
    .select({ decidedAt: decisions.decidedAt })
    .from(decisions)
    .where(and(eq(decisions.versionId, versionId), eq(decisions.boardId, boardId)))
    .limit(1);
  return row ?? null;
}

const closedText = (versionNumber: number | null, decidedAt: Date) =>
  `The board decided on ${versionNumber ? `version ${versionNumber}` : "this version"} on ${formatDate(decidedAt)}, so this review is closed: nothing more is needed from you and it can no longer be changed.`;

async function loadAssignment(boardId: string, assignmentId: string, tx: Db) {
  if (!isUuid(boardId) || !isUuid(assignmentId)) return null;
  const [row] = await tx
    .select({
      id: assignments.id,
      proposalId: assignments.proposalId,
      versionId: assignments.versionId,
      reviewerId: assignments.reviewerId,
      reviewerName: users.name,
      dueAt: assignments.dueAt,
      callId: proposals.callId,
    })
    .from(assignments)
    .innerJoin(users, eq(users.id, assignments.reviewerId))
    .innerJoin(proposals, eq(proposals.id, assignments.proposalId))
    .where(and(eq(assignments.id, assignmentId), eq(assignments.boardId, boardId)));
  return row ?? null;
}

type LoadedAssignment = NonNullable<Awaited<ReturnType<typeof loadAssignment>>>;

/**
 * Who may read a review: its reviewer (while free of conflicts: a conflicted reviewer gets
 * 404 through proposal.view) and the chair. Everyone else: 404.
 */
async function accessReview(
  user: SessionUser,
  boardId: string,
  assignmentId: string,
  tx: Db,
): Promise<{ assignment: LoadedAssignment; access: ProposalAccess; own: boolean }> {
  const assignment = await loadAssignment(boardId, assignmentId, tx);
  if (!assignment) throw notFound("That review");
  const access = await proposalAccess(user, boardId, assignment.proposalId, tx);
  const own = assignment.reviewerId === user.id;
  if (own) authorize(user, "proposal.view", access.facts, "That review");
  else if (!can(user, "review.view-all", { role: access.role })) throw notFound("That review");
  return { assignment, access, own };
}

/** Everything the review screen shows for one assignment. */
export async function getReviewScreen(user: SessionUser, boardId: string, assignmentId: string): Promise<ReviewScreen> {
  const { assignment, access, own } = await accessReview(user, boardId, assignmentId, db());
  const [version] = await db()
    .select({ id: proposalVersions.id, number: proposalVersions.number, submittedAt: proposalVersions.submittedAt, document: proposalVersions.document })
    .from(proposalVersions)
    .where(and(eq(proposalVersions.id, assignment.versionId), eq(proposalVersions.boardId, boardId)));
  if (!version) throw notFound("That version");
  const [review] = await db().select(reviewColumns).from(reviews).where(eq(reviews.assignmentId, assignment.id));
  const [call] = await db().select({ title: calls.title, rubricTemplateId: calls.rubricTemplateId }).from(calls).where(eq(calls.id, assignment.callId));
  const templateId = review?.rubricTemplateId ?? call?.rubricTemplateId ?? null;
  const rubric = templateId ? await loadTemplate(boardId, templateId) : null;
  const checks = await db()
    .select({
      id: checkResults.id,
      blockId: checkResults.blockId,
      label: checkResults.label,
      kind: checkResults.kind,
      status: checkResults.status,
      result: checkResults.result,
      requirements: checkResults.requirements,
      tolerance: checkResults.tolerance,
    })
    .from(checkResults)
    .where(and(eq(checkResults.versionId, version.id), eq(checkResults.boardId, boardId)));
  const notes = review
    ? await db().select({ checkResultId: checkNotes.checkResultId, note: checkNotes.note }).from(checkNotes).where(eq(checkNotes.reviewId, review.id))
    : [];
  const noteOf = new Map(notes.map((n) => [n.checkResultId, n.note]));
  const verdicts: Record<string, BlockVerdict> = {};
  const checkRows: CheckRow[] = checks.map((c) => {
    const result = c.result as Partial<BlockVerdict>;
    const verdict: BlockVerdict = {
      status: c.status,
      checks: Array.isArray(result.checks) ? result.checks : [],
      messages: Array.isArray(result.messages) ? result.messages : [],
      requirements: c.requirements,
    };
    verdicts[c.blockId] = verdict;
    return {
      id: c.id,
      blockId: c.blockId,
      label: c.label,
      kind: c.kind,
      status: c.status,
      verdict,
      note: noteOf.get(c.id) ?? "",
      tolerance: c.tolerance ?? null,
    };
  });
  const html = renderDossierHtml(version.document, { boardId, verdicts, tolerance: checks.find((c) => c.tolerance)?.tolerance ?? undefined });
  const order = html.match(/data-block-id="[^"]*"/g)?.map((m) => m.slice(15, -1)) ?? [];
  checkRows.sort((a, b) => order.indexOf(a.blockId) - order.indexOf(b.blockId));
  const [owner] = await db()
    .select({ name: users.name })
    .from(proposals)
    .innerJoin(users, eq(users.id, proposals.ownerId))
    .where(eq(proposals.id, assignment.proposalId));
  const hideProposer = access.board.hideProposerNames && access.role !== "chair" && !user.isAdmin;
  const state = toState(review);
  const decision = await versionDecision(boardId, version.id, db());
  const closedReason = decision ? closedText(version.number, decision.decidedAt) : null;
  return {
    assignment: { id: assignment.id, dueAt: assignment.dueAt.toISOString(), reviewerId: assignment.reviewerId, reviewerName: assignment.reviewerName },
    proposal: {
      id: access.proposal.id,
      title: access.proposal.title,
      callId: access.proposal.callId,
      callTitle: call?.title ?? "",
      proposerName: hideProposer ? null : (owner?.name ?? null),
    },
    version: { id: version.id, number: version.number, submittedAt: version.submittedAt.toISOString(), html, plainText: dossierPlainText(version.document) },
    rubric,
    review: state,
    checks: checkRows,
    canEdit: own && !closedReason && state.status !== "submitted" && can(user, "review.write", { ...access.facts, isAssigned: true }),
    closedReason,
    canReopen: state.status === "submitted" && !closedReason && can(user, "review.reopen", { role: access.role }),
  };
}

/**
 * Locks the review row (creating it on the first save, which freezes the call's rubric) and
 * checks that the caller may write it. Throws 409 for a submitted review or a stale revision.
 */
async function writableReview(user: SessionUser, boardId: string, assignmentId: string, revision: number, tx: Transaction) {
  const assignment = await loadAssignment(boardId, assignmentId, tx);
  if (!assignment) throw notFound("That review");
  // Serialise writers of one assignment (two tabs, or the first save racing another).
  await tx.select({ id: assignments.id }).from(assignments).where(eq(assignments.id, assignment.id)).for("update");
  const access = await proposalAccess(user, boardId, assignment.proposalId, tx);
  const own = assignment.reviewerId === user.id;
  authorize(user, "proposal.view", own ? access.facts : { ...access.facts, isAssigned: false }, "That review");
  authorize(user, "review.write", { ...access.facts, isAssigned: own });
  if (!own) throw notFound("That review");
  const [existing] = await tx.select(reviewColumns).from(reviews).where(eq(reviews.assignmentId, assignment.id));
  const decision = await versionDecision(boardId, assignment.versionId, tx);
  if (decision) {
    const [version] = await tx.select({ number: proposalVersions.number }).from(proposalVersions).where(eq(proposalVersions.id, assignment.versionId));
    throw conflict(closedText(version?.number ?? null, decision.decidedAt), { closed: true });
  }
  if (existing?.status === "submitted")
    throw conflict("This review is submitted and locked. Ask the chair to reopen it to change it.", { review: toState(existing) });
  const current = existing?.revision ?? 0;
  if (revision !== current)
    throw conflict(
      "This review was changed elsewhere since you loaded it (another tab or device). Your text is kept on screen; reload to see the saved version.",
      {
        review: toState(existing),
      },
    );
  let templateId = existing?.rubricTemplateId;
  if (!templateId) {
    const [call] = await tx
      .select({ rubricTemplateId: calls.rubricTemplateId })
      .from(calls)
      .where(and(eq(calls.id, assignment.callId), eq(calls.boardId, boardId)));
    templateId = call?.rubricTemplateId ?? undefined;
    if (!templateId) throw conflict("The chair has not set up the rubric for this call yet, so reviews cannot start.");
  }
  const rubric = await loadTemplate(boardId, templateId, tx);
  if (!rubric) throw conflict("The rubric of this call is missing.");
  return { assignment, existing, rubric };
}

function cleanScores(criteria: RubricCriterion[], scores: Record<string, CriterionScore>): Record<string, CriterionScore> {
  const out: Record<string, CriterionScore> = {};
  for (const c of criteria) {
    const s = scores[c.id];
    if (s) out[c.id] = { score: s.score ?? null, comment: s.comment ?? "" };
  }
  return out;
}

/** Autosave: scores, comments and summary, with optimistic concurrency on `revision`. */
export async function saveReviewDraft(user: SessionUser, boardId: string, assignmentId: string, input: ReviewDraftInput): Promise<ReviewState> {
  return db().transaction(async (tx) => {
    const { assignment, existing, rubric } = await writableReview(user, boardId, assignmentId, input.revision, tx);
    const problems = scoreProblems(rubric.criteria, input.scores);
    if (problems.length) throw unprocessable(problems.map((p) => p.message).join(" "), { issues: problems });
    const scores = cleanScores(rubric.criteria, input.scores);
    const total = weightedTotal(rubric.criteria, scores);
    let row: ReviewRow | undefined;
    if (!existing) {
      await freezeTemplate(rubric.id, tx);
      [row] = await tx
        .insert(reviews)
        .values({
          assignmentId: assignment.id,
          boardId,
          proposalId: assignment.proposalId,
          versionId: assignment.versionId,
          reviewerId: user.id,
          rubricTemplateId: rubric.id,
          scores,
          summary: input.summary,
          weightedTotal: total.value,
          revision: 1,
          confidence: input.confidence ?? null,
          expertise: input.expertise ?? null,
        })
        .returning(reviewColumns);
    } else {
      [row] = await tx
        .update(reviews)
        .set({
          scores,
          summary: input.summary,
          weightedTotal: total.value,
          revision: existing.revision + 1,
          updatedAt: new Date(),
          ...(input.confidence !== undefined ? { confidence: input.confidence } : {}),
          ...(input.expertise !== undefined ? { expertise: input.expertise } : {}),
        })
        .where(and(eq(reviews.id, existing.id), eq(reviews.revision, existing.revision)))
        .returning(reviewColumns);
    }
    return toState(row);
  });
}

/** Submits and locks the review: every criterion scored and every required comment written. */
export async function submitReview(user: SessionUser, boardId: string, assignmentId: string, input: { revision: number }): Promise<ReviewState> {
  return db().transaction(async (tx) => {
    const { existing, rubric } = await writableReview(user, boardId, assignmentId, input.revision, tx);
    if (!existing) throw unprocessable("Score the criteria before submitting: nothing has been saved yet.");
    const problems = submitProblems(rubric.criteria, existing.scores);
    if (problems.length) throw unprocessable(`The review cannot be submitted yet. ${problems.map((p) => p.message).join(" ")}`, { issues: problems });
    const total = weightedTotal(rubric.criteria, existing.scores);
    const [row] = await tx
      .update(reviews)
      .set({ status: "submitted", submittedAt: new Date(), weightedTotal: total.value, revision: existing.revision + 1, updatedAt: new Date() })
      .where(eq(reviews.id, existing.id))
      .returning(reviewColumns);
    await recordAudit(
      {
        action: "review.submit",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: existing.id,
        details: { assignmentId, weightedTotal: total.value },
      },
      tx,
    );
    return toState(row);
  });
}

/** The chair reopens a submitted review so its reviewer can change it (audited with the reason). */
export async function reopenReview(user: SessionUser, boardId: string, assignmentId: string, input: { reason: string }): Promise<ReviewState> {
  if (!isUuid(boardId)) throw notFound("That review");
  const role = await boardRole(user.id, boardId);
  authorize(user, "review.reopen", { role }, "That review");
  return db().transaction(async (tx) => {
    const assignment = await loadAssignment(boardId, assignmentId, tx);
    if (!assignment) throw notFound("That review");
    const [existing] = await tx.select(reviewColumns).from(reviews).where(eq(reviews.assignmentId, assignment.id)).for("update");
    if (!existing || existing.status !== "submitted") throw conflict("Only a submitted review can be reopened.");
    const [decided] = await tx.select({ id: decisions.id }).from(decisions).where(eq(decisions.versionId, assignment.versionId));
    if (decided) throw conflict("A decision has been issued on this version; its reviews stay as they were.");
    const [row] = await tx
      .update(reviews)
      .set({ status: "draft", submittedAt: null, revision: existing.revision + 1, updatedAt: new Date() })
      .where(eq(reviews.id, existing.id))
      .returning(reviewColumns);
    await recordAudit(
      {
        action: "review.reopen",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: existing.id,
        details: { assignmentId, reviewerId: assignment.reviewerId, reason: input.reason },
      },
      tx,
    );
    return toState(row);
  });
}

/** A reviewer's note on the server's verdict for one orbit-check block; an empty note removes it. */
export async function saveCheckNote(
  user: SessionUser,
  boardId: string,
  assignmentId: string,
  checkResultId: string,
  input: { note: string },
): Promise<{ checkResultId: string; note: string; review: ReviewState }> {
  return db().transaction(async (tx) => {
    const [current] = isUuid(assignmentId) ? await tx.select({ revision: reviews.revision }).from(reviews).where(eq(reviews.assignmentId, assignmentId)) : [];
    const { assignment, existing, rubric } = await writableReview(user, boardId, assignmentId, current?.revision ?? 0, tx);
    if (!isUuid(checkResultId)) throw notFound("That orbit check");
    const [check] = await tx
      .select({ id: checkResults.id })
      .from(checkResults)
      .where(and(eq(checkResults.id, checkResultId), eq(checkResults.versionId, assignment.versionId), eq(checkResults.boardId, boardId)));
    if (!check) throw notFound("That orbit check");
    let review = existing;
    if (!review) {
      await freezeTemplate(rubric.id, tx);
      [review] = await tx
        .insert(reviews)
        .values({
          assignmentId: assignment.id,
          boardId,
          proposalId: assignment.proposalId,
          versionId: assignment.versionId,
          reviewerId: user.id,
          rubricTemplateId: rubric.id,
        })
        .returning(reviewColumns);
    }
    if (input.note === "") await tx.delete(checkNotes).where(and(eq(checkNotes.reviewId, review!.id), eq(checkNotes.checkResultId, check.id)));
    else
      await tx
        .insert(checkNotes)
        .values({ reviewId: review!.id, checkResultId: check.id, note: input.note })
        .onConflictDoUpdate({ target: [checkNotes.reviewId, checkNotes.checkResultId], set: { note: input.note, updatedAt: new Date() } });
    return { checkResultId: check.id, note: input.note, review: toState(review) };
  });
}

export interface QueueEntry {
  assignmentId: string;
  proposalId: string;
  title: string;
  callTitle: string;
  versionNumber: number;
  dueAt: string;
  overdue: boolean;
  status: ReviewStatus;
  scored: number;
  criteria: number;
  conflicted: boolean;
  /** When the reviewed version was decided (ISO), or null: a decided version asks for no more work. */
  decidedAt: string | null;
}

/** The caller's assignments on a board, with due date and progress (criteria scored / total). */
export async function listReviewQueue(user: SessionUser, boardId: string): Promise<QueueEntry[]> {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId);
  authorize(user, "board.view", { role }, "That board");
  const rows = await db()
    .select({
      assignmentId: assignments.id,
      proposalId: assignments.proposalId,
      title: proposals.title,
      callTitle: calls.title,
      versionNumber: proposalVersions.number,
      dueAt: assignments.dueAt,
      status: reviews.status,
      scores: reviews.scores,
      reviewTemplate: reviews.rubricTemplateId,
      callTemplate: calls.rubricTemplateId,
      decidedAt: decisions.decidedAt,
    })
    .from(assignments)
    .innerJoin(proposals, eq(proposals.id, assignments.proposalId))
    .innerJoin(calls, eq(calls.id, proposals.callId))
    .innerJoin(proposalVersions, eq(proposalVersions.id, assignments.versionId))
    .leftJoin(reviews, eq(reviews.assignmentId, assignments.id))
    .leftJoin(decisions, and(eq(decisions.versionId, assignments.versionId), eq(decisions.boardId, assignments.boardId)))
    .where(and(eq(assignments.boardId, boardId), eq(assignments.reviewerId, user.id)))
    .orderBy(asc(assignments.dueAt));
  const templateIds = [...new Set(rows.map((r) => r.reviewTemplate ?? r.callTemplate).filter((t): t is string => Boolean(t)))];
  const templates = new Map<string, RubricCriterion[]>();
  for (const id of templateIds) templates.set(id, (await loadTemplate(boardId, id))?.criteria ?? []);
  const now = Date.now();
  const out: QueueEntry[] = [];
  for (const r of rows) {
    const criteria = templates.get(r.reviewTemplate ?? r.callTemplate ?? "") ?? [];
    const status: ReviewStatus = r.status ?? "not started";
    out.push({
      assignmentId: r.assignmentId,
      proposalId: r.proposalId,
      title: r.title,
      callTitle: r.callTitle,
      versionNumber: r.versionNumber,
      dueAt: r.dueAt.toISOString(),
      overdue: status !== "submitted" && !r.decidedAt && r.dueAt.getTime() < now,
      status,
      scored: weightedTotal(criteria, r.scores ?? {}).scored,
      criteria: criteria.length,
      conflicted: await isConflicted(boardId, user.id, r.proposalId),
      decidedAt: r.decidedAt?.toISOString() ?? null,
    });
  }
  return out;
}

export interface ProposalReviewSummary {
  assignmentId: string;
  reviewerId: string;
  reviewerName: string;
  versionNumber: number;
  dueAt: string;
  status: ReviewStatus;
  weightedTotal: number | null;
  submittedAt: string | null;
  /** The reviewer's stated confidence and expertise (null: not stated). Shown to the chair; weight nothing. */
  confidence: ReviewerLevel | null;
  expertise: ReviewerLevel | null;
}

/** Every review of a proposal, for the chair. */
export async function listProposalReviews(user: SessionUser, boardId: string, proposalId: string): Promise<ProposalReviewSummary[]> {
  const access = await proposalAccess(user, boardId, proposalId);
  if (!can(user, "review.view-all", { role: access.role })) throw notFound("That proposal");
  const rows = await db()
    .select({
      assignmentId: assignments.id,
      reviewerId: assignments.reviewerId,
      reviewerName: users.name,
      versionNumber: proposalVersions.number,
      dueAt: assignments.dueAt,
      status: reviews.status,
      weightedTotal: reviews.weightedTotal,
      submittedAt: reviews.submittedAt,
      confidence: reviews.confidence,
      expertise: reviews.expertise,
    })
    .from(assignments)
    .innerJoin(users, eq(users.id, assignments.reviewerId))
    .innerJoin(proposalVersions, eq(proposalVersions.id, assignments.versionId))
    .leftJoin(reviews, eq(reviews.assignmentId, assignments.id))
    .where(and(eq(assignments.boardId, boardId), eq(assignments.proposalId, proposalId)))
    .orderBy(desc(proposalVersions.number), asc(assignments.createdAt));
  return rows.map((r) => ({
    ...r,
    dueAt: r.dueAt.toISOString(),
    status: r.status ?? "not started",
    weightedTotal: r.status === "submitted" ? r.weightedTotal : null,
    submittedAt: r.submittedAt?.toISOString() ?? null,
  }));
}

export interface ProposalAggregate extends ScoreAggregate {
  proposalId: string;
  versionId: string;
  versionNumber: number;
  /** Assignments on this version (the call's target is reviewersPerProposal). */
  assigned: number;
  scale: { min: number; max: number } | null;
}

/**
 * The score aggregate of one proposal version from its submitted reviews: the mean of the
 * reviewers' weighted totals and their sample standard deviation. No policy check: the
 * caller (the chair's overview, the decision screen) has checked already. Defaults to the
 * latest version.
 */
export async function reviewAggregate(boardId: string, proposalId: string, versionId?: string, tx: Db = db()): Promise<ProposalAggregate | null> {
  const [version] = await tx
    .select({ id: proposalVersions.id, number: proposalVersions.number })
    .from(proposalVersions)
    .innerJoin(proposals, eq(proposals.id, proposalVersions.proposalId))
    .where(
      and(
        eq(proposalVersions.boardId, boardId),
        eq(proposalVersions.proposalId, proposalId),
        versionId ? eq(proposalVersions.id, versionId) : eq(proposalVersions.number, proposals.latestVersion),
      ),
    );
  if (!version) return null;
  return (await aggregatesForVersions(boardId, [{ proposalId, versionId: version.id, versionNumber: version.number }], tx))[0]!;
}

async function aggregatesForVersions(
  boardId: string,
  versions: { proposalId: string; versionId: string; versionNumber: number }[],
  tx: Db,
): Promise<ProposalAggregate[]> {
  const ids = versions.map((v) => v.versionId);
  const rows = ids.length
    ? await tx
        .select({ versionId: assignments.versionId, status: reviews.status, total: reviews.weightedTotal, templateId: reviews.rubricTemplateId })
        .from(assignments)
        .leftJoin(reviews, eq(reviews.assignmentId, assignments.id))
        .where(and(eq(assignments.boardId, boardId), inArray(assignments.versionId, ids)))
    : [];
  const templateIds = [...new Set(rows.map((r) => r.templateId).filter((t): t is string => Boolean(t)))];
  const scales = new Map<string, { min: number; max: number }>();
  for (const id of templateIds) {
    const c = (await loadTemplate(boardId, id, tx))?.criteria[0];
    if (c) scales.set(id, { min: c.scaleMin, max: c.scaleMax });
  }
  // Group once: a filter per version made the overview quadratic in its rows.
  const byVersion = new Map<string, typeof rows>();
  for (const r of rows) {
    const list = byVersion.get(r.versionId);
    if (list) list.push(r);
    else byVersion.set(r.versionId, [r]);
  }
  return versions.map((v) => {
    const mine = byVersion.get(v.versionId) ?? [];
    const submitted = mine.filter((r) => r.status === "submitted" && r.total !== null);
    const scaleOf = submitted.map((r) => scales.get(r.templateId!)).find(Boolean) ?? null;
    return { ...v, ...aggregateTotals(submitted.map((r) => Number(r.total))), assigned: mine.length, scale: scaleOf };
  });
}

export interface OverviewRow {
  proposalId: string;
  title: string;
  status: string;
  versionNumber: number;
  assigned: number;
  target: number;
  reviews: number;
  weightedMean: number | null;
  spread: number | null;
  totals: number[];
  distribution: { level: number; count: number }[];
  openItems: { major: number; minor: number; comment: number };
  checks: { inconsistent: number; invalid: number };
  /** The call's requirements not met on the latest version's claims (second verdict axis). */
  requirementsNotMet: number;
}

export interface CallOverview {
  call: { id: string; title: string; reviewersPerProposal: number };
  scale: { min: number; max: number } | null;
  rows: OverviewRow[];
}

/** The chair's view of a call: per proposal (latest version) the aggregate, open review items by severity and orbit-check flags. */
export async function getCallOverview(user: SessionUser, boardId: string, callId: string): Promise<CallOverview> {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId);
  authorize(user, "review.view-all", { role }, "That board");
  const call = await loadCall(boardId, callId);
  if (!call) throw notFound("That call");
  const rows = await db()
    .select({
      proposalId: proposals.id,
      title: proposals.title,
      status: proposals.status,
      versionId: proposalVersions.id,
      versionNumber: proposalVersions.number,
    })
    .from(proposals)
    .innerJoin(proposalVersions, and(eq(proposalVersions.proposalId, proposals.id), eq(proposalVersions.number, proposals.latestVersion)))
    .where(and(eq(proposals.boardId, boardId), eq(proposals.callId, callId), inArray(proposals.status, ["submitted", "in_review", "decided"])))
    .orderBy(asc(proposals.title));
  const aggregates = await aggregatesForVersions(boardId, rows, db());
  const versionIds = rows.map((r) => r.versionId);
  const items = versionIds.length
    ? await db()
        .select({ versionId: reviewItems.versionId, severity: reviewItems.severity, n: sql<number>`count(*)::int` })
        .from(reviewItems)
        .where(and(eq(reviewItems.boardId, boardId), inArray(reviewItems.versionId, versionIds), eq(reviewItems.status, "open")))
        .groupBy(reviewItems.versionId, reviewItems.severity)
    : [];
  const flags = versionIds.length
    ? await db()
        .select({ versionId: checkResults.versionId, status: checkResults.status, n: sql<number>`count(*)::int` })
        .from(checkResults)
        .where(and(eq(checkResults.boardId, boardId), inArray(checkResults.versionId, versionIds)))
        .groupBy(checkResults.versionId, checkResults.status)
    : [];
  const itemCounts = new Map(items.map((x) => [`${x.versionId}|${x.severity}`, x.n]));
  const flagCounts = new Map(flags.map((x) => [`${x.versionId}|${x.status}`, x.n]));
  const unmet = versionIds.length
    ? await db()
        .select({
          versionId: checkResults.versionId,
          n: sql<number>`coalesce(sum((select count(*) from jsonb_array_elements(${checkResults.requirements}) o where o->>'status' = 'notMet')), 0)::int`,
        })
        .from(checkResults)
        .where(and(eq(checkResults.boardId, boardId), inArray(checkResults.versionId, versionIds)))
        .groupBy(checkResults.versionId)
    : [];
  const template = call.rubricTemplateId ? await loadTemplate(boardId, call.rubricTemplateId) : null;
  const scale =
    aggregates.find((a) => a.scale)?.scale ?? (template?.criteria[0] ? { min: template.criteria[0].scaleMin, max: template.criteria[0].scaleMax } : null);
  return {
    call: { id: call.id, title: call.title, reviewersPerProposal: call.reviewersPerProposal },
    scale,
    rows: rows.map((r, i) => {
      const a = aggregates[i]!;
      const count = (sev: "major" | "minor" | "comment") => itemCounts.get(`${r.versionId}|${sev}`) ?? 0;
      const flag = (st: "inconsistent" | "invalid") => flagCounts.get(`${r.versionId}|${st}`) ?? 0;
      return {
        proposalId: r.proposalId,
        title: r.title,
        status: r.status,
        versionNumber: r.versionNumber,
        assigned: a.assigned,
        target: call.reviewersPerProposal,
        reviews: a.count,
        weightedMean: a.weightedMean,
        spread: a.spread,
        totals: a.totals,
        distribution: scale ? histogram(a.totals, scale.min, scale.max) : [],
        openItems: { major: count("major"), minor: count("minor"), comment: count("comment") },
        checks: { inconsistent: flag("inconsistent"), invalid: flag("invalid") },
        requirementsNotMet: unmet.find((x) => x.versionId === r.versionId)?.n ?? 0,
      };
    }),
  };
}

/** The overview as CSV (one row per proposal; spread is the sample standard deviation). */
export async function getCallOverviewCsv(user: SessionUser, boardId: string, callId: string): Promise<{ filename: string; csv: string }> {
  const overview = await getCallOverview(user, boardId, callId);
  const header = [
    "proposal_id",
    "title",
    "status",
    "version",
    "reviews_submitted",
    "reviewers_assigned",
    "reviewers_target",
    "weighted_mean",
    "sample_std_dev",
    "open_major",
    "open_minor",
    "open_comment",
    "checks_inconsistent",
    "checks_invalid",
    "requirements_not_met",
  ];
  const fmt = (v: number | null) => (v === null ? "" : v.toFixed(3));
  const lines = [header.join(",")];
  for (const r of overview.rows)
    lines.push(
      [
        r.proposalId,
        r.title,
        r.status,
        r.versionNumber,
        r.reviews,
        r.assigned,
        r.target,
        fmt(r.weightedMean),
        fmt(r.spread),
        r.openItems.major,
        r.openItems.minor,
        r.openItems.comment,
        r.checks.inconsistent,
        r.checks.invalid,
        r.requirementsNotMet,
      ]
        .map(csvCell)
        .join(","),
    );
  const slug =
    overview.call.title
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-|-$/g, "") || "call";
  // The orbit-check contract's notice travels with the figures: one last row, first cell.
  lines.push(csvCell(`Notice: ${orbitCheckNotice()}`));
  return { filename: `${slug}-overview.csv`, csv: `${lines.join("\r\n")}\r\n` };
}
