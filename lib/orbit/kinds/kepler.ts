/** `kepler`: Kepler's equation: eccentric (or hyperbolic) and true anomaly from the mean anomaly. */
import { classify } from "../conics";
import { solveBarker, solveKeplerElliptic, solveKeplerHyperbolic, trueFromEccentric, trueFromHyperbolic } from "../anomalies/kepler";
import { fmt } from "../errors";
import type { ComputedValue } from "../schema";
import { DEG, RAD } from "../vector";
import type { KindDef } from "./types";
import { result } from "./orbit-shape";

export const keplerKind: KindDef = {
  usesBody: false,
  summary: "Kepler's equation: eccentric (or hyperbolic) and true anomaly from the mean anomaly",
  givenRule:
    "eccentricity and meanAnomaly (deg; hyperbolic mean anomaly when e > 1, Barker's parabolic mean anomaly in radians expressed as degrees when e = 1)",
  given: [
    ["eccentricity", "required"],
    ["meanAnomaly", "required"],
  ],
  computed: ["eccentricAnomaly", "hyperbolicAnomaly", "trueAnomaly"],
  evaluate(g, body) {
    const e = g.num("eccentricity", "nonNegative");
    const M = g.num("meanAnomaly") * DEG;
    const type = classify(e);
    const unavailable: Record<string, string> = {};
    const values: Record<string, ComputedValue> = {};
    if (type === "parabolic") {
      values.trueAnomaly = solveBarker(M) * RAD;
      unavailable.eccentricAnomaly = "a parabola has no eccentric anomaly";
      unavailable.hyperbolicAnomaly = "a parabola has no hyperbolic anomaly";
    } else if (e < 1) {
      const E = solveKeplerElliptic(M, e);
      values.eccentricAnomaly = E * RAD;
      values.trueAnomaly = trueFromEccentric(E, e) * RAD;
      unavailable.hyperbolicAnomaly = `the hyperbolic anomaly exists only for e > 1 (e = ${fmt(e)})`;
    } else {
      const H = solveKeplerHyperbolic(M, e);
      values.hyperbolicAnomaly = H * RAD;
      values.trueAnomaly = trueFromHyperbolic(H, e) * RAD;
      unavailable.eccentricAnomaly = `the eccentric anomaly exists only for e < 1 (e = ${fmt(e)}); claim hyperbolicAnomaly`;
    }
    return result(values, body, { unavailable });
  },
};
