import { requireUser } from "@/lib/auth/session";
import { removeAssignment } from "@/lib/dal/assignments";
import { json, route } from "@/lib/http/api";

export const DELETE = route(async (_request, params) => {
  const user = await requireUser();
  return json(await removeAssignment(user, params.boardId ?? "", params.assignmentId ?? ""));
});
