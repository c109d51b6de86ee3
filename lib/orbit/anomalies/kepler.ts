/**
 * Kepler's equation in its three forms and the anomaly conversions around it.
 * All angles in radians. The elliptic solver is written for speed (no allocation,
 * no closures) because the editor and the bench call it millions of times.
 */
import { fail, fmt } from "../errors";

const PI = Math.PI;
const TWO_PI = 2 * Math.PI;

/**
 * Solves M = E − e·sin E for E (0 ≤ e < 1). Returns E in the same revolution as M.
 * Danby's starter E0 = M + 0.85·e reduced to [0, π], refined with the Danby–Burkardt
 * quartic-convergence correction until the step is below 1e-15 rad.
 */
export function solveKeplerElliptic(M: number, e: number): number {
  // Reduce to [-π, π] and use the odd symmetry of Kepler's equation.
  let k = 0;
  let m = M;
  if (m > PI || m < -PI) {
    k = Math.round(m / TWO_PI);
    m = m - k * TWO_PI;
  }
  const sign = m < 0 ? -1 : 1;
  m *= sign;
  // Danby (1987) starter for M in [0, π]; e ≥ 0.8 uses M + 0.85e.
  let E = e < 0.8 ? m + e * Math.sin(m) : m + 0.85 * e;
  if (E > PI) E = PI;
  let sn = Math.sin(E);
  let cs = Math.cos(E);
  for (let i = 0; i < 12; i++) {
    const s = e * sn;
    const c = e * cs;
    // Kepler's equation residual and derivatives (Danby & Burkardt 1983 quartic iteration).
    const f0 = E - s - m;
    const f1 = 1 - c;
    const d1 = -f0 / f1;
    const d2 = -f0 / (f1 + 0.5 * d1 * s);
    const d = -f0 / (f1 + 0.5 * d2 * s + (d2 * d2 * c) / 6);
    E += d;
    // Quartic convergence: once a step is below 1e-8 the next one would be far below 1e-16.
    if (d < 1e-8 && d > -1e-8) break;
    if (d < 1e-2 && d > -1e-2) {
      // Small step: rotate sin/cos by d with the angle-addition formulas and Taylor series of
      // sin d, cos d (truncation below 1e-17), which saves two library calls per iteration.
      const dd = d * d;
      const sd = d * (1 - (dd / 6) * (1 - dd / 20));
      const cd = 1 - (dd / 2) * (1 - (dd / 12) * (1 - dd / 30));
      const ns = sn * cd + cs * sd;
      cs = cs * cd - sn * sd;
      sn = ns;
    } else {
      sn = Math.sin(E);
      cs = Math.cos(E);
    }
  }
  return sign * E + k * TWO_PI;
}

/**
 * Solves M = e·sinh H − H for H (e > 1): safeguarded Newton inside a bracket so that
 * e close to 1 and huge M both converge.
 */
export function solveKeplerHyperbolic(M: number, e: number): number {
  if (!(e > 1)) fail(`hyperbolic Kepler's equation needs e > 1 (got ${fmt(e)})`);
  if (M === 0) return 0;
  const sign = M < 0 ? -1 : 1;
  const m = Math.abs(M);
  // Hyperbolic Kepler's equation f(H) = e·sinh H − H − M; f(0) = −M < 0.
  const f = (h: number) => e * Math.sinh(h) - h - m;
  let lo = 0;
  let hi = Math.max(1, Math.log((2 * m) / e + 1) + 1);
  while (f(hi) <= 0) {
    lo = hi;
    hi *= 2;
    if (hi > 1e3) fail(`hyperbolic mean anomaly ${fmt(M)} is too large to solve in double precision`);
  }
  let H = Math.asinh(m / e);
  if (!(H > lo && H < hi)) H = 0.5 * (lo + hi);
  for (let i = 0; i < 200; i++) {
    const fv = f(H);
    if (fv > 0) hi = H;
    else lo = H;
    const d = fv / (e * Math.cosh(H) - 1);
    let next = H - d;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - H) <= 1e-15 * Math.max(1, Math.abs(H))) {
      H = next;
      break;
    }
    H = next;
  }
  return sign * H;
}

/**
 * Barker's equation M_p = ½·tan(θ/2) + ⅙·tan³(θ/2), solved in closed form (Cardano) for the
 * true anomaly θ (radians), where M_p = μ²·t / h³.
 */
export function solveBarker(Mp: number): number {
  const sign = Mp < 0 ? -1 : 1;
  const m = Math.abs(Mp);
  // Cardano's solution of x³ + 3x − 6M_p = 0, x = tan(θ/2).
  const w = Math.cbrt(3 * m + Math.sqrt(9 * m * m + 1));
  const x = w - 1 / w;
  return sign * 2 * Math.atan(x);
}

/** Barker's equation forward: parabolic mean anomaly from true anomaly (radians). */
export function parabolicMeanAnomaly(theta: number): number {
  const x = Math.tan(theta / 2);
  // Barker's equation.
  return 0.5 * x + (x * x * x) / 6;
}

/** True anomaly from eccentric anomaly (elliptic), same revolution (half-angle relation). */
export function trueFromEccentric(E: number, e: number): number {
  const k = Math.round(E / TWO_PI);
  const Er = E - k * TWO_PI;
  // tan(θ/2) = √((1+e)/(1−e))·tan(E/2), written with atan2 to stay continuous.
  return 2 * Math.atan2(Math.sqrt(1 + e) * Math.sin(Er / 2), Math.sqrt(1 - e) * Math.cos(Er / 2)) + k * TWO_PI;
}

/** Eccentric anomaly from true anomaly (elliptic), same revolution. */
export function eccentricFromTrue(theta: number, e: number): number {
  const k = Math.round(theta / TWO_PI);
  const t = theta - k * TWO_PI;
  // tan(E/2) = √((1−e)/(1+e))·tan(θ/2).
  return 2 * Math.atan2(Math.sqrt(1 - e) * Math.sin(t / 2), Math.sqrt(1 + e) * Math.cos(t / 2)) + k * TWO_PI;
}

/** Mean anomaly from eccentric anomaly (Kepler's equation). */
export function meanFromEccentric(E: number, e: number): number {
  // Kepler's equation M = E − e·sin E.
  return E - e * Math.sin(E);
}

/** Hyperbolic anomaly from true anomaly; θ must lie inside the asymptotes. */
export function hyperbolicFromTrue(theta: number, e: number): number {
  const limit = Math.acos(-1 / e);
  if (!(Math.abs(theta) < limit))
    fail(`true anomaly ${fmt((theta * 180) / Math.PI)}° lies beyond the asymptote of this hyperbola (±${fmt((limit * 180) / Math.PI)}° for e = ${fmt(e)})`);
  // tanh(H/2) = √((e−1)/(e+1))·tan(θ/2).
  return 2 * Math.atanh(Math.sqrt((e - 1) / (e + 1)) * Math.tan(theta / 2));
}

/** True anomaly from hyperbolic anomaly. */
export function trueFromHyperbolic(H: number, e: number): number {
  // tan(θ/2) = √((e+1)/(e−1))·tanh(H/2).
  return 2 * Math.atan(Math.sqrt((e + 1) / (e - 1)) * Math.tanh(H / 2));
}

/** Hyperbolic mean anomaly from hyperbolic anomaly. */
export function meanFromHyperbolic(H: number, e: number): number {
  // Hyperbolic Kepler's equation M = e·sinh H − H.
  return e * Math.sinh(H) - H;
}
