/** Minimal 3-vector helpers; tuples keep the engine free of dependencies. */
export type Vec3 = readonly [number, number, number];

export const dot = (a: Vec3, b: Vec3): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
export const cross = (a: Vec3, b: Vec3): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
export const norm = (a: Vec3): number => Math.hypot(a[0], a[1], a[2]);
export const scale = (a: Vec3, k: number): Vec3 => [a[0] * k, a[1] * k, a[2] * k];
export const add = (a: Vec3, b: Vec3): Vec3 => [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
export const sub = (a: Vec3, b: Vec3): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
export const isVec3 = (x: unknown): x is Vec3 => Array.isArray(x) && x.length === 3 && x.every((c) => typeof c === "number" && Number.isFinite(c));

export const DEG = Math.PI / 180;
export const RAD = 180 / Math.PI;
export const TWO_PI = 2 * Math.PI;

/** Wraps an angle in radians to [0, 2π). */
export function wrapTwoPi(x: number): number {
  const y = x % TWO_PI;
  return y < 0 ? y + TWO_PI : y;
}
/** Wraps an angle in degrees to (-180, 180]. */
export function wrapDeg180(x: number): number {
  let y = x % 360;
  if (y > 180) y -= 360;
  if (y <= -180) y += 360;
  return y;
}
