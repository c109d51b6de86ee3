import { requireUser } from "@/lib/auth/session";
import { rerunVersionWithTodaysRules } from "@/lib/dal/proposals";
import { json, parseWith, route } from "@/lib/http/api";
import { versionNumberSchema } from "@/lib/validation/dossier";

// Chairs: the version recomputed under today's engine and the call's current policy, beside
// its stored record. Reads only; the record is never changed.
export const GET = route(async (_request, { boardId, proposalId, number }) => {
  const user = await requireUser();
  const n = parseWith(versionNumberSchema, number, 400);
  return json({ rerun: await rerunVersionWithTodaysRules(user, boardId!, proposalId!, n) });
});
