import { requireUser } from "@/lib/auth/session";
import { getReviewItem, setReviewItemStatus } from "@/lib/dal/review-items";
import { json, readJson, route } from "@/lib/http/api";
import { reviewItemPatch } from "@/lib/validation/review";

export const GET = route(async (_request, params) => {
  const user = await requireUser();
  return json({ item: await getReviewItem(user, params.boardId ?? "", params.itemId ?? "") });
});

export const PATCH = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, reviewItemPatch);
  return json({ item: await setReviewItemStatus(user, params.boardId ?? "", params.itemId ?? "", input) });
});
