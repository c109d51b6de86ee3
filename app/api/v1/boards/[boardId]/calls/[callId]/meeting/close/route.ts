import { requireUser } from "@/lib/auth/session";
import { closeMeeting } from "@/lib/dal/meetings";
import { json, route } from "@/lib/http/api";

export const POST = route(async (_request, { boardId, callId }) => {
  const user = await requireUser();
  return json(await closeMeeting(user, boardId!, callId!));
});
