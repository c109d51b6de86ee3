import { requireUser } from "@/lib/auth/session";
import { requeueOutboxMessage } from "@/lib/dal/outbox";
import { json, route } from "@/lib/http/api";

/** "Send again" for a failed message. */
export const POST = route(async (_request, params) => {
  const user = await requireUser();
  return json({ message: await requeueOutboxMessage(user, params.messageId ?? "") });
});
