import { requireUser } from "@/lib/auth/session";
import { listAttachments, presignAttachmentUpload } from "@/lib/dal/attachments";
import { json, readJson, route } from "@/lib/http/api";
import { presignUploadSchema } from "@/lib/validation/dossier";

export const GET = route(async (_request, { boardId, proposalId }) => {
  const user = await requireUser();
  return json({ attachments: await listAttachments(user, boardId!, proposalId!) });
});

/** Starts an upload: checks the declared file and answers a short-lived presigned PUT URL. */
export const POST = route(async (request, { boardId, proposalId }) => {
  const user = await requireUser();
  const input = await readJson(request, presignUploadSchema, 4 * 1024);
  return json(await presignAttachmentUpload(user, boardId!, proposalId!, input), 201);
});
