import { requireUser } from "@/lib/auth/session";
import { setCallRankBy } from "@/lib/dal/meetings";
import { json, readJson, route } from "@/lib/http/api";
import { rankBySchema } from "@/lib/validation/meetings";

export const PUT = route(async (request, { boardId, callId }) => {
  const user = await requireUser();
  const input = await readJson(request, rankBySchema, 1024);
  return json(await setCallRankBy(user, boardId!, callId!, input));
});
