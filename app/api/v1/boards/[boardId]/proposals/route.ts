import { requireUser } from "@/lib/auth/session";
import { createProposal, listProposals } from "@/lib/dal/proposals";
import { json, parseWith, readJson, route, searchParamsObject } from "@/lib/http/api";
import { proposalCreateSchema, proposalListQuerySchema } from "@/lib/validation/dossier";

export const GET = route(async (request, { boardId }) => {
  const user = await requireUser();
  const query = parseWith(proposalListQuerySchema, searchParamsObject(request), 400);
  return json(await listProposals(user, boardId!, query));
});

export const POST = route(async (request, { boardId }) => {
  const user = await requireUser();
  const input = await readJson(request, proposalCreateSchema, 16 * 1024);
  const proposal = await createProposal(user, boardId!, input);
  return json({ proposal: { id: proposal.id, title: proposal.title, status: proposal.status, callId: proposal.callId } }, 201);
});
