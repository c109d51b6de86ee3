import { requireUser } from "@/lib/auth/session";
import { deleteAttachment } from "@/lib/dal/attachments";
import { json, route } from "@/lib/http/api";

export const DELETE = route(async (_request, { boardId, attachmentId }) => {
  const user = await requireUser();
  return json(await deleteAttachment(user, boardId!, attachmentId!));
});
