import { requireUser } from "@/lib/auth/session";
import { clientAddress } from "@/lib/auth/options";
import { signOutOtherSessions } from "@/lib/dal/accounts";
import { json, route } from "@/lib/http/api";

export const POST = route(async (request) => {
  const user = await requireUser();
  return json(await signOutOtherSessions(user, { ipAddress: clientAddress(request.headers) }));
});
