import { requireUser } from "@/lib/auth/session";
import { getCallRubric, saveCallRubric } from "@/lib/dal/rubrics";
import { json, readJson, route } from "@/lib/http/api";
import { rubricInput } from "@/lib/validation/review";

export const GET = route(async (_request, params) => {
  const user = await requireUser();
  return json(await getCallRubric(user, params.boardId ?? "", params.callId ?? ""));
});

export const PUT = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, rubricInput);
  return json({ rubric: await saveCallRubric(user, params.boardId ?? "", params.callId ?? "", input) });
});
