/**
 * Patched-conic interplanetary Hohmann transfers, synodic periods and spheres of influence.
 */
import { fail, fmt } from "./errors";
import { departure } from "./escape";
import { hohmann } from "./maneuvers";

export interface PlanetLeg {
  name: string;
  mu: number;
  radius: number;
  orbitRadius: number;
}

export interface InterplanetaryResult {
  transferTime: number;
  transferSemiMajorAxis: number;
  departureExcessSpeed: number;
  departureDeltaV: number;
  arrivalExcessSpeed: number;
  arrivalDeltaV?: number;
  synodicPeriod: number;
}

/** Synodic period of two bodies on circular orbits about the same centre: 1/|1/T1 − 1/T2|. */
export function synodicPeriod(muCentral: number, r1: number, r2: number): number {
  if (r1 === r2) fail("the two orbits have the same radius: the synodic period is infinite");
  // Mean motions n = √(μ/r³); synodic period 2π/|n1 − n2|.
  const n1 = Math.sqrt(muCentral / r1 ** 3);
  const n2 = Math.sqrt(muCentral / r2 ** 3);
  return (2 * Math.PI) / Math.abs(n1 - n2);
}

/**
 * Patched-conic Hohmann transfer between the circular coplanar orbits of two planets
 * (method of patched conics, Bate-Mueller-White ch. 8 / Curtis ch. 8).
 */
export function interplanetaryHohmann(
  muCentral: number,
  from: PlanetLeg,
  to: PlanetLeg,
  departureAltitude: number,
  arrivalAltitude?: number,
): InterplanetaryResult {
  if (from.orbitRadius === to.orbitRadius) fail(`${from.name} and ${to.name} have the same orbit radius; there is no Hohmann transfer between them`);
  const t = hohmann(muCentral, from.orbitRadius, to.orbitRadius);
  // Hyperbolic excess speeds are the heliocentric Δv of the Hohmann transfer at each end.
  const vInfDep = t.deltaV1;
  const vInfArr = t.deltaV2;
  const dep = departure(from.mu, from.radius + departureAltitude, vInfDep);
  let arrivalDeltaV: number | undefined;
  if (arrivalAltitude !== undefined) {
    // Capture into a circular orbit: periapsis speed of the arrival hyperbola minus circular speed.
    arrivalDeltaV = departure(to.mu, to.radius + arrivalAltitude, vInfArr).deltaV;
  }
  return {
    transferTime: t.transferTime,
    transferSemiMajorAxis: t.transferSemiMajorAxis,
    departureExcessSpeed: vInfDep,
    departureDeltaV: dep.deltaV,
    arrivalExcessSpeed: vInfArr,
    arrivalDeltaV,
    synodicPeriod: synodicPeriod(muCentral, from.orbitRadius, to.orbitRadius),
  };
}

/** Laplace's sphere of influence r = a·(m/M)^(2/5). */
export function sphereOfInfluence(orbitRadius: number, mu: number, parentMu: number): number {
  if (!(orbitRadius > 0 && mu > 0 && parentMu > 0)) fail(`sphere of influence needs positive orbit radius and GM values (got a = ${fmt(orbitRadius)} km)`);
  // Laplace's sphere of influence.
  return orbitRadius * (mu / parentMu) ** 0.4;
}
