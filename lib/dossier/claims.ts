/**
 * Orbit-check blocks of a dossier: extraction, references between blocks ("the parking
 * orbit" feeding a transfer), evaluation with the engine, the Δv budget and the submission
 * readiness rules. Pure: runs in the editor (live) and on the server (at submission).
 */
import { CONTRACT_VERSION, evaluateClaim, quantityInfo, type ClaimResult } from "@/lib/orbit";
import { kindLabel, quantityName } from "@/lib/orbit/labels";
import { convertWritten } from "./units";

/** The orbit-check contract version whose rules the engine applies (docs/contracts/orbit-checks.md). */
export const ORBIT_CHECK_CONTRACT_VERSION = CONTRACT_VERSION;

/** The tolerance policy of a call (contract units). */
export interface ToleranceInput {
  relative?: number;
  absolute?: Record<string, number>;
}
import { sanitizeDossier } from "./sanitize";
import type { DossierClaim, DossierNode, WrittenValues } from "./schema";

export interface OrbitCheckBlock {
  blockId: string;
  label: string;
  claim: DossierClaim;
  initialFrom?: string | null;
  /** The orbit file the block was made from, when it was. */
  source?: { attachmentId: string; sha256: string; filename: string; index: number } | null;
  /** Values as typed, with their units (blocks stored before units were offered have none). */
  written?: WrittenValues | null;
}

/** Every orbit-check block in document order. */
export function extractOrbitChecks(doc: unknown): OrbitCheckBlock[] {
  const { doc: clean } = sanitizeDossier(doc);
  const out: OrbitCheckBlock[] = [];
  const walk = (node: DossierNode) => {
    if (node.type === "orbitCheck" && node.attrs) {
      out.push({
        blockId: String(node.attrs.blockId),
        label: typeof node.attrs.label === "string" ? node.attrs.label : "",
        claim: node.attrs.claim as DossierClaim,
        initialFrom: (node.attrs.initialFrom as string | null | undefined) ?? null,
        ...(node.attrs.source ? { source: node.attrs.source as OrbitCheckBlock["source"] } : {}),
        ...(node.attrs.written ? { written: node.attrs.written as WrittenValues } : {}),
      });
    }
    (node.content ?? []).forEach(walk);
  };
  clean.content.forEach(walk);
  return out;
}

/** Kinds that can take their initial orbit from another block, and which given they fill. */
export const REFERENCING_KINDS: Record<string, { fills: string; replaces: string[]; description: string }> = {
  hohmann: { fills: "initialRadius", replaces: ["initialAltitude", "initialRadius"], description: "initial orbit radius" },
  biElliptic: { fills: "initialRadius", replaces: ["initialAltitude", "initialRadius"], description: "initial orbit radius" },
  planeChange: { fills: "altitude", replaces: ["altitude", "speed", "initialSpeed", "finalSpeed"], description: "circular orbit altitude" },
  escape: { fills: "parkingAltitude", replaces: ["parkingAltitude"], description: "parking orbit altitude" },
};

/** Kinds whose block can be referenced as an initial orbit. */
export const REFERENCEABLE_KINDS = ["orbit", "sunSynchronous", "j2Rates", "eclipse", "groundContact"];

const CIRCULAR_ECCENTRICITY = 1e-3;

export interface ResolvedClaim {
  claim: DossierClaim & { id: string };
  /** Notes about the reference, e.g. that the referenced orbit is not circular. */
  notes: string[];
}

function sameBody(a: unknown, b: unknown): boolean {
  return JSON.stringify(a ?? "earth") === JSON.stringify(b ?? "earth");
}

function circularOrbitOf(block: OrbitCheckBlock, tolerance?: ToleranceInput): { radius: number; altitude: number } | string {
  const shape: DossierClaim = { kind: "orbit", body: block.claim.body, given: {} };
  const g = block.claim.given;
  // The orbit-like kinds all take an orbit shape; evaluate it as an orbit claim.
  for (const k of [
    "altitude",
    "periapsisAltitude",
    "apoapsisAltitude",
    "periapsisRadius",
    "apoapsisRadius",
    "semiMajorAxis",
    "eccentricity",
    "semiLatusRectum",
    "period",
  ]) {
    if (g[k] !== undefined) shape.given[k] = g[k];
  }
  const result = evaluateClaim({ ...shape, id: block.blockId }, tolerance);
  const e = result.computed.eccentricity;
  const r = result.computed.periapsisRadius;
  const alt = result.computed.periapsisAltitude;
  if (typeof e !== "number" || typeof r !== "number" || typeof alt !== "number")
    return `"${block.label || "the referenced block"}" has no orbit to start from yet`;
  if (e > CIRCULAR_ECCENTRICITY) return `"${block.label || "the referenced block"}" is not circular (e = ${e.toPrecision(3)}); give the initial orbit directly`;
  return { radius: r, altitude: alt };
}

/** The claim the engine checks for a block, with its reference (initialFrom) filled in. */
export function resolveClaim(block: OrbitCheckBlock, blocks: readonly OrbitCheckBlock[], tolerance?: ToleranceInput): ResolvedClaim {
  const notes: string[] = [];
  const claim: DossierClaim & { id: string } = { ...block.claim, given: { ...block.claim.given }, id: block.blockId };
  const rule = REFERENCING_KINDS[claim.kind];
  if (block.initialFrom && rule) {
    const ref = blocks.find((b) => b.blockId === block.initialFrom);
    if (!ref) {
      notes.push("the block this transfer starts from is no longer in the dossier");
    } else if (!REFERENCEABLE_KINDS.includes(ref.claim.kind)) {
      notes.push(`"${ref.label || ref.claim.kind}" is a ${ref.claim.kind} block, not an orbit`);
    } else if (!sameBody(ref.claim.body, claim.body)) {
      notes.push(`"${ref.label || "the referenced orbit"}" is about another body`);
    } else {
      const orbit = circularOrbitOf(ref, tolerance);
      if (typeof orbit === "string") notes.push(orbit);
      else {
        for (const k of rule.replaces) delete claim.given[k];
        claim.given[rule.fills] = rule.fills === "initialRadius" ? orbit.radius : orbit.altitude;
        notes.push(`${rule.description} taken from "${ref.label || "the referenced orbit"}"`);
      }
    }
  }
  return { claim, notes };
}

export interface BlockEvaluation {
  block: OrbitCheckBlock;
  claim: DossierClaim & { id: string };
  result: ClaimResult;
  notes: string[];
}

/** Evaluates every block of a document (or a list of blocks) with one tolerance policy. */
export function evaluateBlocks(blocks: readonly OrbitCheckBlock[], tolerance?: ToleranceInput): BlockEvaluation[] {
  return blocks.map((block) => {
    const { claim, notes } = resolveClaim(block, blocks, tolerance);
    const result = evaluateClaim(claim, tolerance);
    return { block, claim, result: { ...result, id: block.blockId, messages: [...notes, ...result.messages] }, notes };
  });
}

/** Maneuver claims whose Δv adds to the budget, with the computed quantity that holds it. */
export const MANEUVER_DELTA_V: Record<string, string> = {
  hohmann: "deltaVTotal",
  biElliptic: "deltaVTotal",
  planeChange: "deltaV",
  escape: "deltaV",
  interplanetaryHohmann: "departureDeltaV",
};

/** Kinds whose total splits into burns a dossier may use only some of (e.g. a disposal that only lowers periapsis). */
const SEPARATE_BURNS: Record<string, readonly string[]> = {
  hohmann: ["deltaV1", "deltaV2"],
  biElliptic: ["deltaV1", "deltaV2", "deltaV3"],
};

/**
 * The Δv a maneuver block contributes: when the dossier claims only some of the burns (and
 * not the total), those burns; otherwise the kind's total.
 */
function maneuverDeltaV(
  kind: string,
  quantity: string,
  claimed: Record<string, unknown> | undefined,
  computed: Record<string, unknown>,
): { deltaV: number | null; claimed: number | null } {
  const burns = (SEPARATE_BURNS[kind] ?? []).filter((b) => claimed && b in claimed);
  if (burns.length > 0 && !(claimed && quantity in claimed)) {
    const values = burns.map((b) => num(computed[b]));
    if (values.some((v) => v === null)) return { deltaV: null, claimed: null };
    const claimedValues = burns.map((b) => num(claimed?.[b]));
    return {
      deltaV: (values as number[]).reduce((a, b) => a + b, 0),
      claimed: claimedValues.some((v) => v === null) ? null : (claimedValues as number[]).reduce((a, b) => a + b, 0),
    };
  }
  return { deltaV: num(computed[quantity]), claimed: num(claimed?.[quantity]) };
}

export interface DeltaVBudget {
  maneuvers: { blockId: string; label: string; kind: string; deltaV: number; claimedDeltaV: number | null }[];
  /** Sum of the recomputed maneuver Δv, km/s. */
  required: number;
  /** Δv the propulsion claim provides (rocket equation), km/s; null without a propulsion claim. */
  available: number | null;
  propulsionLabel: string | null;
  /** (available − required) / required; null when either is missing. */
  margin: number | null;
}

function num(v: unknown): number | null {
  return typeof v === "number" && Number.isFinite(v) ? v : null;
}

/**
 * The dossier's own Δv budget block, counted in full: every manoeuvre (or phase) it lists,
 * not only those that also have a block of their own. Null without a budget block that
 * evaluates.
 */
function ownBudget(evaluations: readonly BlockEvaluation[]): DeltaVBudget | null {
  const ev = evaluations.find((e) => e.block.claim.kind === "deltaVBudget" && num(e.result.computed.deltaVRequired) !== null);
  if (!ev) return null;
  const label = ev.block.label || "Δv budget";
  const computed = ev.result.computed as Record<string, unknown>;
  const maneuvers: DeltaVBudget["maneuvers"] = [];
  if (Array.isArray(computed.phases)) {
    (computed.phases as Record<string, unknown>[]).forEach((p, i) => {
      const dv = num(p.deltaV);
      if (dv !== null)
        maneuvers.push({ blockId: `${ev.block.blockId}:${i}`, label: `${String(p.name)} (${String(p.type)})`, kind: "phase", deltaV: dv, claimedDeltaV: null });
    });
  } else if (Array.isArray(ev.claim.given.maneuvers)) {
    (ev.claim.given.maneuvers as Record<string, unknown>[]).forEach((m, i) => {
      const dv = num(m?.deltaV);
      if (dv !== null)
        maneuvers.push({
          blockId: `${ev.block.blockId}:${i}`,
          label: String(m.name ?? `manoeuvre ${i + 1}`),
          kind: "maneuver",
          deltaV: dv,
          claimedDeltaV: null,
        });
    });
  }
  return {
    maneuvers,
    required: num(computed.deltaVRequired)!,
    available: num(computed.deltaVAvailable),
    propulsionLabel: label,
    margin: num(computed.margin),
  };
}

/**
 * The Δv budget of a dossier: its own budget block when it has one (counted in full), else
 * the maneuver claims totalled against the propulsion claim (rocket or deltaVBudget).
 */
export function deltaVBudget(evaluations: readonly BlockEvaluation[]): DeltaVBudget {
  const own = ownBudget(evaluations);
  if (own) return own;
  const maneuvers: DeltaVBudget["maneuvers"] = [];
  let available: number | null = null;
  let propulsionLabel: string | null = null;
  for (const ev of evaluations) {
    const kind = ev.block.claim.kind;
    const quantity = MANEUVER_DELTA_V[kind];
    if (quantity) {
      const { deltaV, claimed } = maneuverDeltaV(kind, quantity, ev.block.claim.claimed, ev.result.computed);
      if (deltaV !== null) {
        maneuvers.push({ blockId: ev.block.blockId, label: ev.block.label || kind, kind, deltaV, claimedDeltaV: claimed });
      }
    }
    if (available === null && (kind === "rocket" || kind === "deltaVBudget")) {
      const dv = num(ev.result.computed[kind === "rocket" ? "deltaV" : "deltaVAvailable"]);
      if (dv !== null) {
        available = dv;
        propulsionLabel = ev.block.label || kind;
      }
    }
  }
  const required = maneuvers.reduce((s, m) => s + m.deltaV, 0);
  const margin = available !== null && required > 0 ? (available - required) / required : null;
  return { maneuvers, required, available, propulsionLabel, margin };
}

/** Texts of the document's headings (any level), trimmed. */
export function dossierHeadings(doc: unknown): string[] {
  const { doc: clean } = sanitizeDossier(doc);
  const out: string[] = [];
  const textOf = (n: DossierNode): string => (n.type === "text" ? (n.text ?? "") : (n.content ?? []).map(textOf).join(""));
  const walk = (n: DossierNode) => {
    if (n.type === "heading") out.push(textOf(n).trim());
    else (n.content ?? []).forEach(walk);
  };
  clean.content.forEach(walk);
  return out;
}

const normalise = (s: string) => s.trim().replace(/\s+/g, " ").toLowerCase();

/** Required sections (by heading text, case and spacing ignored) missing from the document. */
export function missingSections(doc: unknown, required: readonly string[]): string[] {
  const have = new Set(dossierHeadings(doc).map(normalise));
  return required.filter((s) => !have.has(normalise(s)));
}

/** The first typed value of a block that is not a number: "Periapsis altitude: not a number; use a point for decimals". */
export function unreadableWritten(block: OrbitCheckBlock): string | null {
  for (const side of ["given", "claimed"] as const) {
    for (const [name, w] of Object.entries(block.written?.[side] ?? {})) {
      if (w.text.trim() === "") continue;
      const unit = quantityInfo(name)?.unit ?? "";
      const converted = convertWritten(w, unit);
      if ("error" in converted) return `${quantityName(name)} "${w.text}" is ${converted.error}`;
    }
  }
  return null;
}

export interface ReadinessProblem {
  kind: "missing-section" | "invalid-claim" | "no-content";
  message: string;
  blockId?: string;
}

/** What stops a submission: missing required sections and claims that cannot be evaluated. */
export function submissionProblems(doc: unknown, required: readonly string[], evaluations: readonly BlockEvaluation[]): ReadinessProblem[] {
  const problems: ReadinessProblem[] = [];
  for (const s of missingSections(doc, required)) problems.push({ kind: "missing-section", message: `Add a section headed "${s}".` });
  for (const ev of evaluations) {
    const unreadable = unreadableWritten(ev.block);
    if (unreadable) {
      const name = ev.block.label || `the ${kindLabel(ev.block.claim.kind).toLowerCase()} block`;
      problems.push({ kind: "invalid-claim", blockId: ev.block.blockId, message: `Fix "${name}": ${unreadable}.` });
    } else if (ev.result.status === "invalid") {
      const name = ev.block.label || `the ${ev.block.claim.kind} block`;
      problems.push({ kind: "invalid-claim", blockId: ev.block.blockId, message: `Fix "${name}": ${ev.result.messages[0] ?? "it cannot be evaluated"}` });
    }
  }
  return problems;
}
