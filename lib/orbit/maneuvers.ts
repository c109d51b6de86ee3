/**
 * Impulsive transfers between circular coplanar orbits and plane changes.
 * Δv values are magnitudes in km/s; radii in km; times in s.
 */
import { fail, fmt } from "./errors";

export interface HohmannResult {
  deltaV1: number;
  deltaV2: number;
  deltaVTotal: number;
  transferTime: number;
  transferSemiMajorAxis: number;
}

/** Hohmann transfer between circular coplanar orbits of radii r1 and r2 (Hohmann 1925). */
export function hohmann(mu: number, r1: number, r2: number): HohmannResult {
  if (!(r1 > 0 && r2 > 0)) fail("transfer radii must be positive");
  // Transfer ellipse tangent to both circles, a = (r1 + r2)/2: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 6, Hohmann transfer (recalled from memory).
  const a = (r1 + r2) / 2;
  // Vis-viva at each apse of the transfer ellipse minus the circular speed √(μ/r) there: Vallado, "Fundamentals of Astrodynamics and Applications" (4th ed.), ch. 6, Hohmann transfer algorithm (recalled from memory).
  const v1c = Math.sqrt(mu / r1);
  const v2c = Math.sqrt(mu / r2);
  const vt1 = Math.sqrt(mu * (2 / r1 - 1 / a));
  const vt2 = Math.sqrt(mu * (2 / r2 - 1 / a));
  const deltaV1 = Math.abs(vt1 - v1c);
  const deltaV2 = Math.abs(v2c - vt2);
  // Half the period of the transfer ellipse, π√(a³/μ) (Kepler's third law): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 6, Hohmann transfer (recalled from memory).
  const transferTime = Math.PI * Math.sqrt((a * a * a) / mu);
  return { deltaV1, deltaV2, deltaVTotal: deltaV1 + deltaV2, transferTime, transferSemiMajorAxis: a };
}

export interface BiEllipticResult {
  deltaV1: number;
  deltaV2: number;
  deltaV3: number;
  deltaVTotal: number;
  transferTime: number;
  firstSemiMajorAxis: number;
  secondSemiMajorAxis: number;
}

/** Bi-elliptic transfer via an intermediate apoapsis radius rb (Sternfeld 1934). */
export function biElliptic(mu: number, r1: number, r2: number, rb: number): BiEllipticResult {
  if (!(r1 > 0 && r2 > 0 && rb > 0)) fail("transfer radii must be positive");
  if (rb < Math.max(r1, r2))
    fail(`the intermediate radius ${fmt(rb)} km must be at least the larger of the initial and final radii (${fmt(Math.max(r1, r2))} km)`);
  // Semi-major axes of the two half-ellipses through rb: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 6, bi-elliptic Hohmann transfer (recalled from memory).
  const a1 = (r1 + rb) / 2;
  const a2 = (r2 + rb) / 2;
  // Vis-viva on the two half-ellipses, burns at r1, rb and r2: Vallado, "Fundamentals of Astrodynamics and Applications" (4th ed.), ch. 6, bi-elliptic transfer algorithm (recalled from memory).
  const v1c = Math.sqrt(mu / r1);
  const v2c = Math.sqrt(mu / r2);
  const vA = Math.sqrt(mu * (2 / r1 - 1 / a1));
  const vB1 = Math.sqrt(mu * (2 / rb - 1 / a1));
  const vB2 = Math.sqrt(mu * (2 / rb - 1 / a2));
  const vC = Math.sqrt(mu * (2 / r2 - 1 / a2));
  const deltaV1 = Math.abs(vA - v1c);
  const deltaV2 = Math.abs(vB2 - vB1);
  const deltaV3 = Math.abs(vC - v2c);
  // Two half-periods π√(a³/μ) (Kepler's third law): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 6, bi-elliptic Hohmann transfer (recalled from memory).
  const transferTime = Math.PI * (Math.sqrt(a1 ** 3 / mu) + Math.sqrt(a2 ** 3 / mu));
  return { deltaV1, deltaV2, deltaV3, deltaVTotal: deltaV1 + deltaV2 + deltaV3, transferTime, firstSemiMajorAxis: a1, secondSemiMajorAxis: a2 };
}

/** Pure plane change at constant speed v by angle Δi (rad): Δv = 2v sin(Δi/2). */
export function simplePlaneChange(v: number, angle: number): number {
  // Isosceles velocity triangle, Δv = 2v sin(Δi/2): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 6, plane change maneuvers (recalled from memory).
  return 2 * v * Math.sin(angle / 2);
}

/** Combined plane change and speed change: law of cosines on the velocity triangle. */
export function combinedPlaneChange(v1: number, v2: number, angle: number): number {
  // Law of cosines Δv² = v1² + v2² − 2 v1 v2 cos Δi: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 6, plane change maneuvers (recalled from memory).
  return Math.sqrt(Math.max(0, v1 * v1 + v2 * v2 - 2 * v1 * v2 * Math.cos(angle)));
}
