/**
 * Position/velocity ↔ classical orbital elements (angles in radians inside, km and km/s).
 */
import { classify, type OrbitType } from "./conics";
import { fail, fmt } from "./errors";
import { cross, dot, norm, scale, sub, type Vec3, TWO_PI, wrapTwoPi as wrap } from "./vector";

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
  // Inclination from h: tan i = √(hx² + hy²) / hz (atan2 keeps full precision near 0° and 180°).
  const i = Math.atan2(Math.hypot(hVec[0], hVec[1]), hVec[2]);
  // Node vector n = K × h.
  const nVec: Vec3 = [-hVec[1], hVec[0], 0];
  const n = norm(nVec);
  const hHat = scale(hVec, 1 / h);
  // Signed angle from u to w about the orbit normal: atan2((u × w)·ĥ, u·w).
  const angle = (u: Vec3, w: Vec3) => {
    const x = Math.atan2(dot(cross(u, w), hHat), dot(u, w));
    return x < 0 ? x + TWO_PI : x;
  };
  const notes: string[] = [];
  const equatorial = n < SMALL * h;
  const circular = orbitType === "circular";
  const xAxis: Vec3 = [1, 0, 0];
  // Right ascension of the ascending node from the node vector.
  const raan = equatorial ? 0 : wrap(Math.atan2(nVec[1], nVec[0]));
  if (equatorial) notes.push("the orbit is equatorial: raan is undefined and reported as 0; angles are measured from the x axis");
  if (circular) notes.push("the orbit is circular: argPeriapsis is undefined and reported as 0; trueAnomaly is measured from the node (or the x axis)");
  const reference = equatorial ? xAxis : nVec;
  // Argument of periapsis: angle from the node (or x axis) to the eccentricity vector.
  const argPeriapsis = circular ? 0 : angle(reference, eVec);
  // True anomaly: angle from the eccentricity vector to r (argument of latitude or true longitude when circular).
  const trueAnomaly = circular ? angle(reference, r) : angle(eVec, r);
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
  if (!(denom > 1e-12)) fail(`true anomaly ${fmt((trueAnomaly * 180) / Math.PI)}° is not reached on this open orbit (beyond the asymptote for e = ${fmt(e)})`);
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
