/** `orbit`: shape, size, energy and speeds of a conic orbit. */
import { DEG, RAD } from "../vector";
import type { KindDef } from "./types";
import { SHAPE_GIVEN, SHAPE_RULE, readShape, conicValues, plotOf, result, ORBIT_COMPUTED } from "./orbit-shape";

export const orbitKind: KindDef = {
  summary: "shape, size, energy and speeds of a conic orbit",
  givenRule: `${SHAPE_RULE}; optional trueAnomaly (deg) for radius, speed and flight-path angle there`,
  given: [...SHAPE_GIVEN, ["trueAnomaly", "optional"]],
  computed: ORBIT_COMPUTED,
  evaluate(g, body) {
    const { conic, messages } = readShape(g, body, false);
    const theta = g.has("trueAnomaly") ? g.num("trueAnomaly") * DEG : undefined;
    const { values, unavailable } = conicValues(conic, body, theta);
    return result(values, body, {
      unavailable,
      messages,
      conics: [plotOf("orbit", conic, theta !== undefined ? { marker: theta * RAD } : {})],
    });
  },
};
