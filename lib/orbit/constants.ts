/**
 * The engine's constants: one table, each value with its published source beside it.
 * A request may override any body constant per claim (see schema.ts), which is how a
 * check reproduces a handbook example with that handbook's own rounded constants.
 *
 * Values marked "recalled from memory" were transcribed without the document at hand;
 * they are given to the precision we are confident of and are screening-grade.
 */

export type BodyName = "sun" | "mercury" | "venus" | "earth" | "moon" | "mars" | "jupiter" | "saturn" | "uranus" | "neptune";

export const BODY_NAMES: readonly BodyName[] = ["sun", "mercury", "venus", "earth", "moon", "mars", "jupiter", "saturn", "uranus", "neptune"];

/** A sourced constant. */
export interface Sourced {
  readonly value: number;
  readonly source: string;
}

export interface BodyConstants {
  readonly name: BodyName;
  /** Gravitational parameter GM, km³/s². */
  readonly mu: Sourced;
  /** Equatorial radius, km. */
  readonly radius: Sourced;
  /** Second zonal harmonic J2 (unnormalized), dimensionless. */
  readonly j2: Sourced;
  /** The reference radius J2 was published with, km (J2 formulas use it, not the equatorial radius). */
  readonly j2ReferenceRadius: Sourced;
  /** The body's year: its tropical orbital period about the sun, days (none for the sun and the moon). */
  readonly year?: Sourced;
  /** Sidereal rotation rate, rad/s (negative = retrograde rotation). */
  readonly rotationRate: Sourced;
  /** Mean orbit radius about the parent, km (semi-major axis of the mean orbit). */
  readonly orbitRadius?: Sourced;
  /** The body it orbits, for spheres of influence. */
  readonly parent?: BodyName;
}

/** Astronomical unit, km — IAU 2012 Resolution B2 (exact by definition). */
export const AU_KM = 149_597_870.7;
/** Standard acceleration of gravity g0, km/s² — 3rd CGPM (1901), 9.80665 m/s² exactly. */
export const STANDARD_GRAVITY_KM_S2 = 9.80665e-3;
/** Seconds per day (SI day of 86 400 s, as used for deg/day rates). */
export const SECONDS_PER_DAY = 86_400;
/** Mean tropical year, days — Astronomical Almanac value 365.24219 d (recalled from memory). */
export const TROPICAL_YEAR_DAYS = 365.242_19;
/** Rate of the mean sun, deg/day: 360° per mean tropical year (the sun-synchronous nodal rate). */
export const MEAN_SUN_RATE_DEG_PER_DAY = 360 / TROPICAL_YEAR_DAYS;

const JPL_GM = "JPL Solar System Dynamics, planetary GM values (DE440), recalled from memory";
const WGCCRE = "IAU WGCCRE 2015 report on cartographic coordinates and rotational elements (Archinal et al. 2018), recalled from memory";
const STANDISH =
  "Standish, JPL 'Keplerian Elements for Approximate Positions of the Major Planets', Table 1 (1800–2050 AD), semi-major axis in au × IAU 2012 au, recalled from memory";
const J2_RECALLED = "published spacecraft gravity-field solution, recalled from memory (screening precision)";

const FACT_SHEET_YEAR = "NASA GSFC Planetary Fact Sheet, tropical orbit period (days), recalled from memory";

const day = (d: number) => (2 * Math.PI) / (d * SECONDS_PER_DAY);
const hour = (h: number) => (2 * Math.PI) / (h * 3600);
const au = (x: number) => x * AU_KM;

/** The default constants table. */
export const BODIES: Readonly<Record<BodyName, BodyConstants>> = {
  sun: {
    name: "sun",
    mu: { value: 1.327_124_4e11, source: "IAU 2015 Resolution B3, nominal solar mass parameter GM☉ = 1.3271244e20 m³/s²" },
    radius: { value: 695_700, source: "IAU 2015 Resolution B3, nominal solar radius R☉ = 695 700 km" },
    j2: { value: 2.2e-7, source: "helioseismic estimate of the solar quadrupole moment, recalled from memory (order of magnitude)" },
    j2ReferenceRadius: { value: 695_700, source: "same radius as the quadrupole estimate is quoted against (nominal solar radius), recalled from memory" },
    rotationRate: { value: day(25.38), source: "Carrington sidereal rotation period 25.38 d, recalled from memory" },
  },
  mercury: {
    name: "mercury",
    mu: { value: 22_031.868_55, source: JPL_GM },
    radius: { value: 2_440.53, source: WGCCRE },
    j2: { value: 5.03e-5, source: J2_RECALLED },
    j2ReferenceRadius: { value: 2_440, source: "MESSENGER gravity field (HgM series) reference radius 2440 km, recalled from memory" },
    year: { value: 87.968, source: FACT_SHEET_YEAR },
    rotationRate: { value: day(58.6462), source: WGCCRE },
    orbitRadius: { value: au(0.387_099_27), source: STANDISH },
    parent: "sun",
  },
  venus: {
    name: "venus",
    mu: { value: 324_858.592, source: JPL_GM },
    radius: { value: 6_051.8, source: WGCCRE },
    j2: { value: 4.458e-6, source: J2_RECALLED },
    j2ReferenceRadius: { value: 6_051, source: "Magellan gravity field MGNP180U reference radius 6051 km, recalled from memory" },
    year: { value: 224.695, source: FACT_SHEET_YEAR },
    rotationRate: { value: -day(243.018), source: WGCCRE },
    orbitRadius: { value: au(0.723_335_66), source: STANDISH },
    parent: "sun",
  },
  earth: {
    name: "earth",
    mu: { value: 398_600.4418, source: "WGS-84 / EGM96 geocentric gravitational constant GM = 3.986004418e14 m³/s²" },
    radius: { value: 6_378.137, source: "WGS-84 semi-major axis (equatorial radius) a = 6 378 137 m" },
    j2: { value: 1.082_626_68e-3, source: "EGM96, J2 = -√5·C̄20 with C̄20 = -4.84165371736e-4 (recalled from memory)" },
    j2ReferenceRadius: { value: 6_378.136_3, source: "EGM96 reference radius a = 6 378 136.3 m (recalled from memory)" },
    year: { value: TROPICAL_YEAR_DAYS, source: "mean tropical year 365.24219 d, Astronomical Almanac, recalled from memory" },
    rotationRate: { value: 7.292_115e-5, source: "WGS-84 nominal mean angular velocity ω = 7.292115e-5 rad/s" },
    orbitRadius: { value: au(1.000_002_61), source: STANDISH },
    parent: "sun",
  },
  moon: {
    name: "moon",
    mu: { value: 4_902.800_066, source: "JPL DE430 lunar GM, recalled from memory" },
    radius: { value: 1_737.4, source: WGCCRE },
    j2: { value: 2.033e-4, source: J2_RECALLED },
    j2ReferenceRadius: { value: 1_738, source: "lunar gravity fields LP150Q / GRAIL reference radius 1738 km, recalled from memory" },
    rotationRate: { value: day(27.321_661), source: "sidereal month 27.321661 d (synchronous rotation), recalled from memory" },
    orbitRadius: { value: 384_400, source: "NASA GSFC Moon fact sheet, semi-major axis 384 400 km, recalled from memory" },
    parent: "earth",
  },
  mars: {
    name: "mars",
    mu: { value: 42_828.375_214, source: JPL_GM },
    radius: { value: 3_396.19, source: WGCCRE },
    j2: { value: 1.960_45e-3, source: J2_RECALLED },
    j2ReferenceRadius: {
      value: 3_397,
      source: "Mars gravity field (Mars50c / GMM-1 era) reference radius 3397 km that the J2 1.96045e-3 is quoted with, recalled from memory",
    },
    year: { value: 686.973, source: FACT_SHEET_YEAR },
    rotationRate: { value: hour(24.622_962), source: WGCCRE },
    orbitRadius: { value: au(1.523_710_34), source: STANDISH },
    parent: "sun",
  },
  jupiter: {
    name: "jupiter",
    mu: { value: 126_712_764.1, source: JPL_GM + " (system value)" },
    radius: { value: 71_492, source: "IAU 2015 Resolution B3, nominal Jovian equatorial radius 71 492 km" },
    j2: { value: 1.4696e-2, source: J2_RECALLED },
    j2ReferenceRadius: { value: 71_492, source: "Juno gravity solution reference radius 71 492 km, recalled from memory" },
    year: { value: 4_330.595, source: FACT_SHEET_YEAR },
    rotationRate: { value: hour(9.925), source: WGCCRE + " (System III)" },
    orbitRadius: { value: au(5.202_887), source: STANDISH },
    parent: "sun",
  },
  saturn: {
    name: "saturn",
    mu: { value: 37_940_584.841_8, source: JPL_GM + " (system value)" },
    radius: { value: 60_268, source: WGCCRE },
    j2: { value: 1.629e-2, source: J2_RECALLED },
    j2ReferenceRadius: { value: 60_330, source: "Cassini gravity solution reference radius 60 330 km, recalled from memory" },
    year: { value: 10_746.94, source: FACT_SHEET_YEAR },
    rotationRate: { value: hour(10.656), source: WGCCRE },
    orbitRadius: { value: au(9.536_675_94), source: STANDISH },
    parent: "sun",
  },
  uranus: {
    name: "uranus",
    mu: { value: 5_794_556.4, source: JPL_GM + " (system value)" },
    radius: { value: 25_559, source: WGCCRE },
    j2: { value: 3.5107e-3, source: J2_RECALLED },
    j2ReferenceRadius: { value: 25_559, source: "Jacobson (2014) Uranus gravity reference radius 25 559 km, recalled from memory" },
    year: { value: 30_588.74, source: FACT_SHEET_YEAR },
    rotationRate: { value: -hour(17.24), source: WGCCRE },
    orbitRadius: { value: au(19.189_164_64), source: STANDISH },
    parent: "sun",
  },
  neptune: {
    name: "neptune",
    mu: { value: 6_836_527.100_58, source: JPL_GM + " (system value)" },
    radius: { value: 24_764, source: WGCCRE },
    j2: { value: 3.4e-3, source: J2_RECALLED },
    j2ReferenceRadius: { value: 25_225, source: "Jacobson (2009) Neptune gravity reference radius 25 225 km, recalled from memory" },
    year: { value: 59_799.9, source: FACT_SHEET_YEAR },
    rotationRate: { value: hour(16.11), source: WGCCRE },
    orbitRadius: { value: au(30.069_922_76), source: STANDISH },
    parent: "sun",
  },
};

/** The constants one claim works with after overrides are applied (plain numbers). */
export interface Body {
  name: string;
  mu: number;
  radius: number;
  j2: number;
  /** Reference radius of j2, km. */
  j2ReferenceRadius: number;
  rotationRate: number;
  /** Tropical orbital period about the sun, days; undefined when the body has none. */
  year?: number;
  /** Mean orbit radius about the parent, km; undefined for the sun. */
  orbitRadius?: number;
  /** GM of the parent body, km³/s² (used for spheres of influence). */
  parentMu?: number;
  parentName?: string;
}

export function isBodyName(x: unknown): x is BodyName {
  return typeof x === "string" && (BODY_NAMES as readonly string[]).includes(x);
}

/** The default constants of a named body as plain numbers. */
export function defaultBody(name: BodyName): Body {
  const b = BODIES[name];
  const parent = b.parent ? BODIES[b.parent] : undefined;
  return {
    name: b.name,
    mu: b.mu.value,
    radius: b.radius.value,
    j2: b.j2.value,
    j2ReferenceRadius: b.j2ReferenceRadius.value,
    rotationRate: b.rotationRate.value,
    year: b.year?.value,
    orbitRadius: b.orbitRadius?.value,
    parentMu: parent?.mu.value,
    parentName: parent?.name,
  };
}
