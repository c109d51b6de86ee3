import { requireUser } from "@/lib/auth/session";
import { confirmAttachment } from "@/lib/dal/attachments";
import { json, route } from "@/lib/http/api";

/** The browser finished its PUT: the server checks what arrived and records it, or removes it (422). */
export const POST = route(async (_request, { boardId, attachmentId }) => {
  const user = await requireUser();
  return json({ attachment: await confirmAttachment(user, boardId!, attachmentId!) });
});
