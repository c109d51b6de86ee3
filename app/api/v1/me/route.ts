import { requireUser } from "@/lib/auth/session";
import { getMe } from "@/lib/dal/accounts";
import { json, route } from "@/lib/http/api";

export const GET = route(async () => {
  const user = await requireUser();
  return json(await getMe(user));
});
