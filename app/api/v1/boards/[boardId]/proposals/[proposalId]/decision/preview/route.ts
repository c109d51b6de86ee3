import { requireUser } from "@/lib/auth/session";
import { previewDecision } from "@/lib/decisions";
import { json, readJson, route } from "@/lib/http/api";
import { decisionPreviewInput } from "@/lib/validation/decisions";

/** The merged letter and its e-mail (subject, HTML, text) without storing anything. */
export const POST = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, decisionPreviewInput);
  return json({ preview: await previewDecision(user, params.boardId ?? "", params.proposalId ?? "", input) });
});
