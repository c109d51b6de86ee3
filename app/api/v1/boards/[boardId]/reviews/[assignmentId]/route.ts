import { requireUser } from "@/lib/auth/session";
import { getReviewScreen, saveReviewDraft } from "@/lib/dal/reviews";
import { json, readJson, route } from "@/lib/http/api";
import { reviewDraftInput } from "@/lib/validation/review";

export const GET = route(async (_request, params) => {
  const user = await requireUser();
  return json(await getReviewScreen(user, params.boardId ?? "", params.assignmentId ?? ""));
});

/** Autosave. Send the revision last seen; a stale one is 409 with the saved review in details. */
export const PUT = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, reviewDraftInput);
  return json({ review: await saveReviewDraft(user, params.boardId ?? "", params.assignmentId ?? "", input) });
});
