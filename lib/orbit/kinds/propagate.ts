/** `propagate`: two-body state after a time (universal variables). */
import type { Conic } from "../conics";
import { propagate } from "../propagation";
import { stateToElements } from "../state-vectors";
import { RAD, norm } from "../vector";
import type { KindDef } from "./types";
import { plotOf, stateWarnings, result } from "./orbit-shape";

export const propagateKind: KindDef = {
  summary: "two-body state after a time (universal variables)",
  givenRule: "position [km], velocity [km/s] and time (s, may be negative)",
  given: [
    ["position", "required"],
    ["velocity", "required"],
    ["time", "required"],
  ],
  computed: ["position", "velocity", "radius", "speed"],
  evaluate(g, body) {
    const r0 = g.vec("position");
    const v0 = g.vec("velocity");
    const t = g.num("time");
    const el = stateToElements(r0, v0, body.mu);
    const conic: Conic = { a: el.a, e: el.e, p: el.p };
    const messages = stateWarnings(r0, conic, body, "position");
    const s = propagate(r0, v0, t, body.mu);
    const el2 = stateToElements(s.position, s.velocity, body.mu);
    return result({ position: [...s.position], velocity: [...s.velocity], radius: norm(s.position), speed: norm(s.velocity) }, body, {
      messages,
      conics: [plotOf("orbit", conic, { trueAnomalyRange: [el.trueAnomaly * RAD, el2.trueAnomaly * RAD], marker: el2.trueAnomaly * RAD })],
    });
  },
};
