import { requireUser } from "@/lib/auth/session";
import { getVersionCheckResults } from "@/lib/dal/proposals";
import { json, parseWith, route } from "@/lib/http/api";
import { versionNumberSchema } from "@/lib/validation/dossier";

export const GET = route(async (_request, { boardId, proposalId, number }) => {
  const user = await requireUser();
  const n = parseWith(versionNumberSchema, number, 400);
  return json({ results: await getVersionCheckResults(user, boardId!, proposalId!, n) });
});
