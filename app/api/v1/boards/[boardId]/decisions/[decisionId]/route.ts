import { requireUser } from "@/lib/auth/session";
import { getDecision } from "@/lib/decisions";
import { json, route } from "@/lib/http/api";

export const GET = route(async (_request, params) => {
  const user = await requireUser();
  return json({ decision: await getDecision(user, params.boardId ?? "", params.decisionId ?? "") });
});
