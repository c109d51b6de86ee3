import { requireUser } from "@/lib/auth/session";
import { getVersion } from "@/lib/dal/proposals";
import { json, parseWith, route } from "@/lib/http/api";
import { versionNumberSchema } from "@/lib/validation/dossier";

export const GET = route(async (_request, { boardId, proposalId, number }) => {
  const user = await requireUser();
  const n = parseWith(versionNumberSchema, number, 400);
  const v = await getVersion(user, boardId!, proposalId!, n);
  // Object keys stay internal; the JSON and HTML are served through this API.
  return json({
    version: {
      id: v.id,
      proposalId: v.proposalId,
      number: v.number,
      title: v.title,
      submittedAt: v.submittedAt,
      attachments: v.attachments,
      counts: v.counts,
      document: v.document,
      checkResults: v.checkResults,
    },
  });
});
