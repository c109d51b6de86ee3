import { requireUser } from "@/lib/auth/session";
import { addRequirement, listRequirements } from "@/lib/dal/requirements";
import { json, readJson, route } from "@/lib/http/api";
import { requirementInputSchema } from "@/lib/validation/requirements";

export const GET = route(async (_request, { boardId, callId }) => {
  const user = await requireUser();
  return json({ requirements: await listRequirements(user, boardId!, callId!) });
});

export const POST = route(async (request, { boardId, callId }) => {
  const user = await requireUser();
  const input = await readJson(request, requirementInputSchema, 16 * 1024);
  return json({ requirement: await addRequirement(user, boardId!, callId!, input) }, 201);
});
