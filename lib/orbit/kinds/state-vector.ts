/** `stateVector`: classical elements from a position and velocity. */
import { apoapsisRadius, period as periodOf, periapsisRadius, type Conic } from "../conics";
import { fmt } from "../errors";
import type { ComputedValue } from "../schema";
import { stateToElements } from "../state-vectors";
import { RAD, norm } from "../vector";
import type { KindDef } from "./types";
import { BOUND_ONLY, plotOf, result, stateWarnings } from "./orbit-shape";

export const stateVectorKind: KindDef = {
  summary: "classical elements from a position and velocity",
  givenRule: "position [km] and velocity [km/s] in an inertial frame centred on the body",
  given: [
    ["position", "required"],
    ["velocity", "required"],
  ],
  computed: [
    "specificAngularMomentum",
    "inclination",
    "raan",
    "eccentricity",
    "argPeriapsis",
    "trueAnomaly",
    "semiMajorAxis",
    "semiLatusRectum",
    "period",
    "specificEnergy",
    "orbitType",
    "periapsisRadius",
    "apoapsisRadius",
    "radius",
    "speed",
  ],
  evaluate(g, body) {
    const r = g.vec("position");
    const v = g.vec("velocity");
    const el = stateToElements(r, v, body.mu);
    const conic: Conic = { a: el.a, e: el.e, p: el.p };
    const messages = [...stateWarnings(r, conic, body, "position"), ...el.notes];
    const values: Record<string, ComputedValue> = {
      specificAngularMomentum: el.h,
      inclination: el.i * RAD,
      raan: el.raan * RAD,
      eccentricity: el.e,
      argPeriapsis: el.argPeriapsis * RAD,
      trueAnomaly: el.trueAnomaly * RAD,
      semiLatusRectum: el.p,
      specificEnergy: el.energy,
      orbitType: el.orbitType,
      periapsisRadius: periapsisRadius(conic),
      radius: norm(r),
      speed: norm(v),
    };
    const unavailable: Record<string, string> = {};
    if (Number.isFinite(el.a)) values.semiMajorAxis = el.a;
    else unavailable.semiMajorAxis = "a parabola has no finite semi-major axis";
    if (el.e < 1 && el.orbitType !== "parabolic") {
      values.period = periodOf(body.mu, el.a);
      values.apoapsisRadius = apoapsisRadius(conic);
    } else {
      unavailable.period = `period ${BOUND_ONLY}; this state is on a ${el.orbitType} trajectory (e = ${fmt(el.e)})`;
      unavailable.apoapsisRadius = `apoapsisRadius ${BOUND_ONLY}; this state is on a ${el.orbitType} trajectory (e = ${fmt(el.e)})`;
    }
    return result(values, body, {
      unavailable,
      messages,
      conics: [plotOf("orbit", conic, { argPeriapsis: 0, marker: el.trueAnomaly * RAD })],
    });
  },
};
