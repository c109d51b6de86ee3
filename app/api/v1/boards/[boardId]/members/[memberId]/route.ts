import { requireUser } from "@/lib/auth/session";
import { clientAddress } from "@/lib/auth/options";
import { updateMember } from "@/lib/dal/members";
import { json, readJson, route } from "@/lib/http/api";
import { updateMemberSchema } from "@/lib/validation/accounts";

export const PATCH = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, updateMemberSchema, 4 * 1024);
  return json(await updateMember(user, params.boardId ?? "", params.memberId ?? "", input, { ipAddress: clientAddress(request.headers) }));
});
