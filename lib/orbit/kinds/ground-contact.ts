/** `groundContact`: ground-station coverage geometry and the longest pass of a circular orbit. */
import { period as periodOf } from "../conics";
import { fail, fmt } from "../errors";
import { contactGeometry, maxPassDuration } from "../ground-contact";
import { DEG, RAD } from "../vector";
import type { KindDef } from "./types";
import { plotOf, circle, circularRadius, result } from "./orbit-shape";

export const groundContactKind: KindDef = {
  summary: "ground-station coverage geometry and the longest pass of a circular orbit",
  givenRule: "altitude (km, circular orbit) and minimumElevation (deg)",
  given: [
    ["altitude", "required"],
    ["minimumElevation", "required"],
  ],
  computed: ["maxPassDuration", "centralAngle", "earthCentralAngle", "maxSlantRange", "period"],
  evaluate(g, body) {
    const r = circularRadius(g, body, "altitude");
    const eps = g.num("minimumElevation");
    if (!(eps >= 0 && eps < 90)) fail(`minimumElevation must be at least 0° and below 90° (got ${fmt(eps)}°)`);
    const geo = contactGeometry(body.radius, r - body.radius, eps * DEG);
    const T = periodOf(body.mu, r);
    return result(
      {
        maxPassDuration: maxPassDuration(T, geo.earthCentralAngle),
        centralAngle: geo.earthCentralAngle * RAD,
        // The version 1 name, kept as an alias for one contract version.
        earthCentralAngle: geo.earthCentralAngle * RAD,
        maxSlantRange: geo.maxSlantRange,
        period: T,
      },
      body,
      {
        messages: ["maxPassDuration is for an overhead pass and ignores the body's rotation"],
        conics: [plotOf("orbit", circle(r))],
      },
    );
  },
};
