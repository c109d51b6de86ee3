/** `planeChange`: plane change, alone or combined with a speed change. */
import { fail } from "../errors";
import { combinedPlaneChange, simplePlaneChange } from "../maneuvers";
import type { KindDef } from "./types";
import { plotOf, circle, circularRadius, angleBetweenZeroAnd, result } from "./orbit-shape";

export const planeChangeKind: KindDef = {
  summary: "plane change, alone or combined with a speed change",
  givenRule: "angle (deg) with one of: speed; altitude (circular orbit); initialSpeed and finalSpeed (combined)",
  given: [
    ["angle", "required"],
    ["speed", "choice"],
    ["altitude", "choice"],
    ["initialSpeed", "choice"],
    ["finalSpeed", "choice"],
  ],
  computed: ["deltaV"],
  evaluate(g, body) {
    const angle = angleBetweenZeroAnd(g, "angle", 180);
    const options = [g.has("speed"), g.has("altitude"), g.has("initialSpeed") || g.has("finalSpeed")].filter(Boolean).length;
    if (options !== 1) fail("give exactly one of: speed; altitude (circular orbit); initialSpeed with finalSpeed");
    if (g.has("speed")) return result({ deltaV: simplePlaneChange(g.num("speed", "positive"), angle) }, body);
    if (g.has("altitude")) {
      const r = circularRadius(g, body, "altitude");
      // Circular speed √(μ/r): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, circular orbits (recalled from memory).
      return result({ deltaV: simplePlaneChange(Math.sqrt(body.mu / r), angle) }, body, { conics: [plotOf("orbit", circle(r))] });
    }
    const v1 = g.num("initialSpeed", "positive");
    const v2 = g.num("finalSpeed", "positive");
    return result({ deltaV: combinedPlaneChange(v1, v2, angle) }, body);
  },
};
