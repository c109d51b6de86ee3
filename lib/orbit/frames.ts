/**
 * Earth-centred inertial frames of orbit files: TEME (element sets), true and mean of date,
 * and EME2000 (J2000; GCRF differs from it by the frame bias, under 0.03″, neglected here).
 * The chain TEME → true of date → mean of date → J2000 follows the IAU-76/FK5 reduction:
 * IAU 1976 precession, IAU 1980 nutation and the 1982 equation of the equinoxes
 * (Vallado, Fundamentals of Astrodynamics and Applications, 4th ed., §3.7; Vallado, Crawford,
 * Hujsak, Kelso, "Revisiting Spacetrack Report #3", AIAA 2006-6753, appendix C).
 *
 * Simplification, with its error: the nutation uses the four leading terms of the IAU 1980
 * series (Meeus, Astronomical Algorithms 2nd ed., ch. 22, "accuracy 0.5″ in Δψ, 0.1″ in Δε")
 * instead of its 106 terms, and no EOP corrections (δΔψ, δΔε). The rotation is then good to
 * about 0.5″ (2.5 µrad): under 20 m at 7000 km, 0.0002° in inclination. Velocities are rotated
 * with the same matrix (the frames' own rotation rates, about 1e-11 rad/s, are neglected).
 * Screening estimates, not flight-qualified analysis.
 */
import { julianCenturiesTT } from "./time-scales";

export type Vec3 = readonly [number, number, number];
export type Mat3 = readonly [Vec3, Vec3, Vec3];

const ARCSEC = Math.PI / (180 * 3600);
const DEG = Math.PI / 180;

// Passive (frame) rotations about x and z and y (Vallado, Fundamentals 4th ed., eq. 3-15).
function rot1(a: number): Mat3 {
  const c = Math.cos(a);
  const s = Math.sin(a);
  return [
    [1, 0, 0],
    [0, c, s],
    [0, -s, c],
  ];
}
function rot2(a: number): Mat3 {
  const c = Math.cos(a);
  const s = Math.sin(a);
  return [
    [c, 0, -s],
    [0, 1, 0],
    [s, 0, c],
  ];
}
function rot3(a: number): Mat3 {
  const c = Math.cos(a);
  const s = Math.sin(a);
  return [
    [c, s, 0],
    [-s, c, 0],
    [0, 0, 1],
  ];
}

function mul(a: Mat3, b: Mat3): Mat3 {
  const row = (i: number): Vec3 => [0, 1, 2].map((j) => a[i]![0] * b[0]![j]! + a[i]![1] * b[1]![j]! + a[i]![2] * b[2]![j]!) as unknown as Vec3;
  return [row(0), row(1), row(2)];
}

export function transpose(m: Mat3): Mat3 {
  return [
    [m[0][0], m[1][0], m[2][0]],
    [m[0][1], m[1][1], m[2][1]],
    [m[0][2], m[1][2], m[2][2]],
  ];
}

export function apply(m: Mat3, v: Vec3): [number, number, number] {
  return [m[0][0] * v[0] + m[0][1] * v[1] + m[0][2] * v[2], m[1][0] * v[0] + m[1][1] * v[1] + m[1][2] * v[2], m[2][0] * v[0] + m[2][1] * v[1] + m[2][2] * v[2]];
}

/** IAU 1976 precession angles ζ, θ, z (rad) from J2000.0 to the epoch, T in Julian centuries of TT. */
export function precessionAngles(T: number): { zeta: number; theta: number; z: number } {
  // Lieske et al. 1977 (IAU 1976 precession); Vallado, Fundamentals 4th ed., eq. 3-88; Meeus eq. 21.2 with T₀ = J2000.
  const zeta = (2306.2181 * T + 0.30188 * T * T + 0.017998 * T * T * T) * ARCSEC;
  // Same sources as ζ.
  const theta = (2004.3109 * T - 0.42665 * T * T - 0.041833 * T * T * T) * ARCSEC;
  // Same sources as ζ.
  const z = (2306.2181 * T + 1.09468 * T * T + 0.018203 * T * T * T) * ARCSEC;
  return { zeta, theta, z };
}

/** Mean obliquity of the ecliptic (rad), IAU 1980. */
export function meanObliquity(T: number): number {
  // ε̄ = 84381.448″ − 46.8150″T − 0.00059″T² + 0.001813″T³ (IAU 1980; Vallado, Fundamentals 4th ed., eq. 3-81; Meeus eq. 22.2).
  return (84_381.448 - 46.815 * T - 0.00059 * T * T + 0.001813 * T * T * T) * ARCSEC;
}

/** Nutation in longitude and obliquity (rad): the four leading IAU 1980 terms (accuracy 0.5″ and 0.1″). */
export function nutationLowPrecision(T: number): { dPsi: number; dEps: number } {
  // Longitude of the Moon's ascending node Ω = 125.04452° − 1934.136261°T (Meeus, ch. 22).
  const omega = (125.04452 - 1934.136261 * T) * DEG;
  // Mean longitudes of the Sun L = 280.4665° + 36000.7698°T and of the Moon L′ = 218.3165° + 481267.8813°T (Meeus, ch. 22).
  const L = (280.4665 + 36_000.7698 * T) * DEG;
  const Lm = (218.3165 + 481_267.8813 * T) * DEG;
  // Δψ = −17.20″ sin Ω − 1.32″ sin 2L − 0.23″ sin 2L′ + 0.21″ sin 2Ω (Meeus, ch. 22, low-accuracy form of the IAU 1980 theory).
  const dPsi = (-17.2 * Math.sin(omega) - 1.32 * Math.sin(2 * L) - 0.23 * Math.sin(2 * Lm) + 0.21 * Math.sin(2 * omega)) * ARCSEC;
  // Δε = 9.20″ cos Ω + 0.57″ cos 2L + 0.10″ cos 2L′ − 0.09″ cos 2Ω (same source).
  const dEps = (9.2 * Math.cos(omega) + 0.57 * Math.cos(2 * L) + 0.1 * Math.cos(2 * Lm) - 0.09 * Math.cos(2 * omega)) * ARCSEC;
  return { dPsi, dEps };
}

export interface FrameAngles {
  /** Julian centuries of TT since J2000.0. */
  T: number;
  zeta: number;
  theta: number;
  z: number;
  meanObliquity: number;
  dPsi: number;
  dEps: number;
  /** Equation of the equinoxes (rad). */
  equationOfEquinoxes: number;
}

export function frameAngles(T: number): FrameAngles {
  const p = precessionAngles(T);
  const eps = meanObliquity(T);
  const n = nutationLowPrecision(T);
  // Equation of the equinoxes, 1982 form without the 1997 Ω terms, as TEME is defined: Eq = Δψ cos ε̄ (Vallado et al. 2006, AIAA 2006-6753, eq. C-1; Vallado, Fundamentals 4th ed., eq. 3-79).
  const equationOfEquinoxes = n.dPsi * Math.cos(eps);
  return { T, ...p, meanObliquity: eps, ...n, equationOfEquinoxes };
}

/**
 * The matrix taking TEME components to J2000 (EME2000) components at an epoch given in
 * Julian centuries of TT: r_J2000 = Pᵀ Nᵀ R3(−Eq) r_TEME.
 */
export function temeToJ2000Matrix(T: number): Mat3 {
  const a = frameAngles(T);
  // TEME → true of date: r_TOD = R3(−Eq) r_TEME (Vallado et al. 2006, AIAA 2006-6753, eq. C-2).
  const temeToTod = rot3(-a.equationOfEquinoxes);
  // Mean of date → true of date: N = R1(−ε) R3(−Δψ) R1(ε̄), ε = ε̄ + Δε (Vallado, Fundamentals 4th ed., eq. 3-86).
  const nutation = mul(mul(rot1(-(a.meanObliquity + a.dEps)), rot3(-a.dPsi)), rot1(a.meanObliquity));
  // J2000 → mean of date: P = R3(−z) R2(θ) R3(−ζ) (Vallado, Fundamentals 4th ed., eq. 3-89; Meeus eq. 21.4).
  const precession = mul(mul(rot3(-a.z), rot2(a.theta)), rot3(-a.zeta));
  return mul(transpose(precession), mul(transpose(nutation), temeToTod));
}

export type FrameName = "TEME" | "EME2000";

/** EME2000, J2000 and GCRF (frame bias neglected) are one frame here; TEME the element sets'. */
export function inertialFrame(name: string): FrameName | null {
  const n = name.trim().toUpperCase();
  if (n === "TEME") return "TEME";
  if (n === "EME2000" || n === "J2000" || n === "GCRF" || n === "ICRF") return "EME2000";
  return null;
}

export type FrameConversion = { ok: true; r: [number, number, number]; v: [number, number, number]; matrix: Mat3 } | { ok: false; message: string };

/** A state (km, km/s) at a UTC epoch from one frame to another; the epoch sets precession and nutation. */
export function convertState(r: Vec3, v: Vec3, from: string, to: FrameName, utcMs: number): FrameConversion {
  const f = inertialFrame(from);
  if (!f) return { ok: false, message: `the frame ${from} is not one this product converts (TEME, EME2000, J2000, GCRF)` };
  if (f === to) return { ok: true, r: [...r] as [number, number, number], v: [...v] as [number, number, number], matrix: rot3(0) };
  const T = julianCenturiesTT(utcMs);
  if (T === null) return { ok: false, message: "the epoch is before 1972-01-01, where this product has no TT from UTC" };
  const m = f === "TEME" ? temeToJ2000Matrix(T) : transpose(temeToJ2000Matrix(T));
  return { ok: true, r: apply(m, r), v: apply(m, v), matrix: m };
}

/** Inclination and RAAN (deg) of an orbit plane after a rotation of its frame: the angular-momentum direction rotated. */
export function rotatePlane(m: Mat3, inclinationDeg: number, raanDeg: number): { inclinationDeg: number; raanDeg: number } {
  const i = inclinationDeg * DEG;
  const O = raanDeg * DEG;
  // Orbit normal ĥ = (sin i sin Ω, −sin i cos Ω, cos i) (Vallado, Fundamentals 4th ed., §2.5, from the definitions of i and Ω).
  const h = apply(m, [Math.sin(i) * Math.sin(O), -Math.sin(i) * Math.cos(O), Math.cos(i)]);
  const inc = Math.acos(Math.max(-1, Math.min(1, h[2])));
  const raan = Math.atan2(h[0], -h[1]);
  return { inclinationDeg: inc / DEG, raanDeg: (((raan / DEG) % 360) + 360) % 360 };
}
