/** `escape`: escape and hyperbolic departure from a circular parking orbit. */
import { fail } from "../errors";
import { departure } from "../escape";
import { RAD } from "../vector";
import type { KindDef } from "./types";
import { plotOf, circle, circularRadius, result } from "./orbit-shape";

export const escapeKind: KindDef = {
  summary: "escape and hyperbolic departure from a circular parking orbit",
  givenRule: "parkingAltitude (km) and one of hyperbolicExcessSpeed (km/s) or c3 (km²/s²)",
  given: [
    ["parkingAltitude", "required"],
    ["hyperbolicExcessSpeed", "choice"],
    ["c3", "choice"],
  ],
  computed: ["escapeSpeed", "circularSpeed", "periapsisSpeed", "deltaV", "c3", "hyperbolicExcessSpeed"],
  evaluate(g, body) {
    const r = circularRadius(g, body, "parkingAltitude");
    if (g.has("hyperbolicExcessSpeed") === g.has("c3")) fail("give hyperbolicExcessSpeed or c3 (exactly one)");
    // C3 = v∞²: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 8, planetary departure (recalled from memory).
    const vInf = g.has("c3") ? Math.sqrt(g.num("c3", "nonNegative")) : g.num("hyperbolicExcessSpeed", "nonNegative");
    const d = departure(body.mu, r, vInf);
    // Departure hyperbola e = 1 + rp v∞²/μ, p = rp(1 + e), a = −μ/v∞²: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 8, planetary departure (recalled from memory).
    const e = 1 + (r * vInf * vInf) / body.mu;
    return result({ ...d }, body, {
      conics: [
        plotOf("parking orbit", circle(r)),
        plotOf("departure", { p: r * (1 + e), e, a: -body.mu / (vInf * vInf) }, { trueAnomalyRange: [0, 0.95 * Math.acos(-1 / e) * RAD] }),
      ],
    });
  },
};
