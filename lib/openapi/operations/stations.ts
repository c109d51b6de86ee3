import { z } from "zod";
import { defineOperations } from "../registry";
import { stationInput } from "@/lib/validation/stations";

const board = "/api/v1/boards/{boardId}";

const station = z.object({
  id: z.uuid(),
  name: z.string(),
  latitude: z.number().describe("deg, north positive"),
  longitude: z.number().describe("deg, east positive"),
  altitude: z.number().describe("km above the reference sphere"),
  minimumElevation: z.number().describe("deg above the horizon"),
});

/** The board's ground stations, kept by the chair and picked by contact checks. */
export const stationOperations = defineOperations([
  {
    method: "get",
    path: `${board}/stations`,
    operationId: "listStations",
    summary: "The board's ground stations (every member)",
    tag: "stations",
    access: "signed-in",
    response: z.object({ stations: z.array(station) }),
  },
  {
    method: "post",
    path: `${board}/stations`,
    operationId: "createStation",
    summary: "Add a ground station: name, position and minimum elevation (chairs)",
    tag: "stations",
    access: "signed-in",
    body: stationInput,
    response: z.object({ station }),
    errors: { 409: "The board already has a station of that name" },
  },
  {
    method: "delete",
    path: `${board}/stations/{stationId}`,
    operationId: "deleteStation",
    summary: "Remove a ground station (chairs); dossiers keep the values they copied",
    tag: "stations",
    access: "signed-in",
    response: z.object({ ok: z.literal(true) }),
  },
]);
