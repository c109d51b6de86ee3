import { requireUser } from "@/lib/auth/session";
import { submitProposal } from "@/lib/dal/proposals";
import { json, readJson, route } from "@/lib/http/api";
import { submitSchema } from "@/lib/validation/dossier";

export const POST = route(async (request, { boardId, proposalId }) => {
  const user = await requireUser();
  const input = (await readJson(request, submitSchema.optional(), 4 * 1024)) ?? {};
  return json({ submission: await submitProposal(user, boardId!, proposalId!, input) }, 201);
});
