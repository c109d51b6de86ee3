import { requireUser } from "@/lib/auth/session";
import { removeRequirement } from "@/lib/dal/requirements";
import { json, route } from "@/lib/http/api";

export const DELETE = route(async (_request, { boardId, callId, requirementId }) => {
  const user = await requireUser();
  await removeRequirement(user, boardId!, callId!, requirementId!);
  return json({ removed: true as const });
});
