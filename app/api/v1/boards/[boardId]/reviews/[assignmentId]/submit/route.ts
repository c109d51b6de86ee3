import { requireUser } from "@/lib/auth/session";
import { submitReview } from "@/lib/dal/reviews";
import { json, readJson, route } from "@/lib/http/api";
import { reviewSubmitInput } from "@/lib/validation/review";

export const POST = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, reviewSubmitInput);
  return json({ review: await submitReview(user, params.boardId ?? "", params.assignmentId ?? "", input) });
});
