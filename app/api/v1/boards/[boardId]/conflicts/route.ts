import { requireUser } from "@/lib/auth/session";
import { declareConflict, listConflicts } from "@/lib/dal/conflicts";
import { json, readJson, route } from "@/lib/http/api";
import { conflictInput } from "@/lib/validation/review";

export const GET = route(async (_request, params) => {
  const user = await requireUser();
  return json({ conflicts: await listConflicts(user, params.boardId ?? "") });
});

export const POST = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, conflictInput);
  return json({ conflict: await declareConflict(user, params.boardId ?? "", input) }, 201);
});
