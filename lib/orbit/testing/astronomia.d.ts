// Types for the parts of the `astronomia` reference library the tests and bench use.
declare module "astronomia/kepler" {
  export function kepler1(e: number, m: number, places: number): number;
  export function kepler2(e: number, m: number, places: number): number;
  export function kepler2a(e: number, m: number, places: number): number;
  export function kepler2b(e: number, m: number, places: number): number;
  export function kepler3(e: number, m: number): number;
  export function kepler4(e: number, m: number): number;
  export function trueAnomaly(E: number, e: number): number;
  export function radius(E: number, e: number, a: number): number;
  const kepler: {
    kepler1: typeof kepler1;
    kepler2: typeof kepler2;
    kepler2a: typeof kepler2a;
    kepler2b: typeof kepler2b;
    kepler3: typeof kepler3;
    kepler4: typeof kepler4;
    trueAnomaly: typeof trueAnomaly;
    radius: typeof radius;
  };
  export default kepler;
}

declare module "astronomia/nutation" {
  /** [Δψ, Δε] in radians, IAU 1980 theory (terms under 0.0003″ neglected), for a Julian ephemeris day. */
  export function nutation(jde: number): [number, number];
  export function approxNutation(jde: number): [number, number];
  /** Mean obliquity (rad), IAU 1980 polynomial. */
  export function meanObliquity(jde: number): number;
}

declare module "astronomia/precess" {
  /** Precession from one Julian epoch (years) to another; ζ and z in radians, θ through its sine and cosine. */
  export class Precessor {
    constructor(epochFrom: number, epochTo: number);
    ζ: number;
    z: number;
    sθ: number;
    cθ: number;
  }
}
