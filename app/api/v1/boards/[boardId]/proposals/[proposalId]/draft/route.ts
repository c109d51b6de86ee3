import { requireUser } from "@/lib/auth/session";
import { getDraft, saveDraft } from "@/lib/dal/proposals";
import { MAX_DOCUMENT_BYTES } from "@/lib/dossier/schema";
import { json, readJson, route } from "@/lib/http/api";
import { draftSaveSchema } from "@/lib/validation/dossier";

export const GET = route(async (_request, { boardId, proposalId }) => {
  const user = await requireUser();
  return json({ draft: await getDraft(user, boardId!, proposalId!) });
});

/** Autosave: `revision` must be the one loaded; a stale one gets 409 and the client keeps its text. */
export const PUT = route(async (request, { boardId, proposalId }) => {
  const user = await requireUser();
  const input = await readJson(request, draftSaveSchema, MAX_DOCUMENT_BYTES + 4096);
  return json({ draft: await saveDraft(user, boardId!, proposalId!, input) });
});
