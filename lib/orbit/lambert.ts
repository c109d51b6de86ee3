/**
 * Lambert's problem, zero revolutions, with universal variables (Bate-Mueller-White ch. 5;
 * Vallado Algorithm 58) solved by bisection on z = αχ², which is slower than Newton but
 * cannot diverge, so transfer angles near 0° and 180° stay well behaved.
 */
import { fail, fmt } from "./errors";
import { stumpffC, stumpffS } from "./propagation";
import { cross, dot, norm, scale, sub, type Vec3 } from "./vector";

export type TransferDirection = "prograde" | "retrograde";

export interface LambertResult {
  velocity1: Vec3;
  velocity2: Vec3;
  /** Transfer angle, rad (0..2π). */
  transferAngle: number;
}

/** Below this |sin Δθ| the transfer plane is treated as undefined. */
const PLANE_EPSILON = 1e-8;

export function lambert(r1: Vec3, r2: Vec3, tof: number, mu: number, direction: TransferDirection = "prograde"): LambertResult {
  const r1m = norm(r1);
  const r2m = norm(r2);
  if (!(r1m > 0 && r2m > 0)) fail("position1 and position2 must not be zero vectors");
  if (!(tof > 0)) fail(`timeOfFlight must be positive (got ${fmt(tof)} s)`);
  const c12 = cross(r1, r2);
  const cosDth = Math.max(-1, Math.min(1, dot(r1, r2) / (r1m * r2m)));
  const sinAbs = norm(c12) / (r1m * r2m);
  if (sinAbs < PLANE_EPSILON) {
    if (cosDth < 0)
      fail(
        "the transfer angle is 180°: position1 and position2 are opposite, so the transfer plane is undefined; " +
          "give a small out-of-plane component that sets the intended plane, or split the transfer in two legs",
      );
    fail(
      "the transfer angle is 0° (or 360°): position1 and position2 are parallel, so the transfer plane is undefined " +
        "and a zero-revolution transfer would be radial; check the positions",
    );
  }
  let dth = Math.acos(cosDth);
  const pro = direction !== "retrograde";
  if (pro ? c12[2] < 0 : c12[2] >= 0) dth = 2 * Math.PI - dth;
  // 1 + cos Δθ = |r̂1 + r̂2|²/2 keeps full relative precision near 180°, where A is small.
  const u = [r1[0] / r1m + r2[0] / r2m, r1[1] / r1m + r2[1] / r2m, r1[2] / r1m + r2[2] / r2m] as const;
  const onePlusCos = (u[0] * u[0] + u[1] * u[1] + u[2] * u[2]) / 2;
  // Lambert's A constant: A = sin Δθ·√(r1 r2 / (1 − cos Δθ)) = ±√(r1 r2 (1 + cos Δθ)).
  const A = (dth < Math.PI ? 1 : -1) * Math.sqrt(r1m * r2m * onePlusCos);
  const sqmu = Math.sqrt(mu);
  // y(z) of the universal-variable Lambert formulation.
  const yOf = (z: number) => r1m + r2m + (A * (z * stumpffS(z) - 1)) / Math.sqrt(stumpffC(z));
  // Time of flight as a function of z; −Infinity where y < 0 (that z is too small).
  const tOf = (z: number) => {
    const y = yOf(z);
    if (!(y >= 0)) return -Infinity;
    const C = stumpffC(z);
    const x = Math.sqrt(y / C);
    return (x * x * x * stumpffS(z) + A * Math.sqrt(y)) / sqmu;
  };
  let lo = -4 * Math.PI * Math.PI;
  let hi = 4 * Math.PI * Math.PI * (1 - 1e-12);
  while (tOf(lo) > tof) {
    lo *= 2;
    if (lo < -4e5) fail(`timeOfFlight ${fmt(tof)} s is too short for any transfer between these positions`);
  }
  if (tOf(hi) < tof) fail(`timeOfFlight ${fmt(tof)} s is longer than one revolution allows; multi-revolution transfers are not covered`);
  let z = 0;
  for (let i = 0; i < 300; i++) {
    z = 0.5 * (lo + hi);
    const t = tOf(z);
    if (t < tof) lo = z;
    else hi = z;
    if (hi - lo <= 1e-14 * Math.max(1, Math.abs(z))) break;
  }
  const y = yOf(z);
  // Lagrange coefficients from y (Bate-Mueller-White eq. 5.3-x).
  const f = 1 - y / r1m;
  const g = A * Math.sqrt(y / mu);
  const gdot = 1 - y / r2m;
  if (!(Math.abs(g) > 0)) fail("the Lambert solution is degenerate for these positions (g = 0)");
  const velocity1 = scale(sub(r2, scale(r1, f)), 1 / g);
  const velocity2 = scale(sub(scale(r2, gdot), r1), 1 / g);
  return { velocity1, velocity2, transferAngle: dth };
}
