import "server-only";
import type { RequirementOutcome } from "@/lib/requirements";
import type { SessionUser } from "@/lib/auth/session";
import { decisionViews, loadDecisionContext, type DecisionView } from "@/lib/dal/decisions";
import { reviewAggregate } from "@/lib/dal/reviews";
import { loadTemplate } from "@/lib/dal/rubrics";
import { checkResultsOfVersion, reviewItemsOfVersion, reviewRowsOfVersion } from "@/lib/dal/versions";
import { countClaims, type ClaimCounts } from "./claim-counts";
import { MERGE_FIELDS, type MergeFieldInfo } from "./merge-fields";
import { DEFAULT_LETTER_TEMPLATE } from "./template";
import { requireChair } from "./access";

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

/** What the chair sees before deciding: reviews, items, stored checks, earlier decisions, the template. */
export async function getDecisionWorkspace(user: SessionUser, boardId: string, proposalId: string): Promise<DecisionWorkspace> {
  await requireChair(user, boardId, proposalId);
  const ctx = await loadDecisionContext(boardId, proposalId);
  const all = await decisionViews(boardId, proposalId, true);
  const version = ctx.version;
  const decision = version ? (all.find((d) => d.versionNumber === version.number) ?? null) : null;

  let reviewList: WorkspaceReview[] = [];
  let items: WorkspaceItem[] = [];
  let checks: WorkspaceCheck[] = [];
  let claimCounts: ClaimCounts = countClaims([]);
  let aggregate: DecisionWorkspace["aggregate"] = { weightedMean: null, spread: null, count: 0, assigned: 0, totals: [], scale: null };
  if (version) {
    const agg = await reviewAggregate(boardId, proposalId, version.id);
    if (agg) aggregate = { weightedMean: agg.weightedMean, spread: agg.spread, count: agg.count, assigned: agg.assigned, totals: agg.totals, scale: agg.scale };
    const rows = await reviewRowsOfVersion(boardId, version.id);
    const rubrics = new Map<string, { id: string; title: string }[]>();
    for (const id of new Set(rows.map((r) => r.rubricTemplateId).filter((t): t is string => Boolean(t))))
      rubrics.set(id, (await loadTemplate(boardId, id))?.criteria.map((c) => ({ id: c.id, title: c.title })) ?? []);
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
    items = (await reviewItemsOfVersion(boardId, version.id)).map((i) => ({ ...i }));
    const checkRows = await checkResultsOfVersion(boardId, version.id);
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
