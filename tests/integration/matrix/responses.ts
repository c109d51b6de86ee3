// Response round: the call's window (members read, chairs set/close), answers (the proposal's
// authors while the window is open), dispositions (the item's reviewer or the chair).
import { db } from "@/db/client";
import { assignments, calls } from "@/db/schema";
import { setResponseWindow } from "@/lib/dal/responses";
import { createReviewItem } from "@/lib/dal/review-items";
import { saveReviewDraft, submitReview } from "@/lib/dal/reviews";
import { saveCallRubric } from "@/lib/dal/rubrics";
import { dossierPlainText } from "@/lib/dossier";
import { makeAnchor } from "@/lib/review/anchors";
import { asSessionUser, unique } from "../../support/factories";
import { createProposalWithVersion, dossierDocument, inFuture, rubricInput } from "../review-fixtures";
import type { MatrixCast, MatrixRole, RouteCase } from "./types";

type Expect = Record<MatrixRole, number | number[]>;
const board = (cast: MatrixCast) => `/api/v1/boards/${cast.board.id}`;
const members: Expect = { anonymous: 401, outsider: 404, proposer: 200, reviewer: 200, chair: 200, admin: 200 };
const chairWrites: Expect = { anonymous: 401, outsider: 404, proposer: 403, reviewer: 403, chair: 200, admin: 200 };
const fullScores = { science: { score: 4, comment: "" }, feasibility: { score: 3, comment: "" }, cost: { score: 5, comment: "" } };

/** A call whose response window is open (unless `open` is false), a proposal of the cast's proposer, and an item by the cast's reviewer, who submitted the review. */
async function openRound(cast: MatrixCast, open = true) {
  const [call] = await db()
    .insert(calls)
    .values({ boardId: cast.board.id, title: unique("Call"), opensAt: new Date(Date.now() - 86_400_000), closesAt: new Date(Date.now() + 86_400_000 * 20) })
    .returning();
  await saveCallRubric(asSessionUser(cast.chair), cast.board.id, call!.id, rubricInput);
  const { proposal, version } = await createProposalWithVersion({ boardId: cast.board.id, callId: call!.id, ownerId: cast.proposer.id, status: "in_review" });
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
  const reviewer = asSessionUser(cast.reviewer);
  const text = dossierPlainText(dossierDocument(proposal.title));
  const from = text.indexOf("95.6 minutes");
  const item = await createReviewItem(reviewer, cast.board.id, {
    proposalId: proposal.id,
    severity: "minor",
    title: "Period",
    body: "Please show the constants used.",
    anchor: makeAnchor(text, from, from + 12),
  });
  const saved = await saveReviewDraft(reviewer, cast.board.id, assignment!.id, { revision: 0, scores: fullScores, summary: "" });
  await submitReview(reviewer, cast.board.id, assignment!.id, { revision: saved.revision });
  if (open)
    await setResponseWindow(asSessionUser(cast.chair), cast.board.id, call!.id, {
      opensAt: new Date(Date.now() - 3_600_000),
      closesAt: new Date(Date.now() + 5 * 86_400_000),
    });
  return { call: call!, proposal, item };
}

export const responseRouteCases: RouteCase[] = [
  {
    operationId: "getResponseWindow",
    prepare: async (cast) => ({ path: `${board(cast)}/calls/${(await openRound(cast)).call.id}/response-window` }),
    expect: members,
  },
  {
    operationId: "setResponseWindow",
    prepare: async (cast) => ({
      path: `${board(cast)}/calls/${(await openRound(cast, false)).call.id}/response-window`,
      body: { opensAt: "1 Jan 2026", closesAt: "31 Dec 2099 17:00" },
    }),
    expect: chairWrites,
  },
  {
    operationId: "closeResponseWindow",
    prepare: async (cast) => ({ path: `${board(cast)}/calls/${(await openRound(cast)).call.id}/response-window/close` }),
    expect: chairWrites,
  },
  // Only the proposal's authors answer; the reviewer and the chair see the item but are not authors.
  {
    operationId: "answerReviewItem",
    prepare: async (cast) => ({
      path: `${board(cast)}/review-items/${(await openRound(cast)).item.id}/answer`,
      body: { body: "The constants are in annex B." },
    }),
    expect: { anonymous: 401, outsider: 404, proposer: 200, reviewer: 403, chair: 403, admin: 403 },
  },
  {
    operationId: "listDispositions",
    prepare: async (cast) => ({ path: `${board(cast)}/review-items/${(await openRound(cast)).item.id}/dispositions` }),
    expect: members,
  },
  {
    operationId: "recordDisposition",
    prepare: async (cast) => ({
      path: `${board(cast)}/review-items/${(await openRound(cast)).item.id}/dispositions`,
      body: { disposition: "agreed", reason: "" },
    }),
    expect: { anonymous: 401, outsider: 404, proposer: 403, reviewer: 201, chair: 201, admin: 201 },
  },
];
