import { requireUser } from "@/lib/auth/session";
import { getVersionHtml } from "@/lib/dal/proposals";
import { json, parseWith, route } from "@/lib/http/api";
import { versionNumberSchema } from "@/lib/validation/dossier";

/** The version rendered on the server from its JSON (sanitized), with the server's verdicts by block. */
export const GET = route(async (_request, { boardId, proposalId, number }) => {
  const user = await requireUser();
  const n = parseWith(versionNumberSchema, number, 400);
  return json({ html: await getVersionHtml(user, boardId!, proposalId!, n) });
});
