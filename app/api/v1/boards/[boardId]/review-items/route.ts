import { requireUser } from "@/lib/auth/session";
import { createReviewItem, listReviewItems } from "@/lib/dal/review-items";
import { json, parseWith, readJson, route, searchParamsObject } from "@/lib/http/api";
import { listItemsQuery, reviewItemInput } from "@/lib/validation/review";

export const GET = route(async (request, params) => {
  const user = await requireUser();
  const { proposalId } = parseWith(listItemsQuery, searchParamsObject(request), 400);
  return json({ items: await listReviewItems(user, params.boardId ?? "", proposalId) });
});

export const POST = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, reviewItemInput);
  return json({ item: await createReviewItem(user, params.boardId ?? "", input) }, 201);
});
