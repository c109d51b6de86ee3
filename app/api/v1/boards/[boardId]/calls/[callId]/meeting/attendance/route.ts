import { requireUser } from "@/lib/auth/session";
import { setMeetingAttendance } from "@/lib/dal/meetings";
import { json, readJson, route } from "@/lib/http/api";
import { attendanceSchema } from "@/lib/validation/meetings";

export const PUT = route(async (request, { boardId, callId }) => {
  const user = await requireUser();
  const input = await readJson(request, attendanceSchema, 1024);
  return json(await setMeetingAttendance(user, boardId!, callId!, input));
});
