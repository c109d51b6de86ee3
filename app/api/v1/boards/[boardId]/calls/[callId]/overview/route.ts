import { requireUser } from "@/lib/auth/session";
import { getCallOverview } from "@/lib/dal/reviews";
import { json, parseWith, route, searchParamsObject } from "@/lib/http/api";
import { overviewQuerySchema } from "@/lib/validation/review";

export const GET = route(async (request, params) => {
  const user = await requireUser();
  const query = parseWith(overviewQuerySchema, searchParamsObject(request), 400);
  return json(await getCallOverview(user, params.boardId ?? "", params.callId ?? "", query));
});
