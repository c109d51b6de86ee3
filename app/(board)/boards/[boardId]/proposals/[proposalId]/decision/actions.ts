"use server";
import { z } from "zod";
import { action } from "@/lib/actions/action";
import { createDecision, previewDecision } from "@/lib/decisions";
import { decisionInput, decisionPreviewInput } from "@/lib/validation/decisions";

const where = { boardId: z.uuid(), proposalId: z.uuid() };

export const previewDecisionAction = action(decisionPreviewInput.extend(where), async ({ boardId, proposalId, ...input }, user) =>
  previewDecision(user, boardId, proposalId, input),
);

export const issueDecisionAction = action(decisionInput.extend(where), async ({ boardId, proposalId, ...input }, user) => {
  const decision = await createDecision(user, boardId, proposalId, input);
  return { id: decision.id, outcome: decision.outcome };
});
