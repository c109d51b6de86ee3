/**
 * Position/velocity ↔ classical orbital elements (angles in radians inside, km and km/s).
 */
import { classify, type OrbitType } from "./conics";
import { fail, fmt } from "./errors";
import { cross, dot, norm, scale, sub, type Vec3, TWO_PI } from "./vector";

export interface ClassicalElements {
  /** Specific angular momentum vector, km²/s. */
  hVec: Vec3;
  h: number;
  /** Eccentricity vector. */
  eVec: Vec3;
  e: number;
  p: number;
  /** Semi-major axis, km (negative for hyperbolas, Infinity for the parabola). */
  a: number;
  i: number;
  raan: number;
  argPeriapsis: number;
  trueAnomaly: number;
  energy: number;
  orbitType: OrbitType;
  /** Notes about undefined angles (equatorial or circular orbits). */
  notes: string[];
}

const SMALL = 1e-10;

/**
 * State vector → classical elements (the standard rv-to-elements algorithm of the
 * astrodynamics texts, e.g. Vallado Algorithm 9 / Curtis Algorithm 4.2).
 */
export function stateToElements(r: Vec3, v: Vec3, mu: number): ClassicalElements {
  const rm = norm(r);
  const vm = norm(v);
  if (!(rm > 0)) fail("position must not be the zero vector");
  // Angular momentum h = r × v.
  const hVec = cross(r, v);
  const h = norm(hVec);
  if (!(h > SMALL * rm * Math.max(vm, 1e-12))) fail("position and velocity are parallel (a radial trajectory): the orbit plane is undefined");
  // Eccentricity vector e = ((v² − μ/r) r − (r·v) v) / μ.
  const rv = dot(r, v);
  const eVec = scale(sub(scale(r, vm * vm - mu / rm), scale(v, rv)), 1 / mu);
  const e = norm(eVec);
  // Energy ε = v²/2 − μ/r.
  const energy = (vm * vm) / 2 - mu / rm;
  const orbitType = classify(e);
  // p = h²/μ; a = −μ/(2ε).
  const p = (h * h) / mu;
  const a = orbitType === "parabolic" ? Infinity : -mu / (2 * energy);
  // Inclination cos i = h_z / h.
  const i = Math.acos(Math.max(-1, Math.min(1, hVec[2] / h)));
  // Node vector n = K × h.
  const nVec: Vec3 = [-hVec[1], hVec[0], 0];
  const n = norm(nVec);
  const notes: string[] = [];
  const equatorial = n < SMALL * h;
  const circular = orbitType === "circular";
  let raan = 0;
  let argPeriapsis = 0;
  let trueAnomaly = 0;
  if (!equatorial) raan = Math.acos(Math.max(-1, Math.min(1, nVec[0] / n)));
  if (!equatorial && nVec[1] < 0) raan = TWO_PI - raan;
  if (equatorial) notes.push("the orbit is equatorial: raan is undefined and reported as 0; angles are measured from the x axis");
  if (circular) notes.push("the orbit is circular: argPeriapsis is undefined and reported as 0; trueAnomaly is measured from the node (or the x axis)");
  if (!circular) {
    if (!equatorial) {
      // Argument of periapsis cos ω = n·e / (n e).
      argPeriapsis = Math.acos(Math.max(-1, Math.min(1, dot(nVec, eVec) / (n * e))));
      if (eVec[2] < 0) argPeriapsis = TWO_PI - argPeriapsis;
    } else {
      // Longitude of periapsis for equatorial orbits, measured in the sense of motion.
      argPeriapsis = Math.atan2(eVec[1], eVec[0]);
      if (hVec[2] < 0) argPeriapsis = -argPeriapsis;
      if (argPeriapsis < 0) argPeriapsis += TWO_PI;
    }
    // True anomaly cos θ = e·r / (e r), quadrant from r·v.
    trueAnomaly = Math.acos(Math.max(-1, Math.min(1, dot(eVec, r) / (e * rm))));
    if (rv < 0) trueAnomaly = TWO_PI - trueAnomaly;
  } else if (!equatorial) {
    // Argument of latitude u for circular inclined orbits.
    trueAnomaly = Math.acos(Math.max(-1, Math.min(1, dot(nVec, r) / (n * rm))));
    if (r[2] < 0) trueAnomaly = TWO_PI - trueAnomaly;
  } else {
    // True longitude for circular equatorial orbits.
    trueAnomaly = Math.atan2(r[1], r[0]);
    if (hVec[2] < 0) trueAnomaly = -trueAnomaly;
    if (trueAnomaly < 0) trueAnomaly += TWO_PI;
  }
  return { hVec, h, eVec, e, p, a, i, raan, argPeriapsis, trueAnomaly, energy, orbitType, notes };
}

/**
 * Classical elements → state vector via the perifocal frame and the 3-1-3 rotation
 * (Ω, i, ω) of the astrodynamics texts (e.g. Vallado Algorithm 10 / Curtis Algorithm 4.5).
 */
export function elementsToState(
  p: number,
  e: number,
  i: number,
  raan: number,
  argPeriapsis: number,
  trueAnomaly: number,
  mu: number,
): { position: Vec3; velocity: Vec3 } {
  if (!(p > 0)) fail(`semi-latus rectum must be positive (got ${fmt(p)} km)`);
  if (!(e >= 0)) fail(`eccentricity must be zero or positive (got ${fmt(e)})`);
  const cosT = Math.cos(trueAnomaly);
  const sinT = Math.sin(trueAnomaly);
  const denom = 1 + e * cosT;
  if (!(denom > 1e-12))
    fail(`true anomaly ${fmt((trueAnomaly * 180) / Math.PI)}° is not reached on this open orbit (beyond the asymptote for e = ${fmt(e)})`);
  // Orbit equation and perifocal state: r = p/(1 + e cos θ), v = √(μ/p)(−sin θ, e + cos θ).
  const r = p / denom;
  const rp: Vec3 = [r * cosT, r * sinT, 0];
  const k = Math.sqrt(mu / p);
  const vp: Vec3 = [-k * sinT, k * (e + cosT), 0];
  const cO = Math.cos(raan);
  const sO = Math.sin(raan);
  const ci = Math.cos(i);
  const si = Math.sin(i);
  const cw = Math.cos(argPeriapsis);
  const sw = Math.sin(argPeriapsis);
  // Perifocal-to-inertial rotation matrix R3(−Ω) R1(−i) R3(−ω).
  const m11 = cO * cw - sO * sw * ci;
  const m12 = -cO * sw - sO * cw * ci;
  const m21 = sO * cw + cO * sw * ci;
  const m22 = -sO * sw + cO * cw * ci;
  const m31 = sw * si;
  const m32 = cw * si;
  const rot = (x: Vec3): Vec3 => [m11 * x[0] + m12 * x[1], m21 * x[0] + m22 * x[1], m31 * x[0] + m32 * x[1]];
  return { position: rot(rp), velocity: rot(vp) };
}
