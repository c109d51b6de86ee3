import { requireUser } from "@/lib/auth/session";
import { withdrawConflict } from "@/lib/dal/conflicts";
import { json, route } from "@/lib/http/api";

export const DELETE = route(async (_request, params) => {
  const user = await requireUser();
  return json(await withdrawConflict(user, params.boardId ?? "", params.conflictId ?? ""));
});
