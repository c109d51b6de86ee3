import { requireUser } from "@/lib/auth/session";
import { recordMeetingOutcome } from "@/lib/dal/meetings";
import { json, readJson, route } from "@/lib/http/api";
import { meetingRecordSchema } from "@/lib/validation/meetings";

export const PUT = route(async (request, { boardId, callId, proposalId }) => {
  const user = await requireUser();
  const input = await readJson(request, meetingRecordSchema, 32 * 1024);
  return json(await recordMeetingOutcome(user, boardId!, callId!, proposalId!, input));
});
