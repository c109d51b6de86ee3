import { requireUser } from "@/lib/auth/session";
import { listMembers } from "@/lib/dal/members";
import { json, parseWith, route, searchParamsObject } from "@/lib/http/api";
import { memberListQuerySchema } from "@/lib/validation/accounts";

export const GET = route(async (request, params) => {
  const user = await requireUser();
  const query = parseWith(memberListQuerySchema, searchParamsObject(request), 400);
  return json(await listMembers(user, params.boardId ?? "", query));
});
