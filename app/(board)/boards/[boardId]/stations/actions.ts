"use server";
import { z } from "zod";
import { action } from "@/lib/actions/action";
import { createStation, deleteStation } from "@/lib/dal/stations";
import { stationFormInput } from "@/lib/validation/stations";

/** Adds a ground station to the board's list (chairs). */
export const createStationAction = action(z.object({ boardId: z.uuid() }).and(stationFormInput), async ({ boardId, ...input }, user) => {
  return createStation(user, boardId, input);
});

/** Removes a ground station from the board's list (chairs). */
export const deleteStationAction = action(z.object({ boardId: z.uuid(), stationId: z.uuid() }), async ({ boardId, stationId }, user) => {
  return deleteStation(user, boardId, stationId);
});
