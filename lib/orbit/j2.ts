/**
 * Secular J2 effects: nodal regression, apsidal rotation and the sun-synchronous inclination.
 * Rates in rad/s inside; the check layer reports deg/day.
 */
import { fail, fmt } from "./errors";

export interface J2Rates {
  raanRate: number;
  argPeriapsisRate: number;
}

/**
 * First-order secular rates due to J2 (Brouwer/Kozai first-order theory, as in Vallado
 * §9.6 and Curtis §4.7): Ω̇ = −(3/2) n J2 (R/p)² cos i, ω̇ = (3/4) n J2 (R/p)² (5cos²i − 1).
 */
export function j2SecularRates(mu: number, radius: number, j2: number, a: number, e: number, i: number): J2Rates {
  if (!(a > 0) || !(e >= 0 && e < 1)) fail(`J2 secular rates apply to closed orbits (a > 0, e < 1); got a = ${fmt(a)} km, e = ${fmt(e)}`);
  // Mean motion n = √(μ/a³); p = a(1 − e²).
  const n = Math.sqrt(mu / (a * a * a));
  const p = a * (1 - e * e);
  const k = n * j2 * (radius / p) ** 2;
  const c = Math.cos(i);
  return { raanRate: -1.5 * k * c, argPeriapsisRate: 0.75 * k * (5 * c * c - 1) };
}

/**
 * Inclination (rad) at which the J2 nodal regression equals a target rate (rad/s), e.g.
 * the mean sun's 360° per tropical year: cos i = Ω̇ / (−(3/2) n J2 (R/p)²).
 */
export function inclinationForNodalRate(mu: number, radius: number, j2: number, a: number, e: number, nodalRate: number): number {
  if (!(a > 0) || !(e >= 0 && e < 1)) fail(`a sun-synchronous orbit must be closed (a > 0, e < 1); got a = ${fmt(a)} km, e = ${fmt(e)}`);
  if (!(j2 > 0)) fail("the body's J2 must be positive for a sun-synchronous orbit to exist");
  const n = Math.sqrt(mu / (a * a * a));
  const p = a * (1 - e * e);
  // Solving the J2 nodal-rate equation for cos i.
  const c = nodalRate / (-1.5 * n * j2 * (radius / p) ** 2);
  if (c < -1 || c > 1)
    fail(`no inclination gives the required nodal rate for this orbit (cos i would be ${fmt(c)}): the orbit is too high or the body's J2 too small`);
  return Math.acos(c);
}
