// Review area: rubrics, conflicts, assignments, reviews, check notes, review items, overview.
import { db } from "@/db/client";
import { assignments, calls } from "@/db/schema";
import { declareConflict } from "@/lib/dal/conflicts";
import { createReviewItem } from "@/lib/dal/review-items";
import { saveReviewDraft, submitReview } from "@/lib/dal/reviews";
import { saveCallRubric } from "@/lib/dal/rubrics";
import { dossierPlainText } from "@/lib/dossier";
import { makeAnchor } from "@/lib/review/anchors";
import { asSessionUser, unique } from "../../support/factories";
import { createProposalWithVersion, dossierDocument, inFuture, rubricInput } from "../review-fixtures";
import type { MatrixCast, MatrixRole, RouteCase } from "./types";

const board = (cast: MatrixCast) => `/api/v1/boards/${cast.board.id}`;

type Expect = Record<MatrixRole, number | number[]>;
const chairsOnly: Expect = { anonymous: 401, outsider: 404, proposer: 403, reviewer: 403, chair: 200, admin: 200 };
const members: Expect = { anonymous: 401, outsider: 404, proposer: 200, reviewer: 200, chair: 200, admin: 200 };
const reviewerOnly: Expect = { anonymous: 401, outsider: 404, proposer: 403, reviewer: 200, chair: 403, admin: 200 };
/** The assigned reviewer writes; the chair may not write someone's review; an admin who is not that reviewer does not find it. */
const ownReview: Expect = { anonymous: 401, outsider: 404, proposer: 403, reviewer: 200, chair: 403, admin: 404 };

/** A call with the standard rubric, a submitted proposal of the cast's proposer, and the cast's reviewer assigned. */
async function round(cast: MatrixCast) {
  const [call] = await db()
    .insert(calls)
    .values({ boardId: cast.board.id, title: unique("Call"), opensAt: new Date(Date.now() - 86_400_000), closesAt: new Date(Date.now() + 86_400_000 * 20) })
    .returning();
  await saveCallRubric(asSessionUser(cast.chair), cast.board.id, call!.id, rubricInput);
  const { proposal, version, checks } = await createProposalWithVersion({
    boardId: cast.board.id,
    callId: call!.id,
    ownerId: cast.proposer.id,
    status: "in_review",
  });
  const [assignment] = await db()
    .insert(assignments)
    .values({
      boardId: cast.board.id,
      proposalId: proposal.id,
      versionId: version.id,
      reviewerId: cast.reviewer.id,
      dueAt: inFuture(),
      assignedBy: cast.chair.id,
    })
    .returning();
  return { call: call!, proposal, version, checks, assignmentId: assignment!.id };
}

const fullScores = { science: { score: 4, comment: "" }, feasibility: { score: 3, comment: "" }, cost: { score: 5, comment: "" } };

async function anchorFor(title: string) {
  const text = dossierPlainText(dossierDocument(title));
  const from = text.indexOf("95.6 minutes");
  return makeAnchor(text, from, from + 12);
}

async function itemByReviewer(cast: MatrixCast) {
  const r = await round(cast);
  const item = await createReviewItem(asSessionUser(cast.reviewer), cast.board.id, {
    proposalId: r.proposal.id,
    severity: "minor",
    title: "Period",
    body: "Please show the constants used.",
    anchor: await anchorFor(r.proposal.title),
  });
  return item;
}

export const reviewRouteCases: RouteCase[] = [
  { operationId: "getCallRubric", prepare: async (cast) => ({ path: `${board(cast)}/rubrics/${(await round(cast)).call.id}` }), expect: members },
  {
    operationId: "saveCallRubric",
    prepare: async (cast) => ({ path: `${board(cast)}/rubrics/${(await round(cast)).call.id}`, body: rubricInput }),
    expect: chairsOnly,
  },
  { operationId: "listConflicts", prepare: async (cast) => ({ path: `${board(cast)}/conflicts` }), expect: { ...reviewerOnly, chair: 200 } },
  {
    operationId: "declareConflict",
    prepare: async (cast) => ({ path: `${board(cast)}/conflicts`, body: { organisation: "Kestrel Labs", reason: "Consulting contract until last year" } }),
    expect: { ...reviewerOnly, reviewer: 201, admin: 201 },
  },
  { operationId: "listConflictCandidates", prepare: async (cast) => ({ path: `${board(cast)}/conflicts/candidates` }), expect: reviewerOnly },
  {
    operationId: "withdrawConflict",
    prepare: async (cast) => {
      const c = await declareConflict(asSessionUser(cast.reviewer), cast.board.id, { organisation: unique("Org"), reason: "Shared lab last year" });
      return { path: `${board(cast)}/conflicts/${c.id}` };
    },
    // Only the declaring reviewer can withdraw; for an admin it is someone else's declaration.
    expect: { ...reviewerOnly, admin: 404 },
  },
  {
    operationId: "getAssignmentBoard",
    prepare: async (cast) => ({ path: `${board(cast)}/assignments`, query: { callId: (await round(cast)).call.id } }),
    expect: chairsOnly,
  },
  {
    operationId: "assignReviewers",
    prepare: async (cast) => {
      const r = await round(cast);
      const second = await createProposalWithVersion({ boardId: cast.board.id, callId: r.call.id, ownerId: cast.proposer.id });
      return {
        path: `${board(cast)}/assignments`,
        body: { proposalIds: [second.proposal.id], reviewerIds: [cast.reviewer.id], dueAt: inFuture().toISOString(), confirmLikelyConflicts: true },
      };
    },
    expect: { ...chairsOnly, chair: 201, admin: 201 },
  },
  {
    operationId: "removeAssignment",
    prepare: async (cast) => ({ path: `${board(cast)}/assignments/${(await round(cast)).assignmentId}` }),
    expect: chairsOnly,
  },
  { operationId: "listReviews", prepare: async (cast) => ({ path: `${board(cast)}/reviews` }), expect: members },
  {
    operationId: "getReview",
    prepare: async (cast) => ({ path: `${board(cast)}/reviews/${(await round(cast)).assignmentId}` }),
    expect: { anonymous: 401, outsider: 404, proposer: 404, reviewer: 200, chair: 200, admin: 200 },
  },
  {
    operationId: "saveReviewDraft",
    prepare: async (cast) => ({
      path: `${board(cast)}/reviews/${(await round(cast)).assignmentId}`,
      body: { revision: 0, scores: { science: { score: 4, comment: "" } }, summary: "" },
    }),
    expect: ownReview,
  },
  {
    operationId: "submitReview",
    prepare: async (cast) => {
      const r = await round(cast);
      await saveReviewDraft(asSessionUser(cast.reviewer), cast.board.id, r.assignmentId, { revision: 0, scores: fullScores, summary: "" });
      return { path: `${board(cast)}/reviews/${r.assignmentId}/submit`, body: { revision: 1 } };
    },
    expect: ownReview,
  },
  {
    operationId: "reopenReview",
    prepare: async (cast) => {
      const r = await round(cast);
      const saved = await saveReviewDraft(asSessionUser(cast.reviewer), cast.board.id, r.assignmentId, { revision: 0, scores: fullScores, summary: "" });
      await submitReview(asSessionUser(cast.reviewer), cast.board.id, r.assignmentId, { revision: saved.revision });
      return { path: `${board(cast)}/reviews/${r.assignmentId}/reopen`, body: { reason: "Scores entered on the wrong rows" } };
    },
    expect: chairsOnly,
  },
  {
    operationId: "saveCheckNote",
    prepare: async (cast) => {
      const r = await round(cast);
      return { path: `${board(cast)}/reviews/${r.assignmentId}/check-notes/${r.checks.inconsistent.id}`, body: { note: "Explained in section 4." } };
    },
    expect: ownReview,
  },
  {
    operationId: "listReviewItems",
    prepare: async (cast) => ({ path: `${board(cast)}/review-items`, query: { proposalId: (await round(cast)).proposal.id } }),
    expect: members,
  },
  {
    operationId: "createReviewItem",
    prepare: async (cast) => {
      const r = await round(cast);
      return {
        path: `${board(cast)}/review-items`,
        body: {
          proposalId: r.proposal.id,
          severity: "major",
          title: "Period",
          body: "Inconsistent with the altitude.",
          anchor: await anchorFor(r.proposal.title),
        },
      };
    },
    expect: { anonymous: 401, outsider: 404, proposer: 403, reviewer: 201, chair: 201, admin: 201 },
  },
  // The proposer sees review items only once a decision is issued: before that, 404.
  {
    operationId: "getReviewItem",
    prepare: async (cast) => ({ path: `${board(cast)}/review-items/${(await itemByReviewer(cast)).id}` }),
    expect: { anonymous: 401, outsider: 404, proposer: 404, reviewer: 200, chair: 200, admin: 200 },
  },
  {
    operationId: "setReviewItemStatus",
    prepare: async (cast) => ({ path: `${board(cast)}/review-items/${(await itemByReviewer(cast)).id}`, body: { status: "resolved" } }),
    expect: { anonymous: 401, outsider: 404, proposer: 404, reviewer: 200, chair: 200, admin: 200 },
  },
  {
    operationId: "replyToReviewItem",
    prepare: async (cast) => ({ path: `${board(cast)}/review-items/${(await itemByReviewer(cast)).id}/replies`, body: { body: "Constants are in annex B." } }),
    expect: { anonymous: 401, outsider: 404, proposer: 404, reviewer: 201, chair: 201, admin: 201 },
  },
  { operationId: "getCallOverview", prepare: async (cast) => ({ path: `${board(cast)}/calls/${(await round(cast)).call.id}/overview` }), expect: chairsOnly },
  {
    operationId: "getCallOverviewCsv",
    prepare: async (cast) => ({ path: `${board(cast)}/calls/${(await round(cast)).call.id}/overview/csv` }),
    expect: chairsOnly,
  },
];
