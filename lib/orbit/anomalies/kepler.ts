/**
 * Kepler's equation in its three forms and the anomaly conversions around it.
 * All angles in radians. The elliptic solver is written for speed (no allocation,
 * no closures) because the editor and the bench call it millions of times.
 */
import { fail, fmt } from "../errors";

const PI = Math.PI;
const TWO_PI = 2 * Math.PI;

/** True where typed arrays store doubles little-endian (every current browser and Node platform); else Math.cbrt is used. */
const LITTLE_ENDIAN = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;
const F64 = new Float64Array(1);
const U32 = new Uint32Array(F64.buffer);

// Taylor coefficients of sin and cos about 0, used on [−π/2, π/2]: the first omitted terms
// (x²¹/21!, x²²/22!) are below 3e-16 there.
const S1 = -1 / 6;
const S2 = 1 / 120;
const S3 = -1 / 5040;
const S4 = 1 / 362_880;
const S5 = -1 / 39_916_800;
const S6 = 1 / 6_227_020_800;
const S7 = -1 / 1_307_674_368_000;
const S8 = 1 / 355_687_428_096_000;
const S9 = -1 / 121_645_100_408_832_000;
const C1 = -1 / 2;
const C2 = 1 / 24;
const C3 = -1 / 720;
const C4 = 1 / 40_320;
const C5 = -1 / 3_628_800;
const C6 = 1 / 479_001_600;
const C7 = -1 / 87_178_291_200;
const C8 = 1 / 20_922_789_888_000;
const C9 = -1 / 6_402_373_705_728_000;
const C10 = 1 / 2_432_902_008_176_640_000;
const PI_SQ = PI * PI;
const INV_PI_SQ_MINUS_6 = 1 / (PI_SQ - 6);
const HALF_PI = PI / 2;

/**
 * Solves M = E − e·sin E for E (0 ≤ e < 1). Returns E in the same revolution as M.
 * Markley's method (F. L. Markley, "Kepler equation solver", Celestial Mechanics and
 * Dynamical Astronomy 63 (1995) 101–111): a cubic starter for M reduced to [0, π], then one
 * high-order correction (here the fourth-order step of Danby & Burkardt 1983), with sin and
 * cos of the starter from polynomials instead of library calls. No iteration, no allocation:
 * the editor, the bench and the loops of the coverage kinds call it millions of times. The
 * residual |M − (E − e sin E)| stays at a few 1e-16 rad for e up to 1 − 1e-6 (tests and bench).
 */
export function solveKeplerElliptic(M: number, e: number): number {
  // Reduce to [-π, π] and use the odd symmetry of Kepler's equation.
  let k = 0;
  let m = M;
  if (m > PI || m < -PI) {
    k = Math.round(m / TWO_PI);
    m = m - k * TWO_PI;
  }
  if (m === 0) return k * TWO_PI;
  // The sign without a branch (m / |m|): with M spread over both halves a branch here is
  // mispredicted half the time, which cost about a tenth of the solve.
  const reduced = m;
  m = Math.abs(reduced);
  const sign = reduced / m;
  // Markley (1995) eqs. 20–24: α, d, q, r and the root of the cubic approximation of Kepler's equation.
  const alpha = (3 * PI_SQ + (1.6 * PI * (PI - m)) / (1 + e)) * INV_PI_SQ_MINUS_6;
  const d = 3 * (1 - e) + alpha * e;
  const q = 2 * alpha * d * (1 - e) - m * m;
  const r = 3 * alpha * d * (d - 1 + e) * m + m * m * m;
  const y = Math.abs(r) + Math.sqrt(q * q * q + r * r);
  // w = y^(2/3). The cube root t of y to about 1e-5 relative is enough, since the correction
  // below squares the starter's error twice: fdlibm's seed (s_cbrt.c: high word / 3 +
  // 715094163) and one Halley step t·(t³ + 2y)/(2t³ + y), kept as the fraction wn/wd so that
  // E needs a single division.
  let t: number;
  if (LITTLE_ENDIAN) {
    F64[0] = y;
    U32[1] = ((U32[1]! / 3) | 0) + 715_094_163;
    U32[0] = 0;
    t = F64[0]!;
  } else t = Math.cbrt(y);
  const t3 = t * t * t;
  const halleyUp = t3 + 2 * y;
  const halleyDown = 2 * t3 + y;
  const wn = t * t * halleyUp * halleyUp;
  const wd = halleyDown * halleyDown;
  // E = (2rw/(w² + wq + q²) + m)/d with w = wn/wd: Markley, "Kepler equation solver", Celest. Mech. Dyn. Astron. 63 (1995) 101–111, the starter from the root of the cubic (recalled from memory).
  const den = wn * wn + wn * q * wd + q * q * wd * wd;
  const E = y > 0 && den !== 0 ? (2 * r * wn * wd + m * den) / (den * d) : m / d;
  // sin E = cos x and cos E = −sin x with x = E − π/2 in [−π/2, π/2] (Taylor series in Estrin's form).
  const x = E - HALF_PI;
  const x2 = x * x;
  const x4 = x2 * x2;
  const x8 = x4 * x4;
  const x16 = x8 * x8;
  const sinX = x * (1 + S1 * x2 + x4 * (S2 + S3 * x2) + x8 * (S4 + S5 * x2 + x4 * (S6 + S7 * x2)) + x16 * (S8 + S9 * x2));
  const cosX = 1 + C1 * x2 + x4 * (C2 + C3 * x2) + x8 * (C4 + C5 * x2 + x4 * (C6 + C7 * x2)) + x16 * (C8 + C9 * x2 + x4 * C10);
  const es = e * cosX; // e·sin E
  const ec = -e * sinX; // e·cos E
  // Kepler's equation residual f0 and derivative f1 = 1 − e cos E; Danby & Burkardt's
  // third-order (Halley) step δ3 = n3/d3, then their fourth-order step built on it,
  // δ4 = −f0/(f1 + ½δ3·e sin E + δ3²·e cos E/6), multiplied through by d3² (one division).
  const f0 = E - es - m;
  const f1 = 1 - ec;
  const n3 = -f0 * f1;
  const d3 = f1 * f1 - 0.5 * f0 * es;
  const d4 = (-f0 * d3 * d3) / (f1 * d3 * d3 + 0.5 * n3 * es * d3 + (n3 * n3 * ec) / 6);
  const result = sign * (E + d4) + k * TWO_PI;
  return Number.isFinite(result) ? result : solveKeplerIterative(M, e);
}

/**
 * The previous solver, kept as a safeguard for inputs the closed form cannot take (it never
 * happened in the tests): Danby's starter and the quartic iteration until the step is below 1e-8.
 */
function solveKeplerIterative(M: number, e: number): number {
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
  for (let i = 0; i < 12; i++) {
    const s = e * Math.sin(E);
    const c = e * Math.cos(E);
    // Kepler's equation residual and derivatives (Danby & Burkardt 1983 quartic iteration).
    const f0 = E - s - m;
    const f1 = 1 - c;
    const d1 = -f0 / f1;
    const d2 = -f0 / (f1 + 0.5 * d1 * s);
    const d = -f0 / (f1 + 0.5 * d2 * s + (d2 * d2 * c) / 6);
    E += d;
    if (d < 1e-8 && d > -1e-8) break;
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
  // Hyperbolic Kepler's equation f(H) = e·sinh H − H − M, f(0) = −M < 0: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, hyperbolic trajectories (recalled from memory).
  const f = (h: number) => e * Math.sinh(h) - h - m;
  let lo = 0;
  // Bracket from sinh H ≈ e^H/2 for large H: common practice, not from a publication.
  let hi = Math.max(1, Math.log((2 * m) / e + 1) + 1);
  while (f(hi) <= 0) {
    lo = hi;
    hi *= 2;
    if (hi > 1e3) fail(`hyperbolic mean anomaly ${fmt(M)} is too large to solve in double precision`);
  }
  // Starter H0 = asinh(M/e) (the root when H is small against e·sinh H): common practice, not from a publication.
  let H = Math.asinh(m / e);
  if (!(H > lo && H < hi)) H = 0.5 * (lo + hi);
  for (let i = 0; i < 200; i++) {
    const fv = f(H);
    if (fv > 0) hi = H;
    else lo = H;
    // Newton's step with f'(H) = e·cosh H − 1: Vallado, "Fundamentals of Astrodynamics and Applications" (4th ed.), ch. 2, hyperbolic Kepler's equation algorithm (recalled from memory).
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
  // Barker's equation as the cubic x³ + 3x − 6M_p = 0, x = tan(θ/2), solved by Cardano: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, parabolic trajectories (recalled from memory).
  const w = Math.cbrt(3 * m + Math.sqrt(9 * m * m + 1));
  const x = w - 1 / w;
  return sign * 2 * Math.atan(x);
}

/** Barker's equation forward: parabolic mean anomaly from true anomaly (radians). */
export function parabolicMeanAnomaly(theta: number): number {
  const x = Math.tan(theta / 2);
  // Barker's equation M_p = ½x + ⅙x³, x = tan(θ/2): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, parabolic trajectories (recalled from memory).
  return 0.5 * x + (x * x * x) / 6;
}

/** True anomaly from eccentric anomaly (elliptic), same revolution (half-angle relation). */
export function trueFromEccentric(E: number, e: number): number {
  const k = Math.round(E / TWO_PI);
  const Er = E - k * TWO_PI;
  // tan(θ/2) = √((1+e)/(1−e))·tan(E/2), written with atan2 to stay continuous: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, elliptical orbits (recalled from memory).
  return 2 * Math.atan2(Math.sqrt(1 + e) * Math.sin(Er / 2), Math.sqrt(1 - e) * Math.cos(Er / 2)) + k * TWO_PI;
}

/** Eccentric anomaly from true anomaly (elliptic), same revolution. */
export function eccentricFromTrue(theta: number, e: number): number {
  const k = Math.round(theta / TWO_PI);
  const t = theta - k * TWO_PI;
  // tan(E/2) = √((1−e)/(1+e))·tan(θ/2): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, elliptical orbits (recalled from memory).
  return 2 * Math.atan2(Math.sqrt(1 - e) * Math.sin(t / 2), Math.sqrt(1 + e) * Math.cos(t / 2)) + k * TWO_PI;
}

/** Mean anomaly from eccentric anomaly (Kepler's equation). */
export function meanFromEccentric(E: number, e: number): number {
  // Kepler's equation M = E − e·sin E: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, elliptical orbits (recalled from memory).
  return E - e * Math.sin(E);
}

/** Hyperbolic anomaly from true anomaly; θ must lie inside the asymptotes. */
export function hyperbolicFromTrue(theta: number, e: number): number {
  const limit = Math.acos(-1 / e);
  if (!(Math.abs(theta) < limit))
    fail(`true anomaly ${fmt((theta * 180) / Math.PI)}° lies beyond the asymptote of this hyperbola (±${fmt((limit * 180) / Math.PI)}° for e = ${fmt(e)})`);
  // tanh(H/2) = √((e−1)/(e+1))·tan(θ/2): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, hyperbolic trajectories (recalled from memory).
  return 2 * Math.atanh(Math.sqrt((e - 1) / (e + 1)) * Math.tan(theta / 2));
}

/** True anomaly from hyperbolic anomaly. */
export function trueFromHyperbolic(H: number, e: number): number {
  // tan(θ/2) = √((e+1)/(e−1))·tanh(H/2): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, hyperbolic trajectories (recalled from memory).
  return 2 * Math.atan(Math.sqrt((e + 1) / (e - 1)) * Math.tanh(H / 2));
}

/** Hyperbolic mean anomaly from hyperbolic anomaly. */
export function meanFromHyperbolic(H: number, e: number): number {
  // Hyperbolic Kepler's equation M = e·sinh H − H: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 3, hyperbolic trajectories (recalled from memory).
  return e * Math.sinh(H) - H;
}
