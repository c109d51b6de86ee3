import { requireUser } from "@/lib/auth/session";
import { saveCheckNote } from "@/lib/dal/reviews";
import { json, readJson, route } from "@/lib/http/api";
import { checkNoteInput } from "@/lib/validation/review";

export const PUT = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, checkNoteInput);
  return json(await saveCheckNote(user, params.boardId ?? "", params.assignmentId ?? "", params.checkResultId ?? "", input));
});
