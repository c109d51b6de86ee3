/** `eclipse`: time in a cylindrical shadow per orbit for a circular orbit. */
import { period as periodOf } from "../conics";
import { fail, fmt } from "../errors";
import { eclipseFraction } from "../eclipse";
import { DEG, RAD } from "../vector";
import type { KindDef } from "./types";
import { plotOf, circle, circularRadius, result } from "./orbit-shape";

export const eclipseKind: KindDef = {
  summary: "time in a cylindrical shadow per orbit for a circular orbit",
  givenRule: "altitude (km, circular orbit), optional betaAngle (deg, default 0)",
  given: [
    ["altitude", "required"],
    ["betaAngle", "optional"],
  ],
  computed: ["eclipseDuration", "eclipseFraction", "sunlitFraction", "period"],
  evaluate(g, body) {
    const r = circularRadius(g, body, "altitude");
    const beta = (g.optNum("betaAngle") ?? 0) * DEG;
    if (!(Math.abs(beta) <= Math.PI / 2)) fail("betaAngle must lie between −90° and 90°");
    const ecl = eclipseFraction(body.radius, r - body.radius, beta);
    const T = periodOf(body.mu, r);
    const messages = ecl.eclipseFraction === 0 ? [`no eclipse: |beta| is above the critical angle ${fmt(ecl.criticalBetaAngle * RAD)}° for this altitude`] : [];
    // Eclipse duration = shadow fraction × period (definition; the fraction's source is in ../eclipse.ts).
    return result({ eclipseDuration: ecl.eclipseFraction * T, eclipseFraction: ecl.eclipseFraction, sunlitFraction: ecl.sunlitFraction, period: T }, body, {
      messages,
      conics: [plotOf("orbit", circle(r))],
    });
  },
};
