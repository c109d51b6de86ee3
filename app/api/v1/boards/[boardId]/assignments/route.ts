import { requireUser } from "@/lib/auth/session";
import { assignReviewers, getAssignmentBoard } from "@/lib/dal/assignments";
import { json, parseWith, readJson, route, searchParamsObject } from "@/lib/http/api";
import { assignInput, callQuery } from "@/lib/validation/review";

export const GET = route(async (request, params) => {
  const user = await requireUser();
  const { callId } = parseWith(callQuery, searchParamsObject(request), 400);
  return json(await getAssignmentBoard(user, params.boardId ?? "", callId));
});

export const POST = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, assignInput);
  return json(await assignReviewers(user, params.boardId ?? "", input), 201);
});
