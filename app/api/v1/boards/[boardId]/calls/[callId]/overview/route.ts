import { requireUser } from "@/lib/auth/session";
import { getCallOverview } from "@/lib/dal/reviews";
import { json, route } from "@/lib/http/api";

export const GET = route(async (_request, params) => {
  const user = await requireUser();
  return json(await getCallOverview(user, params.boardId ?? "", params.callId ?? ""));
});
