/**
 * repeatGroundTrack: the orbit whose ground track repeats after a whole number of revolutions
 * in a whole number of nodal days, with the first-order J2 secular rates.
 */
import type { Body } from "../constants";
import { fail, fmt } from "../errors";
import { j2SecularRates } from "../j2";
import type { Inputs } from "./types";
import { DEG, evaluation, type CoverageKindDef } from "./coverage-shared";

export const MAX_REPEAT_ITERATIONS = 100;

export interface RepeatSolution {
  semiMajorAxis: number;
  altitude: number;
  nodalPeriod: number;
  trackSpacing: number;
  revolutionsPerDay: number;
  iterations: number;
}

/**
 * Solves R·(ω_body − Ω̇) = D·(Ṁ + ω̇) for the semi-major axis: R revolutions (node to node, each
 * taking 2π/(Ṁ + ω̇)) in D nodal days (each 2π/(ω_body − Ω̇)), with the J2 secular rates of
 * Vallado, Fundamentals of Astrodynamics and Applications, §9.6 and §11 (repeat-groundtrack
 * orbits). Fixed-point iteration on the mean motion, bounded.
 */
export function repeatGroundTrack(body: Body & { j2ReferenceRadius?: number }, revs: number, days: number, i: number, e: number): RepeatSolution {
  const w = body.rotationRate;
  if (!(w > 0)) fail(`${body.name} does not turn prograde (rotation rate ${fmt(w)} rad/s): a repeating ground track is not defined here`);
  const refR = body.j2ReferenceRadius ?? body.radius;
  const ratio = revs / days;
  // Start from the two-body answer n = (R/D)·ω_body, a = (μ/n²)^(1/3) (Kepler's third law): Vallado, "Fundamentals of Astrodynamics and Applications" (4th ed.), ch. 11, repeat-groundtrack orbits (recalled from memory).
  let n = ratio * w;
  let a = Math.cbrt(body.mu / (n * n));
  let iterations = 0;
  for (; iterations < MAX_REPEAT_ITERATIONS; iterations++) {
    if (!(a * (1 - e) > body.radius * 0.5)) break;
    const rates = j2SecularRates(body.mu, refR, body.j2, a, e, i);
    const p = a * (1 - e * e);
    // Ṁ = n[1 + (3/4) J2 (R/p)² √(1 − e²)(3cos²i − 1)] (Vallado §9.6).
    const c = 0.75 * body.j2 * (refR / p) ** 2 * Math.sqrt(1 - e * e) * (3 * Math.cos(i) ** 2 - 1);
    const nodalDayRate = w - rates.raanRate;
    if (!(nodalDayRate > 0)) fail("the node turns faster than the body: no repeating ground track exists for these values");
    // n (1 + c) + ω̇ = (R/D)(ω_body − Ω̇), solved for n with c and the rates of the current a: Vallado, "Fundamentals of Astrodynamics and Applications" (4th ed.), ch. 11, repeat-groundtrack orbits (recalled from memory).
    const next = (ratio * nodalDayRate - rates.argPeriapsisRate) / (1 + c);
    const aNext = Math.cbrt(body.mu / (next * next));
    const done = Math.abs(aNext - a) < 1e-7;
    n = next;
    a = aNext;
    if (done) break;
  }
  if (iterations >= MAX_REPEAT_ITERATIONS) fail(`the repeat-orbit search did not settle in ${MAX_REPEAT_ITERATIONS} iterations; check the values`);
  if (a * (1 - e) < body.radius)
    fail(
      `no orbit repeats ${fmt(revs)} revolutions in ${fmt(days)} day(s) around ${body.name}: it would need a semi-major axis of ${fmt(a)} km, ` +
        `and its periapsis would lie ${fmt(body.radius - a * (1 - e))} km below the surface (radius ${fmt(body.radius)} km); use fewer revolutions per day`,
    );
  const rates = j2SecularRates(body.mu, refR, body.j2, a, e, i);
  const p = a * (1 - e * e);
  const c = 0.75 * body.j2 * (refR / p) ** 2 * Math.sqrt(1 - e * e) * (3 * Math.cos(i) ** 2 - 1);
  // Nodal period T_N = 2π / (Ṁ + ω̇): Vallado, "Fundamentals of Astrodynamics and Applications" (4th ed.), §9.6 and ch. 11 (recalled from memory).
  const nodalPeriod = (2 * Math.PI) / (n * (1 + c) + rates.argPeriapsisRate);
  return {
    semiMajorAxis: a,
    altitude: a - body.radius,
    nodalPeriod,
    // Adjacent tracks of the full cycle divide the equator evenly: 2πR / (revolutions per cycle) (geometry; definition).
    trackSpacing: (2 * Math.PI * body.radius) / revs,
    revolutionsPerDay: ratio,
    iterations,
  };
}

function whole(g: Inputs, name: string, what: string): number {
  const v = g.num(name);
  if (!(v > 0) || !Number.isInteger(v) || v > 100_000) fail(`given.${name} must be a positive whole number of ${what} (got ${fmt(v)})`);
  return v;
}

function gcd(x: number, y: number): number {
  return y === 0 ? x : gcd(y, x % y);
}

export const repeatGroundTrackKind: CoverageKindDef = {
  summary: "semi-major axis, altitude and track spacing of an orbit whose ground track repeats, with J2",
  givenRule: "revolutionsPerCycle and daysPerCycle (nodal days, whole numbers), inclination (deg), optional eccentricity",
  given: [
    ["revolutionsPerCycle", "required"],
    ["daysPerCycle", "required"],
    ["inclination", "required"],
    ["eccentricity", "optional"],
  ],
  computed: ["semiMajorAxis", "altitude", "nodalPeriod", "trackSpacing", "revolutionsPerDay"],
  evaluate(g, body) {
    const revs = whole(g, "revolutionsPerCycle", "revolutions");
    const days = whole(g, "daysPerCycle", "days");
    const inc = g.num("inclination");
    if (!(inc >= 0 && inc <= 180)) fail(`given.inclination must be between 0 and 180° (got ${fmt(inc)}°)`);
    const e = g.optNum("eccentricity", "nonNegative") ?? 0;
    if (!(e < 0.9)) fail(`given.eccentricity must be below 0.9 for a repeating track (got ${fmt(e)})`);
    const s = repeatGroundTrack(body, revs, days, inc * DEG, e);
    const messages: string[] = [];
    const k = gcd(revs, days);
    if (k > 1) messages.push(`${revs} revolutions in ${days} days repeat already after ${revs / k} revolutions in ${days / k} day(s)`);
    if (e > 0) messages.push("altitude is the semi-major axis minus the equatorial radius (a mean altitude)");
    const { semiMajorAxis, altitude, nodalPeriod, trackSpacing, revolutionsPerDay } = s;
    const p = semiMajorAxis * (1 - e * e);
    return evaluation({ semiMajorAxis, altitude, nodalPeriod, trackSpacing, revolutionsPerDay }, body, {
      messages,
      conics: [{ label: "orbit", p, e, periapsisRadius: semiMajorAxis * (1 - e), apoapsisRadius: semiMajorAxis * (1 + e), argPeriapsis: 0 }],
    });
  },
};
