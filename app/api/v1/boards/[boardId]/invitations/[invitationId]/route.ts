import { requireUser } from "@/lib/auth/session";
import { clientAddress } from "@/lib/auth/options";
import { revokeInvitation } from "@/lib/dal/invitations";
import { json, route } from "@/lib/http/api";

export const DELETE = route(async (request, params) => {
  const user = await requireUser();
  return json(await revokeInvitation(user, params.boardId ?? "", params.invitationId ?? "", { ipAddress: clientAddress(request.headers) }));
});
