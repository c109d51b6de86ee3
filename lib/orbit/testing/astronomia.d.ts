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
