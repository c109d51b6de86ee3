import { requireUser } from "@/lib/auth/session";
import { getCall, updateCall } from "@/lib/dal/calls";
import { json, readJson, route } from "@/lib/http/api";
import { callInputSchema } from "@/lib/validation/dossier";

export const GET = route(async (_request, { boardId, callId }) => {
  const user = await requireUser();
  return json({ call: await getCall(user, boardId!, callId!) });
});

export const PUT = route(async (request, { boardId, callId }) => {
  const user = await requireUser();
  const input = await readJson(request, callInputSchema, 64 * 1024);
  return json({ call: await updateCall(user, boardId!, callId!, input) });
});
