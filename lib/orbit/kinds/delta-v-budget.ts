/**
 * `deltaVBudget` with phases (version 2): deterministic and statistical phases, each with
 * its own margin, a specific impulse per manoeuvre or per engine, a residual propellant
 * fraction and an optional loss factor (the proposer's stated assumption for finite burns
 * or low thrust).
 *
 * Method: the rocket equation (Tsiolkovsky) applied manoeuvre by manoeuvre in order, each
 * with its own exhaust velocity ve = Isp·g0, from the wet mass down; a phase's Δv with
 * margin is Σ Δv × (1 + loss factor) × (1 + phase margin).
 */
import { STANDARD_GRAVITY_KM_S2 } from "../constants";
import { fail, fmt } from "../errors";
import { deltaVBudget } from "../rocket";
import type { ComputedValue } from "../schema";
import { result } from "./orbit-shape";
import { fieldNumber, objectArray } from "./shared";
import type { Inputs, KindDef } from "./types";

export const PHASE_TYPES = ["deterministic", "statistical"] as const;
export type PhaseType = (typeof PHASE_TYPES)[number];

export interface PhaseManeuver {
  name: string;
  deltaV: number;
  specificImpulse: number;
}

export interface BudgetPhase {
  name: string;
  type: PhaseType;
  margin: number;
  maneuvers: PhaseManeuver[];
}

export interface PhaseResult {
  name: string;
  type: PhaseType;
  /** Σ Δv × (1 + loss), km/s. */
  deltaV: number;
  margin: number;
  /** deltaV × (1 + margin), km/s. */
  deltaVWithMargin: number;
  propellant: number;
  /** The loaded propellant still covers the budget up to and including this phase, with margins. */
  marginOk: boolean;
  /** Δv the usable propellant left at the start of this phase can still give with the main engine, km/s. */
  deltaVAvailable: number;
}

export interface PhasedBudgetResult {
  phases: PhaseResult[];
  deltaVRequired: number;
  deltaVWithMargins: number;
  deltaVAvailable: number;
  margin: number;
  propellantRequired: number;
  propellantLoaded: number;
  propellantUsable: number;
  propellantRemaining: number;
  closes: boolean;
  closesWithoutStatisticalMargins: boolean;
}

function propellantFor(phases: readonly BudgetPhase[], m0: number, loss: number, dropStatisticalMargins: boolean): { perPhase: number[]; total: number } {
  let m = m0;
  const perPhase: number[] = [];
  for (const ph of phases) {
    const margin = dropStatisticalMargins && ph.type === "statistical" ? 0 : ph.margin;
    let used = 0;
    for (const mv of ph.maneuvers) {
      // Δv with margin = Δv × (1 + loss factor) × (1 + phase margin) (common practice in Δv budgets).
      const dv = mv.deltaV * (1 + loss) * (1 + margin);
      // Rocket equation mp = m(1 − e^(−Δv/(Isp·g0))): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 11, the rocket equation (recalled from memory).
      const mp = m * (1 - Math.exp(-dv / (mv.specificImpulse * STANDARD_GRAVITY_KM_S2)));
      used += mp;
      m -= mp;
    }
    perPhase.push(used);
  }
  return { perPhase, total: m0 - m };
}

export function phasedDeltaVBudget(
  phases: readonly BudgetPhase[],
  mainIsp: number,
  m0: number,
  mf: number,
  residualFraction = 0,
  lossFactor = 0,
): PhasedBudgetResult {
  if (phases.length === 0) fail("given.phases is empty: list each phase with its manoeuvres");
  if (!(mf > 0) || !(m0 > 0)) fail("initialMass and finalMass must be positive");
  if (mf > m0) fail(`finalMass ${fmt(mf)} kg exceeds initialMass ${fmt(m0)} kg`);
  if (!(residualFraction >= 0 && residualFraction < 1)) fail(`given.residualFraction must be a fraction from 0 to below 1 (got ${fmt(residualFraction)})`);
  if (!(lossFactor >= 0 && lossFactor < 1)) fail(`given.lossFactor must be a fraction from 0 to below 1 (got ${fmt(lossFactor)})`);
  const loaded = m0 - mf;
  // Usable propellant: the loaded propellant less the residual (unusable) fraction (common practice in propellant budgets).
  const usable = loaded * (1 - residualFraction);
  const full = propellantFor(phases, m0, lossFactor, false);
  const lean = propellantFor(phases, m0, lossFactor, true);
  let cumulative = 0;
  const results: PhaseResult[] = phases.map((ph, i) => {
    // A phase's Δv = Σ Δv × (1 + loss factor) (common practice in Δv budgets).
    const dv = ph.maneuvers.reduce((s, mv) => s + mv.deltaV, 0) * (1 + lossFactor);
    // Tsiolkovsky Δv = Isp·g0·ln(m_start/m_end) on the usable propellant still aboard when the phase starts: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 11, the rocket equation (recalled from memory).
    const startMass = m0 - cumulative;
    const left = Math.max(0, usable - cumulative);
    const deltaVAvailable = left > 0 && startMass - left > 0 ? mainIsp * STANDARD_GRAVITY_KM_S2 * Math.log(startMass / (startMass - left)) : 0;
    cumulative += full.perPhase[i]!;
    return {
      name: ph.name,
      type: ph.type,
      deltaV: dv,
      margin: ph.margin,
      deltaVWithMargin: dv * (1 + ph.margin),
      propellant: full.perPhase[i]!,
      marginOk: cumulative <= usable * (1 + 1e-12),
      deltaVAvailable,
    };
  });
  const deltaVRequired = results.reduce((s, p) => s + p.deltaV, 0);
  if (!(deltaVRequired > 0)) fail("the phases add up to zero Δv: a margin is undefined");
  const deltaVWithMargins = results.reduce((s, p) => s + p.deltaVWithMargin, 0);
  // Tsiolkovsky Δv = Isp·g0·ln(m0/(m0 − usable)) with the main engine's Isp: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 11, the rocket equation (recalled from memory).
  const deltaVAvailable = mainIsp * STANDARD_GRAVITY_KM_S2 * Math.log(m0 / (m0 - usable));
  return {
    phases: results,
    deltaVRequired,
    deltaVWithMargins,
    deltaVAvailable,
    // Margin as a fraction of the requirement (available − required)/required (common practice).
    margin: (deltaVAvailable - deltaVRequired) / deltaVRequired,
    propellantRequired: full.total,
    propellantLoaded: loaded,
    propellantUsable: usable,
    propellantRemaining: usable - full.total,
    closes: full.total <= usable * (1 + 1e-12),
    closesWithoutStatisticalMargins: lean.total <= usable * (1 + 1e-12),
  };
}

/** Reads `phases` (and the engine impulses) from the given values. */
export function readPhases(g: Inputs, mainIsp: number): BudgetPhase[] {
  const raw = objectArray(
    g,
    "phases",
    '[{ "name": "transfer", "type": "deterministic", "margin": 0.05, "maneuvers": [{ "name": "raise", "deltaV": 0.1 }] }]',
    100,
  );
  const thrusterIsp = g.has("thrusterSpecificImpulse") ? g.num("thrusterSpecificImpulse", "positive") : undefined;
  return raw.map((p, i) => {
    const path = `phases[${i}]`;
    const type = p.type;
    if (type !== "deterministic" && type !== "statistical") fail(`${path}.type must be deterministic or statistical`);
    const margin = p.margin === undefined || p.margin === null ? 0 : fieldNumber(p, path, "margin", "(fraction)", "nonNegative");
    if (margin >= 1) fail(`${path}.margin must be below 1 (100 %); 0.1 means 10 %`);
    const list = p.maneuvers;
    if (!Array.isArray(list) || list.length === 0) fail(`${path}.maneuvers must list at least one manoeuvre { name, deltaV (km/s) }`);
    if (list.length > 200) fail(`${path}.maneuvers has more than 200 entries`);
    const name = typeof p.name === "string" && p.name.trim() ? p.name.slice(0, 120) : `phase ${i + 1}`;
    const maneuvers = list.map((m, j) => {
      const mpath = `${path}.maneuvers[${j}]`;
      if (typeof m !== "object" || m === null || Array.isArray(m)) fail(`${mpath} must be an object { name, deltaV }`);
      const o = m as Record<string, unknown>;
      const deltaV = fieldNumber(o, mpath, "deltaV", "km/s", "nonNegative");
      let isp = mainIsp;
      if (o.specificImpulse !== undefined) isp = fieldNumber(o, mpath, "specificImpulse", "s", "positive");
      else if (o.engine === "thrusters") {
        if (thrusterIsp === undefined) fail(`${mpath} uses the thrusters: give thrusterSpecificImpulse (s)`);
        isp = thrusterIsp;
      } else if (o.engine !== undefined && o.engine !== "main") fail(`${mpath}.engine must be main or thrusters`);
      return { name: typeof o.name === "string" && o.name.trim() ? o.name.slice(0, 120) : `manoeuvre ${j + 1}`, deltaV, specificImpulse: isp };
    });
    return { name, type, margin, maneuvers };
  });
}

/** The computed values of a phased budget (the kind's output). */
export function phasedValues(b: PhasedBudgetResult, requiredMargin: number | undefined): Record<string, ComputedValue> {
  return {
    deltaVRequired: b.deltaVRequired,
    deltaVWithMargins: b.deltaVWithMargins,
    deltaVAvailable: b.deltaVAvailable,
    margin: b.margin,
    marginOk: b.closes && b.phases.every((p) => p.marginOk) && (requiredMargin === undefined || b.margin >= requiredMargin),
    phases: b.phases as unknown as Record<string, string | number | boolean>[],
    phaseDeltaV: b.phases.map((p) => ({ name: p.name, deltaV: p.deltaVWithMargin })),
    phaseDeltaVAvailable: b.phases.map((p) => ({ name: p.name, deltaVAvailable: p.deltaVAvailable })),
    phasePropellant: b.phases.map((p) => ({ name: p.name, propellant: p.propellant })),
    propellantRequired: b.propellantRequired,
    propellantLoaded: b.propellantLoaded,
    propellantUsable: b.propellantUsable,
    propellantRemaining: b.propellantRemaining,
    closes: b.closes,
    closesWithoutStatisticalMargins: b.closesWithoutStatisticalMargins,
  };
}

export const deltaVBudgetKind: KindDef = {
  usesBody: false,
  summary: "Δv budget against the vehicle's rocket-equation capability",
  givenRule:
    "maneuvers [{ name, deltaV (km/s) }] or phases [{ name, type: deterministic or statistical, margin (fraction), maneuvers: [{ name, deltaV, specificImpulse? or engine: main or thrusters }] }], specificImpulse (s, main engine), optional thrusterSpecificImpulse (s), initialMass and finalMass (kg), optional requiredMargin, residualFraction and lossFactor (fractions)",
  given: [
    ["maneuvers", "choice"],
    ["phases", "choice"],
    ["specificImpulse", "required"],
    ["thrusterSpecificImpulse", "optional"],
    ["initialMass", "required"],
    ["finalMass", "required"],
    ["requiredMargin", "optional"],
    ["residualFraction", "optional"],
    ["lossFactor", "optional"],
  ],
  computed: [
    "deltaVRequired",
    "deltaVAvailable",
    "margin",
    "marginOk",
    "deltaVWithMargins",
    "phases",
    "phaseDeltaV",
    "phaseDeltaVAvailable",
    "phasePropellant",
    "propellantRequired",
    "propellantLoaded",
    "propellantUsable",
    "propellantRemaining",
    "closes",
    "closesWithoutStatisticalMargins",
  ],
  evaluate(g, body, options) {
    if (g.has("phases")) {
      if (g.has("maneuvers")) fail("give maneuvers (a single list) or phases, not both");
      const isp = g.num("specificImpulse", "positive");
      const b = phasedDeltaVBudget(
        readPhases(g, isp),
        isp,
        g.num("initialMass", "positive"),
        g.num("finalMass", "positive"),
        g.optNum("residualFraction", "nonNegative") ?? 0,
        g.optNum("lossFactor", "nonNegative") ?? 0,
      );
      const loss = g.optNum("lossFactor");
      return result(phasedValues(b, g.optNum("requiredMargin")), body, {
        messages: loss ? [`a loss factor of ${fmt(loss * 100)} % is the proposer's stated assumption for finite burns or low thrust`] : [],
      });
    }
    if (!g.has("maneuvers")) fail("give maneuvers [{ name, deltaV }] or phases [{ name, type, margin, maneuvers }]");
    const raw = g.value("maneuvers");
    if (!Array.isArray(raw)) fail('given.maneuvers must be an array such as [{ "name": "orbit raising", "deltaV": 0.12 }]');
    if (raw.length > 500) fail("given.maneuvers has more than 500 entries");
    const list = raw.map((m, i) => {
      if (typeof m !== "object" || m === null || Array.isArray(m)) fail(`maneuvers[${i}] must be an object { name, deltaV }`);
      const o = m as Record<string, unknown>;
      if (typeof o.deltaV !== "number" || !Number.isFinite(o.deltaV)) fail(`maneuvers[${i}].deltaV must be a finite number in km/s`);
      const name = typeof o.name === "string" ? o.name : `maneuver ${i + 1}`;
      return { name, deltaV: o.deltaV };
    });
    const req = g.optNum("requiredMargin") ?? 0;
    const b = deltaVBudget(
      list,
      g.num("specificImpulse", "positive"),
      g.num("initialMass", "positive"),
      g.num("finalMass", "positive"),
      req,
      options?.g0 ?? STANDARD_GRAVITY_KM_S2,
    );
    return result({ ...b }, body);
  },
};
