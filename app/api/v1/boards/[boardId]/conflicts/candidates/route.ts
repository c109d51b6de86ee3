import { requireUser } from "@/lib/auth/session";
import { listConflictCandidates } from "@/lib/dal/conflicts";
import { json, route } from "@/lib/http/api";

export const GET = route(async (_request, params) => {
  const user = await requireUser();
  return json({ proposals: await listConflictCandidates(user, params.boardId ?? "") });
});
