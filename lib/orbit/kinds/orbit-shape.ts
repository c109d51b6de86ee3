/** Readers and helpers shared by the conic kinds: the orbit shape, the conic's derived values, radii, plots. */
import { SECONDS_PER_DAY, type Body } from "../constants";
import {
  angularMomentum,
  apoapsisRadius,
  classify,
  conicFromShape,
  flightPathAngle,
  period as periodOf,
  periapsisRadius,
  radiusAt,
  semiMajorAxisFromPeriod,
  specificEnergy,
  visViva,
  type Conic,
  type ShapeInput,
} from "../conics";
import { fail, fmt } from "../errors";
import type { ComputedValue } from "../schema";
import { DEG, RAD, norm, type Vec3 } from "../vector";
import { SHAPE_FIELDS } from "./shared";
import { Inputs, type Evaluation, type GivenInfo, type PlotConic } from "./types";

const SHAPE_NAMES = SHAPE_FIELDS;

export const SHAPE_RULE =
  "two independent values of periapsisAltitude, apoapsisAltitude, periapsisRadius, apoapsisRadius, semiMajorAxis, eccentricity, semiLatusRectum, period; or altitude alone (circular)";

export function readShape(g: Inputs, body: Body, allowSingleRadius: boolean): { conic: Conic; messages: string[] } {
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

export function checkAboveSurface(c: Conic, body: Body): Conic {
  const rp = periapsisRadius(c);
  if (!Number.isFinite(c.p) || !Number.isFinite(c.e) || Number.isNaN(rp)) fail("the orbit shape does not describe a valid conic; check the given values");
  if (rp < body.radius)
    fail(
      `the periapsis radius ${fmt(rp)} km is below the surface of ${body.name} (radius ${fmt(body.radius)} km, altitude ${fmt(rp - body.radius)} km): ` +
        "the orbit intersects the body; raise the periapsis",
    );
  return c;
}

export const BOUND_ONLY = "is defined only for closed orbits (e < 1)";

/** Everything the `orbit` kind derives from a conic (and optionally a true anomaly in rad). */
export function conicValues(c: Conic, body: Body, theta?: number): Pick<Evaluation, "values" | "unavailable"> {
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
  // Energy integral ε = −μ/2a and h = √(μp): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, the energy law and the orbit formulas (recalled from memory).
  values.specificEnergy = specificEnergy(mu, c.a);
  values.specificAngularMomentum = angularMomentum(mu, c.p);
  // Vis-viva at periapsis: Vallado, "Fundamentals of Astrodynamics and Applications" (4th ed.), ch. 1, the vis-viva equation (recalled from memory).
  values.periapsisSpeed = visViva(mu, rp, c.a);
  if (closed) {
    const ra = apoapsisRadius(c);
    // Semi-minor axis of an ellipse b = a√(1 − e²): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, elliptical orbits (recalled from memory).
    values.semiMinorAxis = c.a * Math.sqrt(1 - c.e * c.e);
    values.apoapsisRadius = ra;
    values.apoapsisAltitude = ra - body.radius;
    values.period = periodOf(mu, c.a);
    // Mean motion n = √(μ/a³): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, elliptical orbits (recalled from memory).
    values.meanMotion = Math.sqrt(mu / c.a ** 3) * RAD;
    // Revolutions per day = 86 400 s / period (SI day): the mean-motion field of the two-line element format, Hoots & Roehrich, Spacetrack Report No. 3 (1980) ({R}).
    values.meanMotionRevPerDay = SECONDS_PER_DAY / (values.period as number);
    values.apoapsisSpeed = visViva(mu, ra, c.a);
    unavailable.hyperbolicExcessSpeed = `a hyperbolic excess speed exists only for open orbits (e ≥ 1); ${tag}`;
  } else {
    for (const q of ["semiMinorAxis", "apoapsisRadius", "apoapsisAltitude", "period", "apoapsisSpeed", "meanMotionRevPerDay"])
      unavailable[q] = `${q} ${BOUND_ONLY}; ${tag}`;
    // v∞ = √(2ε) (energy integral at infinity): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, hyperbolic trajectories (recalled from memory).
    values.hyperbolicExcessSpeed = Math.sqrt(Math.max(0, 2 * specificEnergy(mu, c.a)));
    // Hyperbolic mean motion √(μ/|a|³) (hyperbolic Kepler's equation): Vallado, "Fundamentals of Astrodynamics and Applications" (4th ed.), ch. 2, Kepler's problem (recalled from memory).
    if (type === "hyperbolic") values.meanMotion = Math.sqrt(mu / Math.abs(c.a) ** 3) * RAD;
    else unavailable.meanMotion = `a parabola has no mean motion in this sense (${tag})`;
  }
  if (theta !== undefined) {
    if (!closed) {
      // Asymptote of a hyperbola θ∞ = acos(−1/e): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, hyperbolic trajectories (recalled from memory).
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

export function plotOf(label: string, c: Conic, extra: Partial<PlotConic> = {}): PlotConic {
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

export const circle = (r: number): Conic => ({ a: r, e: 0, p: r });

/** Ellipse through apse radii r1 and r2: a = (r1 + r2)/2, e = |r2 − r1|/(r1 + r2), p = 2 r1 r2/(r1 + r2) (Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, elliptical orbits; recalled from memory). */
export const apseEllipse = (r1: number, r2: number): Conic => ({ a: (r1 + r2) / 2, e: Math.abs(r2 - r1) / (r1 + r2), p: (2 * r1 * r2) / (r1 + r2) });

export function radiusOf(g: Inputs, body: Body, prefix: string, label: string): number {
  const alt = `${prefix}Altitude`;
  const rad = `${prefix}Radius`;
  if (g.has(alt) && g.has(rad)) fail(`give ${alt} or ${rad}, not both`);
  if (!g.has(alt) && !g.has(rad)) fail(`give ${alt} or ${rad} for the ${label}`);
  const r = g.has(alt) ? body.radius + g.num(alt) : g.num(rad, "positive");
  if (r < body.radius) fail(`the ${label} (radius ${fmt(r)} km) is below the surface of ${body.name} (radius ${fmt(body.radius)} km)`);
  return r;
}

export function circularRadius(g: Inputs, body: Body, name: string): number {
  const h = g.num(name);
  if (!(h > 0)) fail(`given.${name} must be above the surface (got ${fmt(h)} km)`);
  return body.radius + h;
}

export function stateWarnings(r: Vec3, c: Conic, body: Body, label: string): string[] {
  const rm = norm(r);
  if (rm < body.radius)
    fail(`${label} is ${fmt(rm)} km from the centre, inside ${body.name} (radius ${fmt(body.radius)} km); check the units (km) and the frame`);
  const rp = periapsisRadius(c);
  return rp < body.radius ? [`the periapsis (${fmt(rp)} km) is below the surface of ${body.name}: this trajectory intersects the body`] : [];
}

export function angleBetweenZeroAnd(g: Inputs, name: string, maxDeg: number): number {
  const v = g.num(name);
  if (!(v >= 0 && v <= maxDeg)) fail(`given.${name} must be between 0 and ${maxDeg}° (got ${fmt(v)}°)`);
  return v * DEG;
}

// ---------------------------------------------------------------------------------------

export const result = (values: Record<string, ComputedValue>, body: Body, extra: Partial<Omit<Evaluation, "values">> = {}): Evaluation => ({
  values,
  unavailable: extra.unavailable ?? {},
  messages: extra.messages ?? [],
  conics: extra.conics ?? [],
  plotBodyRadius: extra.plotBodyRadius ?? body.radius,
});

export const SHAPE_GIVEN: [string, GivenInfo["use"]][] = SHAPE_NAMES.map((n) => [n, "choice"]);

export const ORBIT_COMPUTED = [
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
