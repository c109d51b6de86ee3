/**
 * Two-body propagation of a state vector with universal variables and Stumpff functions,
 * valid for every conic. χ (km^½) is the universal anomaly.
 */
import { fail, fmt } from "./errors";
import { add, dot, norm, scale, type Vec3 } from "./vector";

/** Stumpff function C(z) = (1 − cos √z)/z, with its series near z = 0. */
export function stumpffC(z: number): number {
  if (z > 1e-3) {
    const s = Math.sqrt(z);
    // C(z) = (1 − cos √z)/z, written as 2 sin²(√z/2)/z to avoid cancellation.
    const h = Math.sin(s / 2);
    return (2 * h * h) / z;
  }
  if (z < -1e-3) {
    const s = Math.sqrt(-z);
    // C(z) = (cosh √−z − 1)/(−z) = 2 sinh²(√−z/2)/(−z).
    const h = Math.sinh(s / 2);
    return (2 * h * h) / -z;
  }
  // Maclaurin series of C(z) = Σ (−z)^k / (2k+2)!.
  return 1 / 2 - z / 24 + (z * z) / 720 - (z * z * z) / 40320 + (z * z * z * z) / 3628800;
}

/** Stumpff function S(z) = (√z − sin √z)/√z³, with its series near z = 0. */
export function stumpffS(z: number): number {
  if (z > 1e-3) {
    const s = Math.sqrt(z);
    // S(z) = (√z − sin √z)/(√z)³.
    return (s - Math.sin(s)) / (s * s * s);
  }
  if (z < -1e-3) {
    const s = Math.sqrt(-z);
    // S(z) = (sinh √−z − √−z)/(√−z)³.
    return (Math.sinh(s) - s) / (s * s * s);
  }
  // Maclaurin series of S(z) = Σ (−z)^k / (2k+3)!.
  return 1 / 6 - z / 120 + (z * z) / 5040 - (z * z * z) / 362880 + (z * z * z * z) / 39916800;
}

/** Universal Kepler equation F(χ) = a1 χ² C + a2 χ³ S + r0 χ − √μ Δt, increasing in χ (F' = r > 0). */
function universalF(x: number, a1: number, a2: number, r0m: number, alpha: number, target: number): number {
  const z = alpha * x * x;
  return a1 * x * x * stumpffC(z) + a2 * x * x * x * stumpffS(z) + r0m * x - target;
}

/**
 * Fallback for nearly rectilinear or extreme cases where the Laguerre iteration stalls:
 * F is monotonic, so bracket the root and bisect (slow but certain).
 */
function solveByBracketing(a1: number, a2: number, r0m: number, alpha: number, target: number): number {
  const F = (x: number) => universalF(x, a1, a2, r0m, alpha, target);
  let lo = 0;
  let hi = target >= 0 ? 1 : -1;
  while (F(hi) * Math.sign(target) < 0) {
    lo = hi;
    hi *= 2;
    if (!Number.isFinite(F(hi)) || Math.abs(hi) > 1e12) fail("the universal Kepler equation did not converge for this state and time");
  }
  if (target < 0) [lo, hi] = [hi, lo];
  for (let i = 0; i < 400 && hi - lo > 1e-15 * Math.max(1, Math.abs(lo)); i++) {
    const mid = 0.5 * (lo + hi);
    if (F(mid) < 0) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

export interface PropagationResult {
  position: Vec3;
  velocity: Vec3;
  /** Universal anomaly reached, km^½. */
  chi: number;
}

/**
 * Propagates (r0, v0) by dt seconds: the universal Kepler equation solved for χ with the
 * Laguerre–Conway iteration (Conway 1986), then the Lagrange f and g coefficients
 * (Bate-Mueller-White ch. 4, Curtis Algorithm 3.4).
 */
export function propagate(r0: Vec3, v0: Vec3, dt: number, mu: number): PropagationResult {
  const r0m = norm(r0);
  if (!(r0m > 0)) fail("position must not be the zero vector");
  if (!Number.isFinite(dt)) fail(`time must be finite (got ${fmt(dt)})`);
  const v0m = norm(v0);
  const sqmu = Math.sqrt(mu);
  const vr0 = dot(r0, v0) / r0m;
  // Reciprocal semi-major axis α = 2/r0 − v0²/μ (vis-viva).
  const alpha = 2 / r0m - (v0m * v0m) / mu;
  let t = dt;
  // Whole revolutions of a closed orbit change nothing: reduce the time to keep χ small.
  if (alpha > 1e-12) {
    const T = (2 * Math.PI) / (sqmu * alpha ** 1.5);
    t = dt - T * Math.round(dt / T);
  }
  if (t === 0) return { position: [...r0] as unknown as Vec3, velocity: [...v0] as unknown as Vec3, chi: 0 };
  const a1 = (r0m * vr0) / sqmu;
  const a2 = 1 - alpha * r0m;
  // Initial guess χ0 = √μ·|α|·Δt (Chobotov / Curtis); a parabola-safe fallback when α ≈ 0.
  let x = Math.abs(alpha) > 1e-12 ? sqmu * Math.abs(alpha) * t : (sqmu * t) / r0m;
  if (alpha < -1e-12) {
    // Vallado's hyperbolic starter.
    const aa = 1 / alpha;
    const s = Math.sign(t);
    const g = Math.log((-2 * mu * alpha * t) / (dot(r0, v0) + s * Math.sqrt(-mu * aa) * (1 - r0m * alpha)));
    // The starter is meant for long times; for short ones the near-linear guess √μ·Δt/r0 is better.
    x = Number.isFinite(g) && g > 0 ? s * Math.sqrt(-aa) * g : (sqmu * t) / r0m;
  }
  const target = sqmu * t;
  const nL = 5;
  let converged = false;
  for (let i = 0; i < 200; i++) {
    const z = alpha * x * x;
    const C = stumpffC(z);
    const S = stumpffS(z);
    // Universal Kepler's equation F(χ) and its first two derivatives.
    const F = a1 * x * x * C + a2 * x * x * x * S + r0m * x - target;
    const dF = a1 * x * (1 - z * S) + a2 * x * x * C + r0m;
    const ddF = a1 * (1 - z * C) + a2 * x * (1 - z * S);
    const disc = Math.sqrt(Math.abs((nL - 1) * (nL - 1) * dF * dF - nL * (nL - 1) * F * ddF));
    const den = dF + (dF >= 0 ? disc : -disc);
    const dx = den !== 0 ? (nL * F) / den : F / dF;
    x -= dx;
    if (!Number.isFinite(x)) break;
    if (Math.abs(dx) <= 1e-13 * Math.max(1, Math.abs(x))) {
      converged = true;
      break;
    }
  }
  if (!converged || !Number.isFinite(x)) x = solveByBracketing(a1, a2, r0m, alpha, target);
  const z = alpha * x * x;
  const C = stumpffC(z);
  const S = stumpffS(z);
  // Lagrange coefficients in universal variables.
  const f = 1 - ((x * x) / r0m) * C;
  const g = t - (x * x * x * S) / sqmu;
  const r = add(scale(r0, f), scale(v0, g));
  const rm = norm(r);
  const fdot = (sqmu / (rm * r0m)) * (alpha * x * x * x * S - x);
  const gdot = 1 - ((x * x) / rm) * C;
  const v = add(scale(r0, fdot), scale(v0, gdot));
  return { position: r, velocity: v, chi: x };
}
