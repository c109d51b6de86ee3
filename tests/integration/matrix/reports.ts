// Reports area: the review report of a version (issue 16 C).
import { asSessionUser } from "../../support/factories";
import { createDecision } from "@/lib/decisions";
import { decisionScenario } from "../decision-fixtures";
import type { MatrixCast, RouteCase } from "./types";

const letter = { type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text: "Decision on {{proposal.title}}." }] }] };

/** A decided version 1, reviewed (and submitted) by the cast's reviewer on a board that shares items after submission. */
async function decided(cast: MatrixCast) {
  const s = await decisionScenario({ cast });
  await createDecision(asSessionUser(cast.chair), cast.board.id, s.proposal.id, { outcome: "revise", letter });
  return s;
}

export const reportRouteCases: RouteCase[] = [
  {
    operationId: "getReviewReport",
    prepare: async (cast) => ({
      path: `/api/v1/boards/${cast.board.id}/proposals/${(await decided(cast)).proposal.id}/versions/1/report`,
      query: { format: "json" },
    }),
    // The chair; the authors once decided; the version's reviewer (own review submitted, the board shares items).
    expect: { anonymous: 401, outsider: 404, proposer: 200, reviewer: 200, chair: 200, admin: 200 },
  },
];
