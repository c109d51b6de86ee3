// Ground stations: every member reads the board's list; only the chair (or an admin) changes it.
import type { SessionUser } from "@/lib/auth/session";
import { createStation, deleteStation } from "@/lib/dal/stations";
import { unauthenticated } from "@/lib/errors";
import { asSessionUser, unique } from "../../support/factories";
import type { ActionCase, MatrixCast, MatrixRole, RouteCase } from "./types";

type Expect = Record<MatrixRole, number | number[]>;
const members: Expect = { anonymous: 401, outsider: 404, proposer: 200, reviewer: 200, chair: 200, admin: 200 };
const chairWrites: Expect = { anonymous: 401, outsider: 404, proposer: 403, reviewer: 403, chair: 200, admin: 200 };

const stations = (cast: MatrixCast) => `/api/v1/boards/${cast.board.id}/stations`;
const station = () => ({ name: unique("Station"), latitude: 64.8, longitude: -147.7, altitude: 0.2, minimumElevation: 10 });

export const stationRouteCases: RouteCase[] = [
  { operationId: "listStations", prepare: async (cast) => ({ path: stations(cast) }), expect: members },
  { operationId: "createStation", prepare: async (cast) => ({ path: stations(cast), body: station() }), expect: { ...chairWrites, chair: 201, admin: 201 } },
  {
    operationId: "deleteStation",
    prepare: async (cast) => {
      const s = await createStation(asSessionUser(cast.chair), cast.board.id, station());
      return { path: `${stations(cast)}/${s.id}` };
    },
    expect: chairWrites,
  },
];

function signedIn(user: SessionUser | null): SessionUser {
  if (!user) throw unauthenticated();
  return user;
}

const chairAction: ActionCase["expect"] = { anonymous: 401, outsider: 404, proposer: 403, reviewer: 403, chair: "allow", admin: "allow" };
const page = "app/(board)/boards/[boardId]/stations/actions.ts";

export const stationActionCases: ActionCase[] = [
  { action: `${page}#createStationAction`, run: async (user, cast) => createStation(signedIn(user), cast.board.id, station()), expect: chairAction },
  {
    action: `${page}#deleteStationAction`,
    run: async (user, cast) => {
      const s = await createStation(asSessionUser(cast.chair), cast.board.id, station());
      return deleteStation(signedIn(user), cast.board.id, s.id);
    },
    expect: chairAction,
  },
];
