import { requireUser } from "@/lib/auth/session";
import { getProposal, updateProposal } from "@/lib/dal/proposals";
import { json, readJson, route } from "@/lib/http/api";
import { proposalUpdateSchema } from "@/lib/validation/dossier";

export const GET = route(async (_request, { boardId, proposalId }) => {
  const user = await requireUser();
  return json({ proposal: await getProposal(user, boardId!, proposalId!) });
});

export const PATCH = route(async (request, { boardId, proposalId }) => {
  const user = await requireUser();
  const input = await readJson(request, proposalUpdateSchema, 16 * 1024);
  const proposal = await updateProposal(user, boardId!, proposalId!, input);
  return json({ proposal: { id: proposal.id, title: proposal.title, missionType: proposal.missionType, status: proposal.status } });
});
