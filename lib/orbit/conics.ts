/**
 * Conic sections of the two-body problem: shape from any two independent values,
 * classification, the orbit equation and vis-viva. Lengths in km, μ in km³/s², times in s.
 */
import { fail, fmt } from "./errors";

export type OrbitType = "circular" | "elliptic" | "parabolic" | "hyperbolic";

/** Eccentricities within this of 0 or 1 classify as circular or parabolic. */
export const ECCENTRICITY_EPSILON = 1e-9;

export function classify(e: number): OrbitType {
  if (e < ECCENTRICITY_EPSILON) return "circular";
  if (Math.abs(e - 1) <= ECCENTRICITY_EPSILON) return "parabolic";
  return e < 1 ? "elliptic" : "hyperbolic";
}

/** A conic described by its semi-latus rectum and eccentricity (a = ∞ for the parabola). */
export interface Conic {
  /** Semi-latus rectum p, km. */
  p: number;
  /** Eccentricity. */
  e: number;
  /** Semi-major axis, km: positive for ellipses, negative for hyperbolas, Infinity for the parabola. */
  a: number;
}

export function conicFromAE(a: number, e: number): Conic {
  // p = a(1 − e²) for ellipses and hyperbolas (a < 0 with e > 1): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, elliptical and hyperbolic orbits (recalled from memory).
  return { a, e, p: a * (1 - e * e) };
}

export function conicFromPE(p: number, e: number): Conic {
  // a = p / (1 − e²), the parabola has no finite semi-major axis: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, the orbit formulas (recalled from memory).
  const a = classify(e) === "parabolic" ? Infinity : p / (1 - e * e);
  return { a, e: classify(e) === "parabolic" ? 1 : e, p };
}

/** Semi-major axis from the period of a closed orbit (Kepler's third law). */
export function semiMajorAxisFromPeriod(mu: number, T: number): number {
  // Kepler's third law T = 2π·√(a³/μ) solved for a: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, period of an elliptical orbit (recalled from memory).
  return Math.cbrt(mu * (T / (2 * Math.PI)) ** 2);
}

/** Period of a closed orbit (Kepler's third law). */
export function period(mu: number, a: number): number {
  // Kepler's third law T = 2π·√(a³/μ): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, period of an elliptical orbit (recalled from memory).
  return 2 * Math.PI * Math.sqrt((a * a * a) / mu);
}

/** Radius at true anomaly θ (rad): the orbit equation r = p / (1 + e cos θ). */
export function radiusAt(c: Conic, theta: number): number {
  // Orbit equation r = p / (1 + e cos θ) (conic in polar form about the focus): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, the orbit formulas (recalled from memory).
  return c.p / (1 + c.e * Math.cos(theta));
}

/** Speed at radius r on a conic of semi-major axis a (vis-viva). */
export function visViva(mu: number, r: number, a: number): number {
  // Vis-viva v² = μ(2/r − 1/a): Vallado, "Fundamentals of Astrodynamics and Applications" (4th ed.), ch. 1, the vis-viva equation (recalled from memory).
  return Math.sqrt(mu * (2 / r - (Number.isFinite(a) ? 1 / a : 0)));
}

/** Specific orbital energy ε = −μ/(2a) (zero for the parabola). */
export function specificEnergy(mu: number, a: number): number {
  // Energy integral ε = v²/2 − μ/r = −μ/(2a): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, the energy law (recalled from memory).
  return Number.isFinite(a) ? -mu / (2 * a) : 0;
}

/** Specific angular momentum h = √(μp). */
export function angularMomentum(mu: number, p: number): number {
  // p = h²/μ, so h = √(μp): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, the orbit formulas (recalled from memory).
  return Math.sqrt(mu * p);
}

/** Flight-path angle (rad) at true anomaly θ: tan γ = e sin θ / (1 + e cos θ). */
export function flightPathAngle(e: number, theta: number): number {
  // Flight-path angle tan γ = e sin θ / (1 + e cos θ) (velocity above the local horizontal): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, the orbit formulas (recalled from memory).
  return Math.atan2(e * Math.sin(theta), 1 + e * Math.cos(theta));
}

/** The shape values an orbit may be given by, as radii (altitudes already converted). */
export interface ShapeInput {
  periapsisRadius?: number;
  apoapsisRadius?: number;
  semiMajorAxis?: number;
  eccentricity?: number;
  semiLatusRectum?: number;
  period?: number;
}

type ShapeKey = keyof ShapeInput;

/**
 * Builds the conic from exactly two independent shape values. Throws OrbitInputError with
 * a proposer-facing message for dependent, contradictory or impossible pairs.
 */
export function conicFromShape(s: ShapeInput, mu: number): Conic {
  const keys = (Object.keys(s) as ShapeKey[]).filter((k) => s[k] !== undefined);
  if (keys.length !== 2) fail(`an orbit shape needs exactly two independent values (got ${keys.length}: ${keys.join(", ") || "none"})`);
  const has = (k: ShapeKey) => s[k] !== undefined;
  const rp = s.periapsisRadius;
  const ra = s.apoapsisRadius;
  const a0 = s.semiMajorAxis;
  const e0 = s.eccentricity;
  const p0 = s.semiLatusRectum;
  const T = s.period;
  if (e0 !== undefined && e0 < 0) fail(`eccentricity must be zero or positive (got ${fmt(e0)})`);
  for (const k of ["periapsisRadius", "apoapsisRadius", "semiLatusRectum", "period"] as const) {
    const v = s[k];
    if (v !== undefined && !(v > 0)) fail(`${k} must be positive (got ${fmt(v)})`);
  }
  if (a0 !== undefined && a0 === 0) fail("semiMajorAxis cannot be zero");
  const closedA = (label: string) => {
    if (a0 !== undefined && a0 < 0) fail(`${label} belongs to a closed orbit, but semiMajorAxis ${fmt(a0)} km is negative (a hyperbola)`);
  };

  if (has("periapsisRadius") && has("apoapsisRadius")) {
    if (ra! < rp!) fail(`apoapsis radius ${fmt(ra!)} km is below periapsis radius ${fmt(rp!)} km; swap them`);
    // Apse radii a = (rp + ra)/2, e = (ra − rp)/(ra + rp): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, elliptical orbits (recalled from memory).
    return conicFromAE((rp! + ra!) / 2, (ra! - rp!) / (ra! + rp!));
  }
  if (has("periapsisRadius") && has("semiMajorAxis")) {
    // rp = a(1 − e) for ellipses and hyperbolas alike (a < 0 for hyperbolas): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, elliptical and hyperbolic orbits (recalled from memory).
    const e = 1 - rp! / a0!;
    if (a0! > 0 && rp! > a0!) fail(`periapsis radius ${fmt(rp!)} km exceeds the semi-major axis ${fmt(a0!)} km`);
    return conicFromAE(a0!, e);
  }
  if (has("periapsisRadius") && has("eccentricity")) {
    // p = rp(1 + e) (orbit equation at θ = 0): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, the orbit formulas (recalled from memory).
    return conicFromPE(rp! * (1 + e0!), e0!);
  }
  if (has("periapsisRadius") && has("semiLatusRectum")) {
    // p = rp(1 + e) (orbit equation at θ = 0): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, the orbit formulas (recalled from memory).
    const e = p0! / rp! - 1;
    if (e < -1e-12) fail(`semi-latus rectum ${fmt(p0!)} km is smaller than the periapsis radius ${fmt(rp!)} km, which no conic allows`);
    return conicFromPE(p0!, Math.max(0, e));
  }
  if (has("periapsisRadius") && has("period")) {
    const a = semiMajorAxisFromPeriod(mu, T!);
    if (rp! > a) fail(`periapsis radius ${fmt(rp!)} km exceeds the semi-major axis ${fmt(a)} km implied by the period`);
    // rp = a(1 − e) with a from the period: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, elliptical orbits (recalled from memory).
    return conicFromAE(a, 1 - rp! / a);
  }
  if (has("apoapsisRadius") && has("semiMajorAxis")) {
    closedA("apoapsisRadius");
    // ra = a(1 + e): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, elliptical orbits (recalled from memory).
    const e = ra! / a0! - 1;
    if (e < -1e-12 || e >= 1) fail(`apoapsis radius ${fmt(ra!)} km must lie between a and 2a for semi-major axis ${fmt(a0!)} km`);
    return conicFromAE(a0!, Math.max(0, e));
  }
  if (has("apoapsisRadius") && has("eccentricity")) {
    if (e0! >= 1) fail(`an apoapsis exists only for closed orbits (e < 1); eccentricity ${fmt(e0!)} describes an open orbit`);
    // ra = a(1 + e): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, elliptical orbits (recalled from memory).
    return conicFromAE(ra! / (1 + e0!), e0!);
  }
  if (has("apoapsisRadius") && has("semiLatusRectum")) {
    // p = ra(1 − e) (orbit equation at θ = 180°): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, the orbit formulas (recalled from memory).
    const e = 1 - p0! / ra!;
    if (e < -1e-12) fail(`semi-latus rectum ${fmt(p0!)} km exceeds the apoapsis radius ${fmt(ra!)} km, which no closed orbit allows`);
    return conicFromPE(p0!, Math.max(0, e));
  }
  if (has("apoapsisRadius") && has("period")) {
    const a = semiMajorAxisFromPeriod(mu, T!);
    // ra = a(1 + e) with a from the period: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, elliptical orbits (recalled from memory).
    const e = ra! / a - 1;
    if (e < -1e-12 || e >= 1) fail(`apoapsis radius ${fmt(ra!)} km must lie between a and 2a for the semi-major axis ${fmt(a)} km implied by the period`);
    return conicFromAE(a, Math.max(0, e));
  }
  if (has("semiMajorAxis") && has("eccentricity")) {
    if (classify(e0!) === "parabolic") fail("a parabola (e = 1) has no finite semi-major axis; give periapsisRadius or semiLatusRectum with the eccentricity");
    if (a0! > 0 && e0! > 1) fail(`eccentricity ${fmt(e0!)} is hyperbolic but semiMajorAxis is positive; this engine uses a < 0 for hyperbolas (a = −μ/2ε)`);
    if (a0! < 0 && e0! < 1) fail(`semiMajorAxis ${fmt(a0!)} km is negative (hyperbolic) but eccentricity ${fmt(e0!)} is below 1`);
    return conicFromAE(a0!, e0!);
  }
  if (has("semiMajorAxis") && has("semiLatusRectum")) {
    // p = a(1 − e²): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, elliptical orbits (recalled from memory).
    const e2 = 1 - p0! / a0!;
    if (e2 < -1e-12) fail(`semi-latus rectum ${fmt(p0!)} km cannot exceed the semi-major axis ${fmt(a0!)} km of an ellipse`);
    return conicFromAE(a0!, Math.sqrt(Math.max(0, e2)));
  }
  if (has("semiMajorAxis") && has("period"))
    fail("semiMajorAxis and period are not independent (Kepler's third law links them); give one of them and another shape value");
  if (has("eccentricity") && has("semiLatusRectum")) return conicFromPE(p0!, e0!);
  if (has("eccentricity") && has("period")) {
    if (e0! >= 1) fail(`a period exists only for closed orbits (e < 1); eccentricity ${fmt(e0!)} describes an open orbit`);
    return conicFromAE(semiMajorAxisFromPeriod(mu, T!), e0!);
  }
  if (has("semiLatusRectum") && has("period")) {
    const a = semiMajorAxisFromPeriod(mu, T!);
    // p = a(1 − e²): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, elliptical orbits (recalled from memory).
    const e2 = 1 - p0! / a;
    if (e2 < -1e-12) fail(`semi-latus rectum ${fmt(p0!)} km exceeds the semi-major axis ${fmt(a)} km implied by the period`);
    return conicFromAE(a, Math.sqrt(Math.max(0, e2)));
  }
  return fail(`unsupported combination of shape values: ${keys.join(", ")}`);
}

export function periapsisRadius(c: Conic): number {
  // rp = p / (1 + e) (orbit equation at θ = 0): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, the orbit formulas (recalled from memory).
  return c.p / (1 + c.e);
}

export function apoapsisRadius(c: Conic): number {
  // ra = p / (1 − e), closed orbits only (orbit equation at θ = 180°): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, the orbit formulas (recalled from memory).
  return c.e < 1 ? c.p / (1 - c.e) : Infinity;
}
