import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { boards, groundStations } from "@/db/schema";
import { authorize } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { conflict, notFound } from "@/lib/errors";
import type { StationInput } from "@/lib/validation/stations";
import { recordAudit } from "./audit";
import { boardRole, isUuid } from "./boards";

export interface StationView {
  id: string;
  name: string;
  latitude: number;
  longitude: number;
  altitude: number;
  minimumElevation: number;
}

const columns = {
  id: groundStations.id,
  name: groundStations.name,
  latitude: groundStations.latitude,
  longitude: groundStations.longitude,
  altitude: groundStations.altitude,
  minimumElevation: groundStations.minimumElevation,
};

async function boardName(boardId: string): Promise<string> {
  const [row] = await db().select({ name: boards.name }).from(boards).where(eq(boards.id, boardId)).limit(1);
  if (!row) throw notFound("That board");
  return row.name;
}

/** The board's stations, for every member (proposers pick from them in contact checks). */
export async function listStations(user: SessionUser, boardId: string): Promise<{ boardName: string; canManage: boolean; stations: StationView[] }> {
  const role = isUuid(boardId) ? await boardRole(user.id, boardId) : null;
  authorize(user, "board.view", { role }, "That board");
  const name = await boardName(boardId);
  const stations = await db().select(columns).from(groundStations).where(eq(groundStations.boardId, boardId)).orderBy(asc(groundStations.name));
  return { boardName: name, canManage: user.isAdmin || role === "chair", stations };
}

/** Adds a station (chairs). Names are unique per board. */
export async function createStation(user: SessionUser, boardId: string, input: StationInput): Promise<StationView> {
  const role = isUuid(boardId) ? await boardRole(user.id, boardId) : null;
  authorize(user, "board.manage", { role }, "That board");
  await boardName(boardId);
  return db().transaction(async (tx) => {
    const [existing] = await tx
      .select({ id: groundStations.id })
      .from(groundStations)
      .where(and(eq(groundStations.boardId, boardId), eq(groundStations.name, input.name)))
      .limit(1);
    if (existing) throw conflict(`This board already has a station named “${input.name}”; choose another name.`);
    const [row] = await tx
      .insert(groundStations)
      .values({
        boardId,
        name: input.name,
        latitude: input.latitude,
        longitude: input.longitude,
        altitude: input.altitude,
        minimumElevation: input.minimumElevation,
      })
      .returning(columns);
    await recordAudit({ action: "station.create", actorId: user.id, actorEmail: user.email, boardId, target: row!.id, details: { ...input } }, tx);
    return row!;
  });
}

/** Removes a station (chairs). Dossiers keep the station values they copied. */
export async function deleteStation(user: SessionUser, boardId: string, stationId: string): Promise<{ ok: true }> {
  const role = isUuid(boardId) ? await boardRole(user.id, boardId) : null;
  authorize(user, "board.manage", { role }, "That board");
  if (!isUuid(stationId)) throw notFound("That station");
  return db().transaction(async (tx) => {
    const deleted = await tx
      .delete(groundStations)
      .where(and(eq(groundStations.boardId, boardId), eq(groundStations.id, stationId)))
      .returning(columns);
    if (deleted.length === 0) throw notFound("That station");
    await recordAudit({ action: "station.delete", actorId: user.id, actorEmail: user.email, boardId, target: stationId, details: deleted[0] }, tx);
    return { ok: true as const };
  });
}
