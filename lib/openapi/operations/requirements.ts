import { z } from "zod";
import { defineOperations } from "../registry";
import { callRequirementSchema, requirementBodySchema } from "@/lib/validation/requirements";

const call = "/api/v1/boards/{boardId}/calls/{callId}";

export const requirementOperations = defineOperations([
  {
    method: "get",
    path: `${call}/requirements`,
    operationId: "listCallRequirements",
    summary: "Requirements the call sets on every dossier (Δv margins, mass margin, disposal deadline, eclipse), with their rationale",
    tag: "calls",
    access: "signed-in",
    response: z.object({ requirements: z.array(callRequirementSchema) }),
  },
  {
    method: "post",
    path: `${call}/requirements`,
    operationId: "addCallRequirement",
    summary: "Add a requirement to the call (chairs); parameters are checked by the requirement type, and a wrong one is named",
    tag: "calls",
    access: "signed-in",
    body: requirementBodySchema,
    response: z.object({ requirement: callRequirementSchema }),
  },
  {
    method: "delete",
    path: `${call}/requirements/{requirementId}`,
    operationId: "removeCallRequirement",
    summary: "Remove a requirement from the call (chairs); versions already submitted keep their judgement",
    tag: "calls",
    access: "signed-in",
    response: z.object({ removed: z.literal(true) }),
  },
]);
