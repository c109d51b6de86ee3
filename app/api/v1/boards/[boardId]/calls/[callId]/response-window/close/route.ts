import { requireUser } from "@/lib/auth/session";
import { closeResponseWindow } from "@/lib/dal/responses";
import { json, route } from "@/lib/http/api";

export const POST = route(async (_request, { boardId, callId }) => {
  const user = await requireUser();
  return json({ window: await closeResponseWindow(user, boardId!, callId!) });
});
