/**
 * Escape and hyperbolic departure from a circular parking orbit.
 */
import { fail, fmt } from "./errors";

export interface EscapeResult {
  escapeSpeed: number;
  circularSpeed: number;
  periapsisSpeed: number;
  deltaV: number;
  c3: number;
  hyperbolicExcessSpeed: number;
}

/** Departure hyperbola from a circular orbit of radius r with excess speed vInf (km/s). */
export function departure(mu: number, r: number, vInf: number): EscapeResult {
  if (!(r > 0)) fail("parking radius must be positive");
  if (!(vInf >= 0)) fail(`hyperbolicExcessSpeed must be zero or positive (got ${fmt(vInf)} km/s)`);
  // Escape speed √(2μ/r) and circular speed √(μ/r) (energy integral).
  const escapeSpeed = Math.sqrt((2 * mu) / r);
  const circularSpeed = Math.sqrt(mu / r);
  // Vis-viva on the hyperbola: vp² = v∞² + 2μ/r.
  const periapsisSpeed = Math.sqrt(vInf * vInf + (2 * mu) / r);
  // C3 = v∞² (characteristic energy, twice the specific energy).
  return { escapeSpeed, circularSpeed, periapsisSpeed, deltaV: periapsisSpeed - circularSpeed, c3: vInf * vInf, hyperbolicExcessSpeed: vInf };
}
