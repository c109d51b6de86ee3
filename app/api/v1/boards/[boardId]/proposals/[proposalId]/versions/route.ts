import { requireUser } from "@/lib/auth/session";
import { listVersions } from "@/lib/dal/proposals";
import { json, route } from "@/lib/http/api";

export const GET = route(async (_request, { boardId, proposalId }) => {
  const user = await requireUser();
  return json({ versions: await listVersions(user, boardId!, proposalId!) });
});
