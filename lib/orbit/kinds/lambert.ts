/** `lambert`: Lambert's problem: the zero-revolution transfer between two positions in a given time. */
import { periapsisRadius } from "../conics";
import { fail, fmt } from "../errors";
import { lambert } from "../lambert";
import type { ComputedValue } from "../schema";
import { stateToElements } from "../state-vectors";
import { RAD, norm } from "../vector";
import type { KindDef } from "./types";
import { plotOf, result } from "./orbit-shape";

export const lambertKind: KindDef = {
  summary: "Lambert's problem: the zero-revolution transfer between two positions in a given time",
  givenRule: "position1, position2 (km), timeOfFlight (s), optional direction (prograde default, or retrograde)",
  given: [
    ["position1", "required"],
    ["position2", "required"],
    ["timeOfFlight", "required"],
    ["direction", "optional"],
  ],
  computed: ["velocity1", "velocity2", "transferAngle", "semiMajorAxis", "eccentricity"],
  evaluate(g, body) {
    const r1 = g.vec("position1");
    const r2 = g.vec("position2");
    for (const [label, r] of [
      ["position1", r1],
      ["position2", r2],
    ] as const)
      if (norm(r) < body.radius) fail(`${label} is ${fmt(norm(r))} km from the centre, inside ${body.name} (radius ${fmt(body.radius)} km)`);
    const tof = g.num("timeOfFlight", "positive");
    const dir = g.text("direction", ["prograde", "retrograde"], "prograde") as "prograde" | "retrograde";
    const s = lambert(r1, r2, tof, body.mu, dir);
    const el = stateToElements(r1, s.velocity1, body.mu);
    const values: Record<string, ComputedValue> = {
      velocity1: [...s.velocity1],
      velocity2: [...s.velocity2],
      transferAngle: s.transferAngle * RAD,
      eccentricity: el.e,
    };
    const unavailable: Record<string, string> = {};
    if (Number.isFinite(el.a)) values.semiMajorAxis = el.a;
    else unavailable.semiMajorAxis = "the transfer is parabolic: no finite semi-major axis";
    const messages: string[] = [];
    if (periapsisRadius({ a: el.a, e: el.e, p: el.p }) < body.radius) {
      // Does the arc itself pass through periapsis (true anomaly crossing 0 / 360)?
      const th1 = el.trueAnomaly;
      const th2 = th1 + s.transferAngle;
      if (th2 >= 2 * Math.PI) messages.push(`the transfer arc passes below the surface of ${body.name}`);
    }
    return result(values, body, {
      unavailable,
      messages,
      conics: [plotOf("transfer", { a: el.a, e: el.e, p: el.p }, { trueAnomalyRange: [el.trueAnomaly * RAD, (el.trueAnomaly + s.transferAngle) * RAD] })],
    });
  },
};
