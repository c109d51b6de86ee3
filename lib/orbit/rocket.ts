/**
 * The rocket equation and Δv budgets. Masses in kg, Δv in km/s, specific impulse in s.
 */
import { STANDARD_GRAVITY_KM_S2 } from "./constants";
import { fail, fmt } from "./errors";

export interface RocketInput {
  specificImpulse: number;
  initialMass?: number;
  finalMass?: number;
  deltaV?: number;
  propellantMass?: number;
  /** Standard gravity, km/s²; the CGPM value unless a hint recomputes with another one. */
  g0?: number;
}

export interface RocketResult {
  deltaV: number;
  initialMass: number;
  finalMass: number;
  propellantMass: number;
  massRatio: number;
}

/** Effective exhaust velocity ve = Isp·g0 (km/s), g0 as defined by the CGPM. */
export function exhaustVelocity(isp: number, g0 = STANDARD_GRAVITY_KM_S2): number {
  // ve = Isp g0.
  return isp * g0;
}

/** Tsiolkovsky rocket equation Δv = Isp·g0·ln(m0/mf). */
export function rocketDeltaV(isp: number, m0: number, mf: number, g0 = STANDARD_GRAVITY_KM_S2): number {
  // Tsiolkovsky rocket equation.
  return exhaustVelocity(isp, g0) * Math.log(m0 / mf);
}

/** Solves the rocket equation from the specific impulse and exactly two of the other four. */
export function solveRocket(input: RocketInput): RocketResult {
  const { specificImpulse: isp, initialMass: m0, finalMass: mf, deltaV: dv, propellantMass: mp } = input;
  if (!(isp > 0)) fail(`specificImpulse must be positive (got ${fmt(isp)} s)`);
  const given = (["initialMass", "finalMass", "deltaV", "propellantMass"] as const).filter((k) => input[k] !== undefined);
  if (given.length !== 2)
    fail(`give exactly two of initialMass, finalMass, deltaV, propellantMass with specificImpulse (got ${given.length}: ${given.join(", ") || "none"})`);
  for (const k of ["initialMass", "finalMass"] as const) {
    const v = input[k];
    if (v !== undefined && !(v > 0)) fail(`${k} must be positive (got ${fmt(v)} kg)`);
  }
  if (dv !== undefined && !(dv >= 0)) fail(`deltaV must be zero or positive (got ${fmt(dv)} km/s)`);
  if (mp !== undefined && !(mp >= 0)) fail(`propellantMass must be zero or positive (got ${fmt(mp)} kg)`);
  const ve = exhaustVelocity(isp, input.g0);
  let initial: number;
  let final: number;
  if (m0 !== undefined && mf !== undefined) {
    if (mf > m0) fail(`finalMass ${fmt(mf)} kg exceeds initialMass ${fmt(m0)} kg`);
    initial = m0;
    final = mf;
  } else if (m0 !== undefined && dv !== undefined) {
    initial = m0;
    // Rocket equation solved for the final mass: mf = m0·e^(−Δv/ve).
    final = m0 * Math.exp(-dv / ve);
  } else if (mf !== undefined && dv !== undefined) {
    final = mf;
    // Rocket equation solved for the initial mass: m0 = mf·e^(Δv/ve).
    initial = mf * Math.exp(dv / ve);
  } else if (m0 !== undefined && mp !== undefined) {
    if (mp > m0) fail(`propellantMass ${fmt(mp)} kg exceeds initialMass ${fmt(m0)} kg`);
    if (mp === m0) fail("propellantMass equals initialMass: nothing would be left (final mass zero)");
    initial = m0;
    final = m0 - mp;
  } else if (mf !== undefined && mp !== undefined) {
    final = mf;
    initial = mf + mp;
  } else {
    // Δv and propellant: m0/mf = R = e^(Δv/ve) and m0 − mf = mp, so mf = mp/(R − 1).
    const R = Math.exp(dv! / ve);
    if (!(R > 1)) fail("with deltaV = 0 the propellant mass cannot fix the vehicle mass; give a mass instead");
    if (mp === 0) fail("with zero propellant the deltaV must be zero; give a mass instead");
    final = mp! / (R - 1);
    initial = final * R;
  }
  if (!Number.isFinite(initial) || !Number.isFinite(final))
    fail("the rocket equation overflows for these inputs (Δv far above what the exhaust velocity allows)");
  // Mass ratio m0/mf and the rocket equation.
  const massRatio = initial / final;
  return { deltaV: ve * Math.log(massRatio), initialMass: initial, finalMass: final, propellantMass: initial - final, massRatio };
}

export interface BudgetResult {
  deltaVRequired: number;
  deltaVAvailable: number;
  margin: number;
  marginOk: boolean;
}

/** A Δv budget: sum of the maneuvers against the rocket-equation capability of the vehicle. */
export function deltaVBudget(
  maneuvers: readonly { name: string; deltaV: number }[],
  isp: number,
  m0: number,
  mf: number,
  requiredMargin = 0,
  g0 = STANDARD_GRAVITY_KM_S2,
): BudgetResult {
  if (maneuvers.length === 0) fail("maneuvers is empty: list each maneuver as { name, deltaV } in km/s");
  if (!(isp > 0)) fail(`specificImpulse must be positive (got ${fmt(isp)} s)`);
  if (!(m0 > 0) || !(mf > 0)) fail("initialMass and finalMass must be positive");
  if (mf > m0) fail(`finalMass ${fmt(mf)} kg exceeds initialMass ${fmt(m0)} kg`);
  let required = 0;
  for (const m of maneuvers) {
    if (!(m.deltaV >= 0)) fail(`maneuver "${m.name}" has a negative or non-finite deltaV (${fmt(m.deltaV)}); Δv entries are magnitudes in km/s`);
    required += m.deltaV;
  }
  if (!(required > 0)) fail("the maneuvers add up to zero Δv: a margin is undefined");
  const available = rocketDeltaV(isp, m0, mf, g0);
  // Margin as a fraction of the requirement (available − required)/required.
  const margin = (available - required) / required;
  return { deltaVRequired: required, deltaVAvailable: available, margin, marginOk: margin >= requiredMargin };
}
