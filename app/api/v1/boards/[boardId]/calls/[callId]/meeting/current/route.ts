import { requireUser } from "@/lib/auth/session";
import { moveMeeting } from "@/lib/dal/meetings";
import { json, readJson, route } from "@/lib/http/api";
import { moveMeetingSchema } from "@/lib/validation/meetings";

export const PUT = route(async (request, { boardId, callId }) => {
  const user = await requireUser();
  const input = await readJson(request, moveMeetingSchema, 4 * 1024);
  return json(await moveMeeting(user, boardId!, callId!, input));
});
