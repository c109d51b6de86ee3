import { requireUser } from "@/lib/auth/session";
import { clientAddress } from "@/lib/auth/options";
import { changePassword } from "@/lib/dal/accounts";
import { json, readJson, route } from "@/lib/http/api";
import { changePasswordSchema } from "@/lib/validation/accounts";

export const POST = route(async (request) => {
  const user = await requireUser();
  const input = await readJson(request, changePasswordSchema, 4 * 1024);
  return json(await changePassword(user, input, { ipAddress: clientAddress(request.headers) }));
});
