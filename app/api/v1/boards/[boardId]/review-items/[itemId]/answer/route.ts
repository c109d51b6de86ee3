import { requireUser } from "@/lib/auth/session";
import { answerReviewItem } from "@/lib/dal/responses";
import { json, readJson, route } from "@/lib/http/api";
import { answerInput } from "@/lib/validation/responses";

export const PUT = route(async (request, { boardId, itemId }) => {
  const user = await requireUser();
  const input = await readJson(request, answerInput, 64 * 1024);
  return json({ item: await answerReviewItem(user, boardId!, itemId!, input) });
});
