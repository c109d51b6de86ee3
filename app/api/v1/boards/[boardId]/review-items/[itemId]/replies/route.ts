import { requireUser } from "@/lib/auth/session";
import { replyToReviewItem } from "@/lib/dal/review-items";
import { json, readJson, route } from "@/lib/http/api";
import { replyInput } from "@/lib/validation/review";

export const POST = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, replyInput);
  return json({ item: await replyToReviewItem(user, params.boardId ?? "", params.itemId ?? "", input) }, 201);
});
