/**
 * Requirements a call sets on every dossier (the second verdict axis): the shared shapes.
 * Pure (zod only): the editor rail judges live with the same code the server runs at
 * submission. A new requirement type is one entry of `REQUIREMENT_TYPES` (registry.ts).
 */
import type { z } from "zod";

/** The outcome of one requirement on one claim. */
export const REQUIREMENT_STATUSES = ["met", "notMet", "notEvaluated"] as const;
export type RequirementStatus = (typeof REQUIREMENT_STATUSES)[number];

/** Words shown to people for each status (colour never carries the meaning alone). */
export const REQUIREMENT_STATUS_LABELS: Record<RequirementStatus, string> = {
  met: "met",
  notMet: "not met",
  notEvaluated: "not evaluated",
};

/** A requirement as the call stores it. */
export interface CallRequirement {
  id: string;
  type: string;
  params: Record<string, unknown>;
  /** Why the board asks for it, shown to proposers. */
  rationale: string;
}

/** What a requirement sees of a claim: the server's recomputation, never the claimed values. */
export interface RequirementClaim {
  kind: string;
  status: "consistent" | "inconsistent" | "invalid";
  given: Record<string, unknown>;
  computed: Record<string, unknown>;
}

/** One compared figure (a margin per phase, a lifetime...), for the rail's colours and the texts. */
export interface RequirementRow {
  label: string;
  /** The dossier's value (recomputed), in `unit`. */
  actual: number | null;
  /** The call's limit, in `unit`. */
  required: number;
  unit: string;
  /** "min": the actual value must be at least the limit; "max": at most. */
  sense: "min" | "max";
  /** Distance to the limit under which the figure is shown as close (amber), in `unit`. */
  closeWithin: number;
}

/** The outcome of one requirement on one claim, stored per claim at submission. */
export interface RequirementOutcome {
  requirementId: string;
  type: string;
  /** The requirement's one-line summary at the time of the judgement. */
  title: string;
  status: RequirementStatus;
  /** Why: a sentence a proposer can act on. */
  reason: string;
  rows: RequirementRow[];
}

/** A field of a requirement's parameters, for forms: stored value × `scale` = displayed value. */
export interface RequirementField {
  name: string;
  label: string;
  /** Unit as shown to people (e.g. "%", "years", "min"). */
  unit: string;
  scale: number;
  help: string;
}

export interface RequirementPreset {
  label: string;
  params: Record<string, unknown>;
  rationale: string;
}

export interface RequirementDefinition<P extends Record<string, unknown> = Record<string, unknown>> {
  type: string;
  /** Name of the requirement type in the chair's list. */
  name: string;
  description: string;
  /** zod schema of the parameters; its issues name the field (params.<name>). */
  params: z.ZodType<P>;
  fields: readonly RequirementField[];
  /** A parameter naming stations of the board's list (an array of names), offered as one checkbox per station. */
  stationList?: { name: string; legend: string; help: string };
  presets: readonly RequirementPreset[];
  defaultRationale: string;
  /** Claim kinds this requirement concerns. */
  kinds: readonly string[];
  /** One line: what the call demands with these parameters. */
  summary(params: P): string;
  /** Judges one claim of a concerned kind. */
  evaluate(params: P, claim: RequirementClaim): { status: RequirementStatus; reason: string; rows: RequirementRow[] };
}

/** Colour band of a row: below (red), close (amber, within `closeWithin`), clear (green). */
export type RowBand = "below" | "close" | "clear" | "unknown";

export function rowBand(row: RequirementRow): RowBand {
  if (row.actual === null || !Number.isFinite(row.actual)) return "unknown";
  const slack = row.sense === "min" ? row.actual - row.required : row.required - row.actual;
  if (slack < 0) return "below";
  if (slack <= row.closeWithin) return "close";
  return "clear";
}
