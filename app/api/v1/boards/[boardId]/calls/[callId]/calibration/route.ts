import { requireUser } from "@/lib/auth/session";
import { getCallCalibration } from "@/lib/dal/meetings";
import { json, route } from "@/lib/http/api";

export const GET = route(async (_request, { boardId, callId }) => {
  const user = await requireUser();
  return json(await getCallCalibration(user, boardId!, callId!));
});
