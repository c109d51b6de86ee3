/** `hohmann`: Hohmann transfer between circular coplanar orbits. */
import { fail } from "../errors";
import { hohmann } from "../maneuvers";
import type { KindDef } from "./types";
import { plotOf, circle, apseEllipse, radiusOf, result } from "./orbit-shape";

export const hohmannKind: KindDef = {
  summary: "Hohmann transfer between circular coplanar orbits",
  givenRule: "initialAltitude or initialRadius, finalAltitude or finalRadius",
  given: [
    ["initialAltitude", "choice"],
    ["initialRadius", "choice"],
    ["finalAltitude", "choice"],
    ["finalRadius", "choice"],
  ],
  computed: ["deltaV1", "deltaV2", "deltaVTotal", "transferTime", "transferSemiMajorAxis"],
  evaluate(g, body) {
    const r1 = radiusOf(g, body, "initial", "initial orbit");
    const r2 = radiusOf(g, body, "final", "final orbit");
    if (r1 === r2) fail("the initial and final orbits are the same; no transfer is needed");
    const h = hohmann(body.mu, r1, r2);
    const tr = apseEllipse(r1, r2);
    const up = r2 > r1;
    return result({ ...h }, body, {
      conics: [plotOf("initial", circle(r1)), plotOf("transfer", tr, { trueAnomalyRange: up ? [0, 180] : [180, 360] }), plotOf("final", circle(r2))],
    });
  },
};
