import { requireUser } from "@/lib/auth/session";
import { clientAddress } from "@/lib/auth/options";
import { createInvitation, listInvitations } from "@/lib/dal/invitations";
import { json, readJson, route } from "@/lib/http/api";
import { createInvitationSchema } from "@/lib/validation/accounts";

export const GET = route(async (_request, params) => {
  const user = await requireUser();
  return json({ invitations: await listInvitations(user, params.boardId ?? "") });
});

export const POST = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, createInvitationSchema, 8 * 1024);
  // The token only travels in the e-mail; the API answer never carries it.
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  const { token, ...invitation } = await createInvitation(user, params.boardId ?? "", input, { ipAddress: clientAddress(request.headers) });
  return json(invitation, 201);
});
