import { requireUser } from "@/lib/auth/session";
import { getCallTolerance, updateCallTolerance } from "@/lib/dal/calls";
import { json, readJson, route } from "@/lib/http/api";
import { tolerancePolicySchema } from "@/lib/validation/dossier";

export const GET = route(async (_request, { boardId, callId }) => {
  const user = await requireUser();
  return json(await getCallTolerance(user, boardId!, callId!));
});

export const PUT = route(async (request, { boardId, callId }) => {
  const user = await requireUser();
  const input = await readJson(request, tolerancePolicySchema, 8 * 1024);
  return json(await updateCallTolerance(user, boardId!, callId!, input));
});
