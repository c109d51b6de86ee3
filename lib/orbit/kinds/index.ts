/**
 * The claim kinds of the contract: what each takes, what it derives, and how.
 * Each evaluator reads validated inputs, calls the physics modules and returns every
 * quantity it can derive, plus reasons for the ones that do not exist for this case
 * (e.g. a period asked of a hyperbola).
 */
import { SECONDS_PER_DAY, STANDARD_GRAVITY_KM_S2, type Body, type BodyName } from "../constants";
import { resolveBody } from "../bodies";
import {
  angularMomentum,
  apoapsisRadius,
  classify,
  type Conic,
  conicFromShape,
  flightPathAngle,
  period as periodOf,
  periapsisRadius,
  radiusAt,
  semiMajorAxisFromPeriod,
  type ShapeInput,
  specificEnergy,
  visViva,
} from "../conics";
import {
  eccentricFromTrue,
  hyperbolicFromTrue,
  meanFromEccentric,
  meanFromHyperbolic,
  parabolicMeanAnomaly,
  solveBarker,
  solveKeplerElliptic,
  solveKeplerHyperbolic,
  trueFromEccentric,
  trueFromHyperbolic,
} from "../anomalies/kepler";
import { fail, fmt } from "../errors";
import { departure } from "../escape";
import { interplanetaryHohmann, sphereOfInfluence, type PlanetLeg } from "../interplanetary";
import { inclinationForNodalRate, j2SecularRates } from "../j2";
import { lambert } from "../lambert";
import { biElliptic, combinedPlaneChange, hohmann, simplePlaneChange } from "../maneuvers";
import { propagate } from "../propagation";
import { quantityInfo, quantityInfoFor } from "../quantities";
import { deltaVBudget, solveRocket } from "../rocket";
import type { ComputedValue } from "../schema";
import { elementsToState, stateToElements } from "../state-vectors";
import { eclipseFraction } from "../eclipse";
import { contactGeometry, maxPassDuration } from "../ground-contact";
import { DEG, RAD, norm, type Vec3 } from "../vector";
import { contactTimeKind } from "./contact-time";
import { linkBudgetKind } from "./link-budget";
import { repeatGroundTrackKind } from "./repeat-ground-track";
import { lifetimeKind } from "./lifetime";
import { disposalKind } from "./disposal";
import { massBudgetKind } from "./mass-budget";
import { phasedDeltaVBudget, phasedValues, readPhases } from "./delta-v-budget";
import { SHAPE_FIELDS } from "./shared";

/** One conic to draw with r(θ) = p / (1 + e cos θ), rotated by argPeriapsis in the plot plane. */
export interface PlotConic {
  label: string;
  /** Semi-latus rectum, km. */
  p: number;
  e: number;
  periapsisRadius: number;
  /** null for open orbits. */
  apoapsisRadius: number | null;
  /** Rotation of the periapsis in the plot plane, deg. */
  argPeriapsis: number;
  /** Arc to draw, true anomaly from/to in deg; the whole conic when absent. */
  trueAnomalyRange?: [number, number];
  /** Spacecraft marker, true anomaly in deg. */
  marker?: number;
}

export interface Evaluation {
  values: Record<string, ComputedValue>;
  /** Quantities of this kind that do not exist for this case, with the reason. */
  unavailable: Record<string, string>;
  messages: string[];
  conics: PlotConic[];
  /** Radius of the body drawn at the focus, km. */
  plotBodyRadius: number;
}

export interface GivenInfo {
  name: string;
  unit: string;
  type: string;
  /** required, optional, or part of a choice described in the kind's `givenRule`. */
  use: "required" | "optional" | "choice";
}

export interface ComputedInfo {
  name: string;
  unit: string;
  type: string;
  /** Set on an old name kept for one contract version (earthCentralAngle → centralAngle): forms should offer the new name. */
  aliasOf?: string;
}

/** Old quantity names still computed and accepted for one contract version. */
export const QUANTITY_ALIASES: Readonly<Record<string, string>> = { earthCentralAngle: "centralAngle" };

export interface KindInfo {
  kind: string;
  summary: string;
  givenRule: string;
  given: GivenInfo[];
  computed: ComputedInfo[];
  defaultBody: BodyName;
}

/** Reads and validates the `given` object of one claim. */
export class Inputs {
  constructor(
    private readonly raw: Record<string, unknown>,
    private readonly kind: string,
  ) {}

  has(name: string): boolean {
    const v = this.raw[name];
    return v !== undefined && v !== null;
  }

  num(name: string, rule: "any" | "positive" | "nonNegative" = "any"): number {
    if (!this.has(name)) fail(`${this.kind} needs given.${name} (${unitOf(name)})`);
    const v = this.raw[name];
    if (typeof v !== "number" || !Number.isFinite(v)) fail(`given.${name} must be a finite number in ${unitOf(name)} (got ${describe(v)})`);
    if (rule === "positive" && !(v > 0)) fail(`given.${name} must be positive (got ${fmt(v)} ${unitOf(name)})`);
    if (rule === "nonNegative" && !(v >= 0)) fail(`given.${name} must be zero or positive (got ${fmt(v)} ${unitOf(name)})`);
    return v;
  }

  optNum(name: string, rule: "any" | "positive" | "nonNegative" = "any"): number | undefined {
    return this.has(name) ? this.num(name, rule) : undefined;
  }

  vec(name: string): Vec3 {
    if (!this.has(name)) fail(`${this.kind} needs given.${name} as [x, y, z] in ${unitOf(name)}`);
    const v = this.raw[name];
    if (!Array.isArray(v) || v.length !== 3 || !v.every((c) => typeof c === "number" && Number.isFinite(c)))
      fail(`given.${name} must be an array of three finite numbers in ${unitOf(name)} (got ${describe(v)})`);
    return [v[0] as number, v[1] as number, v[2] as number];
  }

  text(name: string, allowed: readonly string[], fallback: string): string {
    if (!this.has(name)) return fallback;
    const v = this.raw[name];
    if (typeof v !== "string" || !allowed.includes(v)) fail(`given.${name} must be one of ${allowed.join(", ")} (got ${describe(v)})`);
    return v;
  }

  value(name: string): unknown {
    return this.raw[name];
  }
}

function unitOf(name: string): string {
  const u = quantityInfo(name)?.unit;
  return u === undefined || u === "" ? "" : u === "1" ? "(dimensionless)" : u;
}

function describe(v: unknown): string {
  if (typeof v === "number") return String(v);
  if (typeof v === "string") return `the text ${JSON.stringify(v.length > 40 ? v.slice(0, 40) + "…" : v)}`;
  if (Array.isArray(v)) return `an array of ${v.length}`;
  if (v === null) return "null";
  return typeof v;
}

// ---------------------------------------------------------------------------------------
// Orbit shape shared by several kinds

const SHAPE_NAMES = SHAPE_FIELDS;

const SHAPE_RULE =
  "two independent values of periapsisAltitude, apoapsisAltitude, periapsisRadius, apoapsisRadius, semiMajorAxis, eccentricity, semiLatusRectum, period; or altitude alone (circular)";

function readShape(g: Inputs, body: Body, allowSingleRadius: boolean): { conic: Conic; messages: string[] } {
  const present = SHAPE_NAMES.filter((n) => g.has(n));
  const messages: string[] = [];
  if (present.length === 0) fail(`give the orbit shape: ${SHAPE_RULE}`);
  for (const n of present) if (n !== "semiMajorAxis" && n !== "eccentricity") g.num(n);
  if (present.includes("altitude")) {
    if (present.length > 1)
      fail(
        `altitude describes a circular orbit by itself; do not combine it with ${present.filter((n) => n !== "altitude").join(", ")} ` +
          "(for an elliptic orbit give periapsisAltitude and apoapsisAltitude)",
      );
    const r = body.radius + g.num("altitude");
    return { conic: checkAboveSurface({ a: r, e: 0, p: r }, body), messages };
  }
  if (present.includes("periapsisAltitude") && present.includes("periapsisRadius"))
    fail("periapsisAltitude and periapsisRadius both give the periapsis; keep one of them");
  if (present.includes("apoapsisAltitude") && present.includes("apoapsisRadius"))
    fail("apoapsisAltitude and apoapsisRadius both give the apoapsis; keep one of them");
  if (present.length === 1) {
    const only = present[0]!;
    if (allowSingleRadius && only !== "eccentricity" && only !== "semiLatusRectum") {
      let r: number;
      if (only === "period") r = semiMajorAxisFromPeriod(body.mu, g.num("period", "positive"));
      else if (only.endsWith("Altitude")) r = body.radius + g.num(only);
      else r = g.num(only, "positive");
      messages.push(`only ${only} was given: a circular orbit is assumed`);
      return { conic: checkAboveSurface({ a: r, e: 0, p: r }, body), messages };
    }
    fail(`an orbit shape needs a second independent value besides ${only}: ${SHAPE_RULE}`);
  }
  if (present.length > 2)
    fail(`give exactly two independent shape values (got ${present.length}: ${present.join(", ")}); move the others to claimed so they are checked`);
  const s: ShapeInput = {};
  if (g.has("periapsisAltitude")) s.periapsisRadius = body.radius + g.num("periapsisAltitude");
  if (g.has("periapsisRadius")) s.periapsisRadius = g.num("periapsisRadius");
  if (g.has("apoapsisAltitude")) s.apoapsisRadius = body.radius + g.num("apoapsisAltitude");
  if (g.has("apoapsisRadius")) s.apoapsisRadius = g.num("apoapsisRadius");
  if (g.has("semiMajorAxis")) s.semiMajorAxis = g.num("semiMajorAxis");
  if (g.has("eccentricity")) s.eccentricity = g.num("eccentricity", "nonNegative");
  if (g.has("semiLatusRectum")) s.semiLatusRectum = g.num("semiLatusRectum");
  if (g.has("period")) s.period = g.num("period");
  return { conic: checkAboveSurface(conicFromShape(s, body.mu), body), messages };
}

function checkAboveSurface(c: Conic, body: Body): Conic {
  const rp = periapsisRadius(c);
  if (!Number.isFinite(c.p) || !Number.isFinite(c.e) || Number.isNaN(rp)) fail("the orbit shape does not describe a valid conic; check the given values");
  if (rp < body.radius)
    fail(
      `the periapsis radius ${fmt(rp)} km is below the surface of ${body.name} (radius ${fmt(body.radius)} km, altitude ${fmt(rp - body.radius)} km): ` +
        "the orbit intersects the body; raise the periapsis",
    );
  return c;
}

const BOUND_ONLY = "is defined only for closed orbits (e < 1)";

/** Everything the `orbit` kind derives from a conic (and optionally a true anomaly in rad). */
function conicValues(c: Conic, body: Body, theta?: number): Pick<Evaluation, "values" | "unavailable"> {
  const mu = body.mu;
  const values: Record<string, ComputedValue> = {};
  const unavailable: Record<string, string> = {};
  const type = classify(c.e);
  const closed = c.e < 1 && type !== "parabolic";
  const rp = periapsisRadius(c);
  const tag = `this orbit is ${type} (e = ${fmt(c.e)})`;
  if (Number.isFinite(c.a)) values.semiMajorAxis = c.a;
  else unavailable.semiMajorAxis = `a parabola has no finite semi-major axis (${tag})`;
  values.eccentricity = c.e;
  values.semiLatusRectum = c.p;
  values.periapsisRadius = rp;
  values.periapsisAltitude = rp - body.radius;
  values.orbitType = type;
  // Energy integral ε = −μ/2a and h = √(μp).
  values.specificEnergy = specificEnergy(mu, c.a);
  values.specificAngularMomentum = angularMomentum(mu, c.p);
  // Vis-viva at periapsis.
  values.periapsisSpeed = visViva(mu, rp, c.a);
  if (closed) {
    const ra = apoapsisRadius(c);
    // Semi-minor axis of an ellipse b = a√(1 − e²) (conic geometry).
    values.semiMinorAxis = c.a * Math.sqrt(1 - c.e * c.e);
    values.apoapsisRadius = ra;
    values.apoapsisAltitude = ra - body.radius;
    values.period = periodOf(mu, c.a);
    // Mean motion n = √(μ/a³).
    values.meanMotion = Math.sqrt(mu / c.a ** 3) * RAD;
    // Revolutions per day = 86 400 s / period (SI day, as in TLE mean motion).
    values.meanMotionRevPerDay = SECONDS_PER_DAY / (values.period as number);
    values.apoapsisSpeed = visViva(mu, ra, c.a);
    unavailable.hyperbolicExcessSpeed = `a hyperbolic excess speed exists only for open orbits (e ≥ 1); ${tag}`;
  } else {
    for (const q of ["semiMinorAxis", "apoapsisRadius", "apoapsisAltitude", "period", "apoapsisSpeed", "meanMotionRevPerDay"])
      unavailable[q] = `${q} ${BOUND_ONLY}; ${tag}`;
    // v∞ = √(2ε) (energy integral at infinity).
    values.hyperbolicExcessSpeed = Math.sqrt(Math.max(0, 2 * specificEnergy(mu, c.a)));
    // Hyperbolic mean motion √(μ/|a|³) (hyperbolic Kepler's equation).
    if (type === "hyperbolic") values.meanMotion = Math.sqrt(mu / Math.abs(c.a) ** 3) * RAD;
    else unavailable.meanMotion = `a parabola has no mean motion in this sense (${tag})`;
  }
  if (theta !== undefined) {
    if (!closed) {
      const limit = Math.acos(-1 / c.e);
      const t = Math.abs(((theta + Math.PI) % (2 * Math.PI)) - Math.PI);
      if (t >= limit - 1e-12) fail(`trueAnomaly ${fmt(theta * RAD)}° is beyond the asymptote of this ${type} orbit (±${fmt(limit * RAD)}°)`);
    }
    const r = radiusAt(c, theta);
    values.radius = r;
    values.speed = visViva(mu, r, c.a);
    values.flightPathAngle = flightPathAngle(c.e, theta) * RAD;
  } else {
    for (const q of ["radius", "speed", "flightPathAngle"]) unavailable[q] = `${q} needs given.trueAnomaly (deg)`;
  }
  return { values, unavailable };
}

function plotOf(label: string, c: Conic, extra: Partial<PlotConic> = {}): PlotConic {
  return {
    label,
    p: c.p,
    e: c.e,
    periapsisRadius: periapsisRadius(c),
    apoapsisRadius: c.e < 1 ? apoapsisRadius(c) : null,
    argPeriapsis: 0,
    ...extra,
  };
}

const circle = (r: number): Conic => ({ a: r, e: 0, p: r });

/** Ellipse through apse radii r1 and r2: a = (r1 + r2)/2, e = |r2 − r1|/(r1 + r2), p = 2 r1 r2/(r1 + r2). */
const apseEllipse = (r1: number, r2: number): Conic => ({ a: (r1 + r2) / 2, e: Math.abs(r2 - r1) / (r1 + r2), p: (2 * r1 * r2) / (r1 + r2) });

function radiusOf(g: Inputs, body: Body, prefix: string, label: string): number {
  const alt = `${prefix}Altitude`;
  const rad = `${prefix}Radius`;
  if (g.has(alt) && g.has(rad)) fail(`give ${alt} or ${rad}, not both`);
  if (!g.has(alt) && !g.has(rad)) fail(`give ${alt} or ${rad} for the ${label}`);
  const r = g.has(alt) ? body.radius + g.num(alt) : g.num(rad, "positive");
  if (r < body.radius) fail(`the ${label} (radius ${fmt(r)} km) is below the surface of ${body.name} (radius ${fmt(body.radius)} km)`);
  return r;
}

function circularRadius(g: Inputs, body: Body, name: string): number {
  const h = g.num(name);
  if (!(h > 0)) fail(`given.${name} must be above the surface (got ${fmt(h)} km)`);
  return body.radius + h;
}

function stateWarnings(r: Vec3, c: Conic, body: Body, label: string): string[] {
  const rm = norm(r);
  if (rm < body.radius)
    fail(`${label} is ${fmt(rm)} km from the centre, inside ${body.name} (radius ${fmt(body.radius)} km); check the units (km) and the frame`);
  const rp = periapsisRadius(c);
  return rp < body.radius ? [`the periapsis (${fmt(rp)} km) is below the surface of ${body.name}: this trajectory intersects the body`] : [];
}

function angleBetweenZeroAnd(g: Inputs, name: string, maxDeg: number): number {
  const v = g.num(name);
  if (!(v >= 0 && v <= maxDeg)) fail(`given.${name} must be between 0 and ${maxDeg}° (got ${fmt(v)}°)`);
  return v * DEG;
}

// ---------------------------------------------------------------------------------------
// The kinds

export interface KindDef {
  summary: string;
  givenRule: string;
  given: [string, GivenInfo["use"]][];
  computed: string[];
  defaultBody?: BodyName;
  /** False for kinds whose result does not depend on the body's constants. */
  usesBody?: false;
  evaluate(g: Inputs, body: Body, options?: EvaluateOptions): Evaluation;
}

/** Knobs the hint search turns to recompute a kind with another commonly used constant. */
export interface EvaluateOptions {
  /** Standard gravity used by the rocket equation, km/s² (default 9.80665e-3). */
  g0?: number;
}

const result = (values: Record<string, ComputedValue>, body: Body, extra: Partial<Omit<Evaluation, "values">> = {}): Evaluation => ({
  values,
  unavailable: extra.unavailable ?? {},
  messages: extra.messages ?? [],
  conics: extra.conics ?? [],
  plotBodyRadius: extra.plotBodyRadius ?? body.radius,
});

const SHAPE_GIVEN: [string, GivenInfo["use"]][] = SHAPE_NAMES.map((n) => [n, "choice"]);

const ORBIT_COMPUTED = [
  "semiMajorAxis",
  "eccentricity",
  "semiLatusRectum",
  "semiMinorAxis",
  "periapsisRadius",
  "apoapsisRadius",
  "periapsisAltitude",
  "apoapsisAltitude",
  "period",
  "meanMotion",
  "meanMotionRevPerDay",
  "specificEnergy",
  "specificAngularMomentum",
  "periapsisSpeed",
  "apoapsisSpeed",
  "orbitType",
  "hyperbolicExcessSpeed",
  "radius",
  "speed",
  "flightPathAngle",
];

const KIND_DEFS: Record<string, KindDef> = {
  orbit: {
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
  },

  stateVector: {
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
  },

  elements: {
    summary: "position and velocity from classical elements",
    givenRule: "semiMajorAxis or semiLatusRectum, eccentricity, inclination, raan, argPeriapsis, trueAnomaly (deg)",
    given: [
      ["semiMajorAxis", "choice"],
      ["semiLatusRectum", "choice"],
      ["eccentricity", "required"],
      ["inclination", "required"],
      ["raan", "required"],
      ["argPeriapsis", "required"],
      ["trueAnomaly", "required"],
    ],
    computed: ["position", "velocity", "radius", "speed"],
    evaluate(g, body) {
      const e = g.num("eccentricity", "nonNegative");
      if (g.has("semiMajorAxis") === g.has("semiLatusRectum")) fail("give semiMajorAxis or semiLatusRectum (exactly one)");
      let p: number;
      if (g.has("semiLatusRectum")) p = g.num("semiLatusRectum", "positive");
      else {
        const a = g.num("semiMajorAxis");
        if (classify(e) === "parabolic") fail("a parabola (e = 1) has no finite semi-major axis; give semiLatusRectum");
        if ((a > 0 && e > 1) || (a < 0 && e < 1) || a === 0)
          fail(`semiMajorAxis ${fmt(a)} km and eccentricity ${fmt(e)} disagree in sign convention (a > 0 for e < 1, a < 0 for e > 1)`);
        // p = a(1 − e²).
        p = a * (1 - e * e);
      }
      const i = angleBetweenZeroAnd(g, "inclination", 180);
      const raan = g.num("raan") * DEG;
      const w = g.num("argPeriapsis") * DEG;
      const nu = g.num("trueAnomaly") * DEG;
      const s = elementsToState(p, e, i, raan, w, nu, body.mu);
      const conic = { p, e, a: classify(e) === "parabolic" ? Infinity : p / (1 - e * e) };
      const messages = stateWarnings(s.position, conic, body, "the position");
      return result({ position: [...s.position], velocity: [...s.velocity], radius: norm(s.position), speed: norm(s.velocity) }, body, {
        messages,
        conics: [plotOf("orbit", conic, { marker: nu * RAD })],
      });
    },
  },

  kepler: {
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
  },

  timeOfFlight: {
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
        const n = Math.sqrt(mu / c.a ** 3);
        // Kepler's equation: t = (M2 − M1)/n with M from the eccentric anomaly.
        const M1 = meanFromEccentric(eccentricFromTrue(t1, c.e), c.e);
        const M2 = meanFromEccentric(eccentricFromTrue(t2, c.e), c.e);
        values.time = (M2 - M1) / n;
        values.period = periodOf(mu, c.a);
      } else {
        if (t2 < t1) fail("on an open orbit trueAnomalyTo must not precede trueAnomalyFrom (the body passes periapsis only once)");
        unavailable.period = `period ${BOUND_ONLY}; this orbit is ${type} (e = ${fmt(c.e)})`;
        if (type === "parabolic") {
          const h = angularMomentum(mu, c.p);
          // Barker's equation: t = (h³/μ²)·M_p.
          const k = h ** 3 / (mu * mu);
          const lim = Math.PI;
          if (Math.abs(t1) >= lim || Math.abs(t2) >= lim) fail("true anomalies on a parabola must lie strictly between −180° and 180°");
          values.time = k * (parabolicMeanAnomaly(t2) - parabolicMeanAnomaly(t1));
        } else {
          const n = Math.sqrt(mu / (-c.a) ** 3);
          // Hyperbolic Kepler's equation: t = (Mh2 − Mh1)/n.
          values.time = (meanFromHyperbolic(hyperbolicFromTrue(t2, c.e), c.e) - meanFromHyperbolic(hyperbolicFromTrue(t1, c.e), c.e)) / n;
        }
      }
      return result(values, body, {
        unavailable,
        messages,
        conics: [plotOf("orbit", c, { trueAnomalyRange: [t1 * RAD, t2 * RAD] })],
      });
    },
  },

  propagate: {
    summary: "two-body state after a time (universal variables)",
    givenRule: "position [km], velocity [km/s] and time (s, may be negative)",
    given: [
      ["position", "required"],
      ["velocity", "required"],
      ["time", "required"],
    ],
    computed: ["position", "velocity", "radius", "speed"],
    evaluate(g, body) {
      const r0 = g.vec("position");
      const v0 = g.vec("velocity");
      const t = g.num("time");
      const el = stateToElements(r0, v0, body.mu);
      const conic: Conic = { a: el.a, e: el.e, p: el.p };
      const messages = stateWarnings(r0, conic, body, "position");
      const s = propagate(r0, v0, t, body.mu);
      const el2 = stateToElements(s.position, s.velocity, body.mu);
      return result({ position: [...s.position], velocity: [...s.velocity], radius: norm(s.position), speed: norm(s.velocity) }, body, {
        messages,
        conics: [plotOf("orbit", conic, { trueAnomalyRange: [el.trueAnomaly * RAD, el2.trueAnomaly * RAD], marker: el2.trueAnomaly * RAD })],
      });
    },
  },

  hohmann: {
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
  },

  biElliptic: {
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
  },

  planeChange: {
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
        // Circular speed √(μ/r).
        return result({ deltaV: simplePlaneChange(Math.sqrt(body.mu / r), angle) }, body, { conics: [plotOf("orbit", circle(r))] });
      }
      const v1 = g.num("initialSpeed", "positive");
      const v2 = g.num("finalSpeed", "positive");
      return result({ deltaV: combinedPlaneChange(v1, v2, angle) }, body);
    },
  },

  rocket: {
    usesBody: false,
    summary: "the rocket equation",
    givenRule: "specificImpulse (s) and exactly two of initialMass, finalMass, deltaV, propellantMass",
    given: [
      ["specificImpulse", "required"],
      ["initialMass", "choice"],
      ["finalMass", "choice"],
      ["deltaV", "choice"],
      ["propellantMass", "choice"],
    ],
    computed: ["deltaV", "initialMass", "finalMass", "propellantMass", "massRatio"],
    evaluate(g, body, options) {
      const r = solveRocket({
        g0: options?.g0,
        specificImpulse: g.num("specificImpulse", "positive"),
        initialMass: g.optNum("initialMass"),
        finalMass: g.optNum("finalMass"),
        deltaV: g.optNum("deltaV"),
        propellantMass: g.optNum("propellantMass"),
      });
      return result({ ...r }, body);
    },
  },

  deltaVBudget: {
    usesBody: false,
    summary: "Δv budget against the vehicle's rocket-equation capability",
    givenRule:
      "maneuvers [{ name, deltaV (km/s) }] or phases [{ name, type: deterministic or statistical, margin (fraction), maneuvers: [{ name, deltaV, specificImpulse? or engine: main or thrusters }] }], specificImpulse (s, main engine), optional thrusterSpecificImpulse (s), initialMass and finalMass (kg), optional requiredMargin, residualFraction and lossFactor (fractions)",
    given: [
      ["maneuvers", "choice"],
      ["phases", "choice"],
      ["specificImpulse", "required"],
      ["thrusterSpecificImpulse", "optional"],
      ["initialMass", "required"],
      ["finalMass", "required"],
      ["requiredMargin", "optional"],
      ["residualFraction", "optional"],
      ["lossFactor", "optional"],
    ],
    computed: [
      "deltaVRequired",
      "deltaVAvailable",
      "margin",
      "marginOk",
      "deltaVWithMargins",
      "phases",
      "phaseDeltaV",
      "phaseDeltaVAvailable",
      "phasePropellant",
      "propellantRequired",
      "propellantLoaded",
      "propellantUsable",
      "propellantRemaining",
      "closes",
      "closesWithoutStatisticalMargins",
    ],
    evaluate(g, body, options) {
      if (g.has("phases")) {
        if (g.has("maneuvers")) fail("give maneuvers (a single list) or phases, not both");
        const isp = g.num("specificImpulse", "positive");
        const b = phasedDeltaVBudget(
          readPhases(g, isp),
          isp,
          g.num("initialMass", "positive"),
          g.num("finalMass", "positive"),
          g.optNum("residualFraction", "nonNegative") ?? 0,
          g.optNum("lossFactor", "nonNegative") ?? 0,
        );
        const loss = g.optNum("lossFactor");
        return result(phasedValues(b, g.optNum("requiredMargin")), body, {
          messages: loss ? [`a loss factor of ${fmt(loss * 100)} % is the proposer's stated assumption for finite burns or low thrust`] : [],
        });
      }
      if (!g.has("maneuvers")) fail("give maneuvers [{ name, deltaV }] or phases [{ name, type, margin, maneuvers }]");
      const raw = g.value("maneuvers");
      if (!Array.isArray(raw)) fail('given.maneuvers must be an array such as [{ "name": "orbit raising", "deltaV": 0.12 }]');
      if (raw.length > 500) fail("given.maneuvers has more than 500 entries");
      const list = raw.map((m, i) => {
        if (typeof m !== "object" || m === null || Array.isArray(m)) fail(`maneuvers[${i}] must be an object { name, deltaV }`);
        const o = m as Record<string, unknown>;
        if (typeof o.deltaV !== "number" || !Number.isFinite(o.deltaV)) fail(`maneuvers[${i}].deltaV must be a finite number in km/s`);
        const name = typeof o.name === "string" ? o.name : `maneuver ${i + 1}`;
        return { name, deltaV: o.deltaV };
      });
      const req = g.optNum("requiredMargin") ?? 0;
      const b = deltaVBudget(
        list,
        g.num("specificImpulse", "positive"),
        g.num("initialMass", "positive"),
        g.num("finalMass", "positive"),
        req,
        options?.g0 ?? STANDARD_GRAVITY_KM_S2,
      );
      return result({ ...b }, body);
    },
  },

  escape: {
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
      // C3 = v∞².
      const vInf = g.has("c3") ? Math.sqrt(g.num("c3", "nonNegative")) : g.num("hyperbolicExcessSpeed", "nonNegative");
      const d = departure(body.mu, r, vInf);
      // Departure hyperbola: e = 1 + rp v∞²/μ, p = rp(1 + e).
      const e = 1 + (r * vInf * vInf) / body.mu;
      return result({ ...d }, body, {
        conics: [
          plotOf("parking orbit", circle(r)),
          plotOf("departure", { p: r * (1 + e), e, a: -body.mu / (vInf * vInf) }, { trueAnomalyRange: [0, 0.95 * Math.acos(-1 / e) * RAD] }),
        ],
      });
    },
  },

  interplanetaryHohmann: {
    summary: "patched-conic Hohmann transfer between two planets on circular coplanar orbits",
    givenRule:
      "from and to (planet names or override objects with mu, radius, orbitRadius), departureAltitude (km), optional arrivalAltitude (km); body is the central body (sun by default)",
    given: [
      ["from", "required"],
      ["to", "required"],
      ["departureAltitude", "required"],
      ["arrivalAltitude", "optional"],
    ],
    computed: ["transferTime", "departureExcessSpeed", "departureDeltaV", "arrivalExcessSpeed", "arrivalDeltaV", "synodicPeriod"],
    defaultBody: "sun",
    evaluate(g, central) {
      if (!g.has("from") || !g.has("to")) fail("interplanetaryHohmann needs given.from and given.to (planet names or override objects)");
      const leg = (label: "from" | "to"): PlanetLeg => {
        const b = resolveBody(g.value(label), "earth", `given.${label}`);
        if (b.orbitRadius === undefined) fail(`given.${label} (${b.name}) has no orbit radius about the central body; add orbitRadius (km)`);
        return { name: b.name, mu: b.mu, radius: b.radius, orbitRadius: b.orbitRadius };
      };
      const from = leg("from");
      const to = leg("to");
      const depAlt = g.num("departureAltitude");
      if (!(depAlt > 0)) fail(`departureAltitude must be above the surface of ${from.name} (got ${fmt(depAlt)} km)`);
      const arrAlt = g.optNum("arrivalAltitude");
      if (arrAlt !== undefined && !(arrAlt > 0)) fail(`arrivalAltitude must be above the surface of ${to.name} (got ${fmt(arrAlt)} km)`);
      const r = interplanetaryHohmann(central.mu, from, to, depAlt, arrAlt);
      const { arrivalDeltaV } = r;
      const values: Record<string, ComputedValue> = {
        transferTime: r.transferTime,
        departureExcessSpeed: r.departureExcessSpeed,
        departureDeltaV: r.departureDeltaV,
        arrivalExcessSpeed: r.arrivalExcessSpeed,
        synodicPeriod: r.synodicPeriod,
      };
      const unavailable: Record<string, string> = {};
      if (arrivalDeltaV !== undefined) values.arrivalDeltaV = arrivalDeltaV;
      else unavailable.arrivalDeltaV = "arrivalDeltaV needs given.arrivalAltitude (km) of the circular capture orbit";
      const r1 = from.orbitRadius;
      const r2 = to.orbitRadius;
      return result(values, central, {
        unavailable,
        conics: [
          plotOf(from.name, circle(r1)),
          plotOf("transfer", apseEllipse(r1, r2), { trueAnomalyRange: r2 > r1 ? [0, 180] : [180, 360] }),
          plotOf(to.name, circle(r2)),
        ],
      });
    },
  },

  sphereOfInfluence: {
    summary: "Laplace sphere of influence of a body about its parent",
    givenRule: "nothing beyond body (a planet around the sun, or the moon around the earth; overrides may set orbitRadius and parentMu)",
    given: [],
    computed: ["radius"],
    evaluate(g, body) {
      if (body.orbitRadius === undefined || body.parentMu === undefined)
        fail(`${body.name} has no parent in the constants table; give a body with orbitRadius (km) and parentMu (km³/s²)`);
      return result({ radius: sphereOfInfluence(body.orbitRadius, body.mu, body.parentMu) }, body);
    },
  },

  j2Rates: {
    summary: "secular J2 drift of the node and periapsis",
    givenRule: `an orbit shape (${SHAPE_RULE}; one radius or altitude alone means circular) and inclination (deg)`,
    given: [...SHAPE_GIVEN, ["inclination", "required"]],
    computed: ["raanRate", "argPeriapsisRate", "period"],
    evaluate(g, body) {
      const { conic: c, messages } = readShape(g, body, true);
      const i = angleBetweenZeroAnd(g, "inclination", 180);
      if (!(c.e < 1) || classify(c.e) === "parabolic") fail(`J2 secular rates are computed for closed orbits only (e = ${fmt(c.e)})`);
      const rates = j2SecularRates(body.mu, body.j2ReferenceRadius, body.j2, c.a, c.e, i);
      const k = RAD * SECONDS_PER_DAY;
      return result({ raanRate: rates.raanRate * k, argPeriapsisRate: rates.argPeriapsisRate * k, period: periodOf(body.mu, c.a) }, body, {
        messages,
        conics: [plotOf("orbit", c)],
      });
    },
  },

  sunSynchronous: {
    summary: "inclination that makes the J2 nodal drift follow the mean sun",
    givenRule: `an orbit shape (${SHAPE_RULE}; one radius or altitude alone means circular)`,
    given: SHAPE_GIVEN,
    computed: ["inclination", "raanRate", "period"],
    evaluate(g, body) {
      const { conic: c, messages } = readShape(g, body, true);
      if (!(c.e < 1) || classify(c.e) === "parabolic") fail(`a sun-synchronous orbit must be closed (e = ${fmt(c.e)})`);
      if (body.year === undefined)
        fail(
          `${body.name} has no orbital period about the sun in the constants table, so no sun-synchronous rate exists for it; ` +
            'give the body as an object with year (days), e.g. { "name": "' +
            body.name +
            '", "year": 365.25 }',
        );
      // The mean sun's rate seen from the body: 360° per the body's own (tropical) year.
      const sunRateDegPerDay = 360 / body.year;
      const rate = (sunRateDegPerDay * DEG) / SECONDS_PER_DAY;
      const i = inclinationForNodalRate(body.mu, body.j2ReferenceRadius, body.j2, c.a, c.e, rate);
      return result({ inclination: i * RAD, raanRate: sunRateDegPerDay, period: periodOf(body.mu, c.a) }, body, {
        messages,
        conics: [plotOf("orbit", c)],
      });
    },
  },

  lambert: {
    summary: "Lambert's problem: the zero-revolution transfer between two positions in a given time",
    givenRule: "position1, position2 (km), timeOfFlight (s), optional direction (prograde default, or retrograde)",
    given: [
      ["position1", "required"],
      ["position2", "required"],
      ["timeOfFlight", "required"],
      ["direction", "optional"],
    ],
    computed: ["velocity1", "velocity2", "transferAngle", "semiMajorAxis", "eccentricity"],
    evaluate(g, body) {
      const r1 = g.vec("position1");
      const r2 = g.vec("position2");
      for (const [label, r] of [
        ["position1", r1],
        ["position2", r2],
      ] as const)
        if (norm(r) < body.radius) fail(`${label} is ${fmt(norm(r))} km from the centre, inside ${body.name} (radius ${fmt(body.radius)} km)`);
      const tof = g.num("timeOfFlight", "positive");
      const dir = g.text("direction", ["prograde", "retrograde"], "prograde") as "prograde" | "retrograde";
      const s = lambert(r1, r2, tof, body.mu, dir);
      const el = stateToElements(r1, s.velocity1, body.mu);
      const values: Record<string, ComputedValue> = {
        velocity1: [...s.velocity1],
        velocity2: [...s.velocity2],
        transferAngle: s.transferAngle * RAD,
        eccentricity: el.e,
      };
      const unavailable: Record<string, string> = {};
      if (Number.isFinite(el.a)) values.semiMajorAxis = el.a;
      else unavailable.semiMajorAxis = "the transfer is parabolic: no finite semi-major axis";
      const messages: string[] = [];
      if (periapsisRadius({ a: el.a, e: el.e, p: el.p }) < body.radius) {
        // Does the arc itself pass through periapsis (true anomaly crossing 0 / 360)?
        const th1 = el.trueAnomaly;
        const th2 = th1 + s.transferAngle;
        if (th2 >= 2 * Math.PI) messages.push(`the transfer arc passes below the surface of ${body.name}`);
      }
      return result(values, body, {
        unavailable,
        messages,
        conics: [plotOf("transfer", { a: el.a, e: el.e, p: el.p }, { trueAnomalyRange: [el.trueAnomaly * RAD, (el.trueAnomaly + s.transferAngle) * RAD] })],
      });
    },
  },

  eclipse: {
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
      const messages =
        ecl.eclipseFraction === 0 ? [`no eclipse: |beta| is above the critical angle ${fmt(ecl.criticalBetaAngle * RAD)}° for this altitude`] : [];
      return result({ eclipseDuration: ecl.eclipseFraction * T, eclipseFraction: ecl.eclipseFraction, sunlitFraction: ecl.sunlitFraction, period: T }, body, {
        messages,
        conics: [plotOf("orbit", circle(r))],
      });
    },
  },

  lifetime: lifetimeKind,
  disposal: disposalKind,
  massBudget: massBudgetKind,

  groundContact: {
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
  },

  contactTime: contactTimeKind,
  linkBudget: linkBudgetKind,
  repeatGroundTrack: repeatGroundTrackKind,
};

export const KIND_NAMES = Object.keys(KIND_DEFS);

export function kindDef(kind: string): KindDef | undefined {
  return Object.prototype.hasOwnProperty.call(KIND_DEFS, kind) ? KIND_DEFS[kind] : undefined;
}

export function usesBody(kind: string): boolean {
  return kindDef(kind)?.usesBody !== false;
}

export function defaultBodyOf(kind: string): BodyName {
  return kindDef(kind)?.defaultBody ?? "earth";
}

/** The kinds with their given and computed quantities, for building forms. */
export const ORBIT_CHECK_KINDS: readonly KindInfo[] = KIND_NAMES.map((kind) => {
  const d = KIND_DEFS[kind]!;
  const info = (name: string) => {
    const q = quantityInfoFor(kind, name);
    if (!q) throw new Error(`quantity ${name} missing from the quantities table`);
    return q;
  };
  return {
    kind,
    summary: d.summary,
    givenRule: d.givenRule,
    defaultBody: d.defaultBody ?? "earth",
    given: d.given.map(([name, use]) => ({ name, unit: info(name).unit, type: info(name).type, use })),
    computed: d.computed.map((name) => ({
      name,
      unit: info(name).unit,
      type: info(name).type,
      ...(QUANTITY_ALIASES[name] ? { aliasOf: QUANTITY_ALIASES[name] } : {}),
    })),
  };
});

export function allowedGiven(kind: string): string[] {
  return (kindDef(kind)?.given ?? []).map(([n]) => n);
}
