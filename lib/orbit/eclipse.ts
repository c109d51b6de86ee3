/**
 * Eclipse of a circular orbit in a cylindrical shadow (sun at infinity, no penumbra).
 */
import { fail, fmt } from "./errors";

export interface EclipseResult {
  eclipseFraction: number;
  sunlitFraction: number;
  criticalBetaAngle: number;
}

/**
 * Fraction of a circular orbit spent in a cylindrical shadow for solar beta angle β (rad):
 * f = (1/π)·acos(√(h² + 2Rh) / ((R + h) cos β)) when |β| < β* = asin(R/(R + h)), else 0
 * (cylindrical-shadow eclipse fraction, Gilmore, Spacecraft Thermal Control Handbook, ch. 2).
 */
export function eclipseFraction(radius: number, altitude: number, beta: number): EclipseResult {
  if (!(altitude > 0)) fail(`altitude must be above the surface (got ${fmt(altitude)} km)`);
  const r = radius + altitude;
  // Critical beta angle above which the orbit never enters the shadow.
  const criticalBetaAngle = Math.asin(radius / r);
  let f = 0;
  if (Math.abs(beta) < criticalBetaAngle) {
    const arg = Math.sqrt(altitude * altitude + 2 * radius * altitude) / (r * Math.cos(beta));
    f = Math.acos(Math.min(1, arg)) / Math.PI;
  }
  return { eclipseFraction: f, sunlitFraction: 1 - f, criticalBetaAngle };
}
