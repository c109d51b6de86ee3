/** `timeOfFlight`: time to fly between two true anomalies on a conic (Kepler's equation, Barker's equation). */
import { angularMomentum, classify, period as periodOf } from "../conics";
import { eccentricFromTrue, hyperbolicFromTrue, meanFromEccentric, meanFromHyperbolic, parabolicMeanAnomaly } from "../anomalies/kepler";
import { fail, fmt } from "../errors";
import type { ComputedValue } from "../schema";
import { DEG, RAD } from "../vector";
import type { KindDef } from "./types";
import { SHAPE_GIVEN, SHAPE_RULE, readShape, BOUND_ONLY, plotOf, result } from "./orbit-shape";

export const timeOfFlightKind: KindDef = {
  summary: "time to fly between two true anomalies on a conic (Kepler's equation, Barker's equation)",
  givenRule: `an orbit shape (${SHAPE_RULE}), trueAnomalyFrom and trueAnomalyTo (deg), flown in the direction of motion`,
  given: [...SHAPE_GIVEN, ["trueAnomalyFrom", "required"], ["trueAnomalyTo", "required"]],
  computed: ["time", "period"],
  evaluate(g, body) {
    const { conic: c, messages } = readShape(g, body, false);
    const t1 = g.num("trueAnomalyFrom") * DEG;
    let t2 = g.num("trueAnomalyTo") * DEG;
    const type = classify(c.e);
    const mu = body.mu;
    const unavailable: Record<string, string> = {};
    const values: Record<string, ComputedValue> = {};
    if (type === "circular" || c.e < 1) {
      while (t2 < t1) t2 += 2 * Math.PI;
      // Mean motion n = √(μ/a³): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, elliptical orbits (recalled from memory).
      const n = Math.sqrt(mu / c.a ** 3);
      // Kepler's equation t = (M2 − M1)/n with M from the eccentric anomaly: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, elliptical orbits (recalled from memory).
      const M1 = meanFromEccentric(eccentricFromTrue(t1, c.e), c.e);
      const M2 = meanFromEccentric(eccentricFromTrue(t2, c.e), c.e);
      values.time = (M2 - M1) / n;
      values.period = periodOf(mu, c.a);
    } else {
      if (t2 < t1) fail("on an open orbit trueAnomalyTo must not precede trueAnomalyFrom (the body passes periapsis only once)");
      unavailable.period = `period ${BOUND_ONLY}; this orbit is ${type} (e = ${fmt(c.e)})`;
      if (type === "parabolic") {
        const h = angularMomentum(mu, c.p);
        // Barker's equation t = (h³/μ²)·M_p: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, parabolic trajectories (recalled from memory).
        const k = h ** 3 / (mu * mu);
        const lim = Math.PI;
        if (Math.abs(t1) >= lim || Math.abs(t2) >= lim) fail("true anomalies on a parabola must lie strictly between −180° and 180°");
        values.time = k * (parabolicMeanAnomaly(t2) - parabolicMeanAnomaly(t1));
      } else {
        // Hyperbolic mean motion √(μ/(−a)³): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, hyperbolic trajectories (recalled from memory).
        const n = Math.sqrt(mu / (-c.a) ** 3);
        // Hyperbolic Kepler's equation t = (Mh2 − Mh1)/n: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, hyperbolic trajectories (recalled from memory).
        values.time = (meanFromHyperbolic(hyperbolicFromTrue(t2, c.e), c.e) - meanFromHyperbolic(hyperbolicFromTrue(t1, c.e), c.e)) / n;
      }
    }
    return result(values, body, {
      unavailable,
      messages,
      conics: [plotOf("orbit", c, { trueAnomalyRange: [t1 * RAD, t2 * RAD] })],
    });
  },
};
