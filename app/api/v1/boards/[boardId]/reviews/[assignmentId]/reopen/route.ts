import { requireUser } from "@/lib/auth/session";
import { reopenReview } from "@/lib/dal/reviews";
import { json, readJson, route } from "@/lib/http/api";
import { reopenInput } from "@/lib/validation/review";

export const POST = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, reopenInput);
  return json({ review: await reopenReview(user, params.boardId ?? "", params.assignmentId ?? "", input) });
});
