import { requireUser } from "@/lib/auth/session";
import { listProposalReviews, listReviewQueue } from "@/lib/dal/reviews";
import { json, parseWith, route, searchParamsObject } from "@/lib/http/api";
import { reviewsQuery } from "@/lib/validation/review";

/** Without proposalId: the caller's review queue. With it: every review of that proposal (chairs). */
export const GET = route(async (request, params) => {
  const user = await requireUser();
  const { proposalId } = parseWith(reviewsQuery, searchParamsObject(request), 400);
  if (proposalId) return json({ reviews: await listProposalReviews(user, params.boardId ?? "", proposalId) });
  return json({ queue: await listReviewQueue(user, params.boardId ?? "") });
});
