import { requireUser } from "@/lib/auth/session";
import { getResponseWindow, setResponseWindow } from "@/lib/dal/responses";
import { json, readJson, route } from "@/lib/http/api";
import { responseWindowInput } from "@/lib/validation/responses";

export const GET = route(async (_request, { boardId, callId }) => {
  const user = await requireUser();
  return json({ window: await getResponseWindow(user, boardId!, callId!) });
});

export const PUT = route(async (request, { boardId, callId }) => {
  const user = await requireUser();
  const input = await readJson(request, responseWindowInput, 4 * 1024);
  return json({ window: await setResponseWindow(user, boardId!, callId!, input) });
});
