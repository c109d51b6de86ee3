import { requireUser } from "@/lib/auth/session";
import { clientAddress } from "@/lib/auth/options";
import { createInvitation, listInvitations } from "@/lib/dal/invitations";
import { json, parseWith, readJson, route, searchParamsObject } from "@/lib/http/api";
import { createInvitationSchema, invitationListQuerySchema } from "@/lib/validation/accounts";

export const GET = route(async (request, params) => {
  const user = await requireUser();
  const query = parseWith(invitationListQuerySchema, searchParamsObject(request), 400);
  return json(await listInvitations(user, params.boardId ?? "", query));
});

export const POST = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, createInvitationSchema, 8 * 1024);
  // The token only travels in the e-mail; the API answer never carries it.
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  const { token, ...invitation } = await createInvitation(user, params.boardId ?? "", input, { ipAddress: clientAddress(request.headers) });
  return json(invitation, 201);
});
