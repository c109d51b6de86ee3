import { requireUser } from "@/lib/auth/session";
import { getMeeting, startMeeting } from "@/lib/dal/meetings";
import { json, readJson, route } from "@/lib/http/api";
import { startMeetingSchema } from "@/lib/validation/meetings";

export const GET = route(async (_request, { boardId, callId }) => {
  const user = await requireUser();
  return json(await getMeeting(user, boardId!, callId!));
});

export const POST = route(async (request, { boardId, callId }) => {
  const user = await requireUser();
  const input = await readJson(request, startMeetingSchema, 64 * 1024);
  return json(await startMeeting(user, boardId!, callId!, input));
});
