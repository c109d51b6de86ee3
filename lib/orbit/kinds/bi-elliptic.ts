/** `biElliptic`: bi-elliptic transfer between circular coplanar orbits. */
import { biElliptic } from "../maneuvers";
import type { KindDef } from "./types";
import { plotOf, circle, apseEllipse, radiusOf, result } from "./orbit-shape";

export const biEllipticKind: KindDef = {
  summary: "bi-elliptic transfer between circular coplanar orbits",
  givenRule: "initialAltitude or initialRadius, finalAltitude or finalRadius, intermediateAltitude or intermediateRadius",
  given: [
    ["initialAltitude", "choice"],
    ["initialRadius", "choice"],
    ["finalAltitude", "choice"],
    ["finalRadius", "choice"],
    ["intermediateAltitude", "choice"],
    ["intermediateRadius", "choice"],
  ],
  computed: ["deltaV1", "deltaV2", "deltaV3", "deltaVTotal", "transferTime"],
  evaluate(g, body) {
    const r1 = radiusOf(g, body, "initial", "initial orbit");
    const r2 = radiusOf(g, body, "final", "final orbit");
    const rb = radiusOf(g, body, "intermediate", "intermediate apoapsis");
    const b = biElliptic(body.mu, r1, r2, rb);
    const t1 = apseEllipse(r1, rb);
    const t2 = apseEllipse(r2, rb);
    const values = { deltaV1: b.deltaV1, deltaV2: b.deltaV2, deltaV3: b.deltaV3, deltaVTotal: b.deltaVTotal, transferTime: b.transferTime };
    return result(values, body, {
      conics: [
        plotOf("initial", circle(r1)),
        plotOf("first transfer", t1, { trueAnomalyRange: [0, 180] }),
        plotOf("second transfer", t2, { trueAnomalyRange: [180, 360], argPeriapsis: 180 }),
        plotOf("final", circle(r2)),
      ],
    });
  },
};
