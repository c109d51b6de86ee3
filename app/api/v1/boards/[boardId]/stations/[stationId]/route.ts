import { requireUser } from "@/lib/auth/session";
import { deleteStation } from "@/lib/dal/stations";
import { json, route } from "@/lib/http/api";

export const DELETE = route(async (_request, params) => {
  const user = await requireUser();
  return json(await deleteStation(user, params.boardId ?? "", params.stationId ?? ""));
});
