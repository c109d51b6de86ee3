// Orbit-check blocks for the demo dossiers. No figure here is typed by hand: every claimed
// value is the engine's own result for the block's given values, rounded the way a proposer
// writes it. The wrong claims reproduce a real dossier mistake with the engine (a period
// from the altitude instead of the radius, degrees read as radians, propellant sized without
// margin, an inclination for another altitude) and claim that figure. Each block checks its
// own verdict when it is built, so the demo stays honest if the engine changes.
import crypto from "node:crypto";
import { evaluateClaim, type ClaimResult } from "@/lib/orbit";
import type { DossierClaim, DossierNode, WrittenValues } from "@/lib/dossier/schema";

export type Verdict = "consistent" | "inconsistent";

/** The mistakes a demo block may reproduce (the list). */
export type Mistake = "period-from-altitude" | "degrees-as-radians" | "budget-without-margin" | "sso-wrong-altitude";

export interface SeedBlock {
  blockId: string;
  label: string;
  claim: DossierClaim;
  initialFrom: string | null;
  /** What the engine says about this block (checked when the block is built). */
  expected: Verdict;
  mistake: Mistake | null;
  /** Everything the engine computed for the given values (for the prose around the block). */
  computed: Record<string, unknown>;
  /** Values as the proposer typed them, where that says more than the number (a board station's name). */
  written?: WrittenValues;
}

type Given = Record<string, unknown>;
type Body = DossierClaim["body"];

/** Rounds to a number of decimals, as written in a dossier. */
export function rounded(value: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}

/** Everything the engine computes for a kind, body and given values; throws when it cannot. */
export function engine(kind: string, body: Body, given: Given): Record<string, unknown> {
  const result = evaluateClaim({ id: "seed", kind, ...(body === undefined ? {} : { body }), given, claimed: {} });
  if (result.status === "invalid") throw new Error(`demo block ${kind} ${JSON.stringify(given)} cannot be evaluated: ${result.messages.join("; ")}`);
  return result.computed as Record<string, unknown>;
}

function numberOf(values: Record<string, unknown>, quantity: string): number {
  const v = values[quantity];
  if (typeof v !== "number") throw new Error(`the engine gave no number for ${quantity}`);
  return v;
}

/** Claimed values from computed ones: a number of decimals per quantity, or `true` to copy (texts, flags). */
export function claimedFrom(values: Record<string, unknown>, rounding: Record<string, number | true>): Record<string, unknown> {
  return Object.fromEntries(Object.entries(rounding).map(([q, d]) => [q, d === true ? values[q] : rounded(numberOf(values, q), d)]));
}

function check(block: Omit<SeedBlock, "expected" | "mistake" | "computed">, expected: Verdict): ClaimResult {
  const result = evaluateClaim({ id: block.blockId, ...block.claim });
  if (result.status !== expected) {
    throw new Error(
      `demo block "${block.label}" was meant to be ${expected} but the engine says ${result.status}: ${JSON.stringify(result.checks)} ${result.messages.join("; ")}`,
    );
  }
  return result;
}

interface BlockInput {
  label: string;
  kind: string;
  body?: Body;
  given: Given;
  initialFrom?: string | null;
}

/** A block whose claimed values are the engine's, rounded as a proposer writes them. */
export function consistent(input: BlockInput & { claim: Record<string, number | true> }): SeedBlock {
  const computed = engine(input.kind, input.body, input.given);
  const block = {
    blockId: crypto.randomUUID(),
    label: input.label,
    claim: { kind: input.kind, ...(input.body === undefined ? {} : { body: input.body }), given: input.given, claimed: claimedFrom(computed, input.claim) },
    initialFrom: input.initialFrom ?? null,
  };
  check(block, "consistent");
  return { ...block, expected: "consistent", mistake: null, computed };
}

/** A block that claims the figure a mistaken calculation gives (`wrong`), checked to be flagged. */
function mistaken(input: BlockInput, mistake: Mistake, wrong: Record<string, unknown>): SeedBlock {
  const computed = engine(input.kind, input.body, input.given);
  const block = {
    blockId: crypto.randomUUID(),
    label: input.label,
    claim: { kind: input.kind, ...(input.body === undefined ? {} : { body: input.body }), given: input.given, claimed: wrong },
    initialFrom: input.initialFrom ?? null,
  };
  check(block, "inconsistent");
  return { ...block, expected: "inconsistent", mistake, computed };
}

/**
 * The period of a circular orbit worked out with the altitude where the radius belongs:
 * the engine evaluates the same altitude about a body of zero radius (so a = h).
 */
export function periodFromAltitude(input: { label: string; body: string; altitude: number; decimals?: number }): SeedBlock {
  const wrong = engine("orbit", { name: input.body, radius: 0 }, { altitude: input.altitude });
  return mistaken({ label: input.label, kind: "orbit", body: input.body, given: { altitude: input.altitude } }, "period-from-altitude", {
    period: rounded(numberOf(wrong, "period"), input.decimals ?? 1),
  });
}

/**
 * Kepler's equation solved with the mean anomaly in degrees fed to a solver that expects
 * radians: the engine (which reads degrees) is given M·180/π, and the true anomaly it returns
 * is reduced to 0–360° as a calculator would show it.
 */
export function keplerDegreesAsRadians(input: { label: string; eccentricity: number; meanAnomaly: number }): SeedBlock {
  const wrong = engine("kepler", undefined, { eccentricity: input.eccentricity, meanAnomaly: (input.meanAnomaly * 180) / Math.PI });
  const nu = ((numberOf(wrong, "trueAnomaly") % 360) + 360) % 360;
  return mistaken({ label: input.label, kind: "kepler", given: { eccentricity: input.eccentricity, meanAnomaly: input.meanAnomaly } }, "degrees-as-radians", {
    trueAnomaly: rounded(nu, 1),
  });
}

/**
 * A plane change Δv = 2v·sin(Δi/2) where the angle was converted to radians and then fed to
 * a sine in degree mode: the engine (which reads degrees) is given Δi·π/180, the figure that
 * calculation produces — a Δv far too small.
 */
export function planeChangeRadiansAsDegrees(input: { label: string; body: string; angle: number; speed: number }): SeedBlock {
  const wrong = engine("planeChange", input.body, { angle: (input.angle * Math.PI) / 180, speed: input.speed });
  return mistaken({ label: input.label, kind: "planeChange", body: input.body, given: { angle: input.angle, speed: input.speed } }, "degrees-as-radians", {
    deltaV: rounded(numberOf(wrong, "deltaV"), 4),
  });
}

/** The sun-synchronous inclination of an earlier design altitude, claimed for the orbit actually flown. */
export function ssoForWrongAltitude(input: { label: string; altitude: number; designAltitude: number }): SeedBlock {
  const wrong = engine("sunSynchronous", "earth", { altitude: input.designAltitude });
  return mistaken({ label: input.label, kind: "sunSynchronous", body: "earth", given: { altitude: input.altitude } }, "sso-wrong-altitude", {
    inclination: rounded(numberOf(wrong, "inclination"), 2),
  });
}

/** Final (dry) mass, kg, when the propellant delivers exactly `deltaV` (rocket equation from the engine). */
export function finalMassFor(specificImpulse: number, initialMass: number, deltaV: number): number {
  return numberOf(engine("rocket", undefined, { specificImpulse, initialMass, deltaV }), "finalMass");
}

export interface Maneuver {
  name: string;
  deltaV: number;
}

/**
 * A Δv budget whose propellant was sized with `margin` on top of the maneuvers (from the
 * engine's rocket equation), claiming the margin and that it meets `requiredMargin`.
 */
export function budget(input: {
  label: string;
  maneuvers: Maneuver[];
  specificImpulse: number;
  initialMass: number;
  margin: number;
  requiredMargin: number;
}): SeedBlock {
  const required = input.maneuvers.reduce((s, m) => s + m.deltaV, 0);
  const finalMass = rounded(finalMassFor(input.specificImpulse, input.initialMass, required * (1 + input.margin)), 1);
  return consistent({
    label: input.label,
    kind: "deltaVBudget",
    given: {
      maneuvers: input.maneuvers,
      specificImpulse: input.specificImpulse,
      initialMass: input.initialMass,
      finalMass,
      requiredMargin: input.requiredMargin,
    },
    claim: { deltaVRequired: 3, deltaVAvailable: 3, margin: 3, marginOk: true },
  });
}

/**
 * A Δv budget whose propellant covers the maneuvers exactly (the margin was left out when
 * the tanks were sized) while the dossier still claims the margin it meant to carry.
 */
export function budgetWithoutMargin(input: {
  label: string;
  maneuvers: Maneuver[];
  specificImpulse: number;
  initialMass: number;
  claimedMargin: number;
  requiredMargin: number;
}): SeedBlock {
  const required = input.maneuvers.reduce((s, m) => s + m.deltaV, 0);
  const finalMass = rounded(finalMassFor(input.specificImpulse, input.initialMass, required), 1);
  const given = {
    maneuvers: input.maneuvers,
    specificImpulse: input.specificImpulse,
    initialMass: input.initialMass,
    finalMass,
    requiredMargin: input.requiredMargin,
  };
  return mistaken({ label: input.label, kind: "deltaVBudget", given }, "budget-without-margin", {
    deltaVRequired: rounded(required, 3),
    margin: input.claimedMargin,
    marginOk: true,
  });
}

/** The Tiptap node of a block. */
export function blockNode(block: SeedBlock): DossierNode {
  return {
    type: "orbitCheck",
    attrs: {
      blockId: block.blockId,
      label: block.label,
      claim: block.claim,
      initialFrom: block.initialFrom,
      ...(block.written ? { written: block.written } : {}),
    },
  };
}

/** A computed number of a block, for the prose around it. */
export function value(block: SeedBlock, quantity: string): number {
  return numberOf(block.computed, quantity);
}

/** A claimed number of a block (what the dossier's text repeats). */
export function claimed(block: SeedBlock, quantity: string): number {
  return numberOf(block.claim.claimed ?? {}, quantity);
}

/** Formats a number with fixed decimals for prose. */
export function fixed(n: number, decimals: number): string {
  return n.toFixed(decimals);
}
