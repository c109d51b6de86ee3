import { requireUser } from "@/lib/auth/session";
import { createDecision, listProposalDecisions } from "@/lib/decisions";
import { json, readJson, route } from "@/lib/http/api";
import { decisionInput } from "@/lib/validation/decisions";

/** Decisions on the proposal's versions, newest first (the chair, and the authors once issued). */
export const GET = route(async (_request, params) => {
  const user = await requireUser();
  return json({ decisions: await listProposalDecisions(user, params.boardId ?? "", params.proposalId ?? "") });
});

/** Issues the decision on the latest version and queues the letter to the authors. */
export const POST = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, decisionInput);
  return json({ decision: await createDecision(user, params.boardId ?? "", params.proposalId ?? "", input) }, 201);
});
