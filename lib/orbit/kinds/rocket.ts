/** `rocket`: the rocket equation. */
import { solveRocket } from "../rocket";
import type { KindDef } from "./types";
import { result } from "./orbit-shape";

export const rocketKind: KindDef = {
  usesBody: false,
  summary: "the rocket equation",
  givenRule: "specificImpulse (s) and exactly two of initialMass, finalMass, deltaV, propellantMass",
  given: [
    ["specificImpulse", "required"],
    ["initialMass", "choice"],
    ["finalMass", "choice"],
    ["deltaV", "choice"],
    ["propellantMass", "choice"],
  ],
  computed: ["deltaV", "initialMass", "finalMass", "propellantMass", "massRatio"],
  evaluate(g, body, options) {
    const r = solveRocket({
      g0: options?.g0,
      specificImpulse: g.num("specificImpulse", "positive"),
      initialMass: g.optNum("initialMass"),
      finalMass: g.optNum("finalMass"),
      deltaV: g.optNum("deltaV"),
      propellantMass: g.optNum("propellantMass"),
    });
    return result({ ...r }, body);
  },
};
