// The board's ground stations over /api/v1: a chair adds, lists and removes them; bad values
// get a 422 naming the field; a second station of the same name a 409; and the audit log
// records each change.
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { auditEvents } from "@/db/schema";
import { appUrl } from "../support/app";
import { createBoardWithCast } from "../support/factories";
import { signedIn } from "../support/http";

beforeAll(async () => {
  await appUrl();
});

describe("ground stations over HTTP", () => {
  it("a chair adds, lists and removes a station; bad values and duplicates are refused with reasons", async () => {
    const cast = await createBoardWithCast();
    const chair = await signedIn(cast.chair.email);
    const path = `/api/v1/boards/${cast.board.id}/stations`;

    const created = await chair.post(path, { name: "Tallvik", latitude: 64.8, longitude: -147.7, altitude: 0.21, minimumElevation: 10 });
    expect(created.status).toBe(201);
    const { station } = (await created.json()) as { station: { id: string; name: string; altitude: number } };
    expect(station).toMatchObject({ name: "Tallvik", altitude: 0.21 });

    const cases: [Record<string, unknown>, RegExp][] = [
      [{ name: "A", latitude: 91, longitude: 0, minimumElevation: 5 }, /latitude must lie between −90° \(south\) and 90° \(north\)/i],
      [{ name: "B", latitude: 10, longitude: 0, minimumElevation: 90 }, /below 90°/],
      [{ name: "C", latitude: 10, longitude: 200, minimumElevation: 5 }, /longitude/],
      [{ name: "D", latitude: 10, longitude: 0, altitude: 210, minimumElevation: 5 }, /between −500 m and 10 km/],
      [{ name: "", latitude: 10, longitude: 0, minimumElevation: 5 }, /name/],
    ];
    for (const [body, message] of cases) {
      const res = await chair.post(path, body);
      expect(res.status).toBe(422);
      expect(JSON.stringify(await res.json())).toMatch(message);
    }
    const duplicate = await chair.post(path, { name: "Tallvik", latitude: 0, longitude: 0, minimumElevation: 5 });
    expect(duplicate.status).toBe(409);
    expect(((await duplicate.json()) as { error: string }).error).toMatch(/already has a station named/);

    const proposer = await signedIn(cast.proposer.email);
    const listed = (await (await proposer.request(path)).json()) as { stations: { name: string }[] };
    expect(listed.stations.map((s) => s.name)).toEqual(["Tallvik"]);

    expect((await chair.request(`${path}/${station.id}`, { method: "DELETE" })).status).toBe(200);
    expect((await chair.request(`${path}/${station.id}`, { method: "DELETE" })).status).toBe(404);
    const audit = await db()
      .select({ action: auditEvents.action })
      .from(auditEvents)
      .where(and(eq(auditEvents.boardId, cast.board.id), eq(auditEvents.target, station.id)));
    expect(audit.map((a) => a.action).sort()).toEqual(["station.create", "station.delete"]);
  });
});
