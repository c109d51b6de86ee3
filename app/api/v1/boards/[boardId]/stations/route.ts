import { requireUser } from "@/lib/auth/session";
import { createStation, listStations } from "@/lib/dal/stations";
import { json, readJson, route } from "@/lib/http/api";
import { stationInput } from "@/lib/validation/stations";

export const GET = route(async (_request, params) => {
  const user = await requireUser();
  const { stations } = await listStations(user, params.boardId ?? "");
  return json({ stations });
});

export const POST = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, stationInput);
  return json({ station: await createStation(user, params.boardId ?? "", input) }, 201);
});
