import { requireUser } from "@/lib/auth/session";
import { orbitFilesOfProposal } from "@/lib/dal/orbit-files";
import { json, route } from "@/lib/http/api";
import { SCREENING_CAUTION } from "@/lib/orbit";

/** The orbit files among a proposal's attachments, parsed or not. */
export const GET = route(async (_request, { boardId, proposalId }) => {
  const user = await requireUser();
  return json({ orbitFiles: await orbitFilesOfProposal(user, boardId!, proposalId!), caution: SCREENING_CAUTION });
});
