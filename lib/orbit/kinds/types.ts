/** The shapes every claim kind shares: its definition, the validated inputs it reads and what it returns. */
import type { Body, BodyName } from "../constants";
import type { KindName } from "./registry";
import { fail, fmt } from "../errors";
import { quantityInfo } from "../quantities";
import type { ComputedValue } from "../schema";
import type { Vec3 } from "../vector";

/** One conic to draw with r(θ) = p / (1 + e cos θ), rotated by argPeriapsis in the plot plane. */
export interface PlotConic {
  label: string;
  /** Semi-latus rectum, km. */
  p: number;
  e: number;
  periapsisRadius: number;
  /** null for open orbits. */
  apoapsisRadius: number | null;
  /** Rotation of the periapsis in the plot plane, deg. */
  argPeriapsis: number;
  /** Arc to draw, true anomaly from/to in deg; the whole conic when absent. */
  trueAnomalyRange?: [number, number];
  /** Spacecraft marker, true anomaly in deg. */
  marker?: number;
}

export interface Evaluation {
  values: Record<string, ComputedValue>;
  /** Quantities of this kind that do not exist for this case, with the reason. */
  unavailable: Record<string, string>;
  messages: string[];
  conics: PlotConic[];
  /** Radius of the body drawn at the focus, km. */
  plotBodyRadius: number;
}

export interface GivenInfo {
  name: string;
  unit: string;
  type: string;
  /** required, optional, or part of a choice described in the kind's `givenRule`. */
  use: "required" | "optional" | "choice";
}

export interface ComputedInfo {
  name: string;
  unit: string;
  type: string;
  /** Set on an old name kept for one contract version (earthCentralAngle → centralAngle): forms should offer the new name. */
  aliasOf?: string;
}

export interface KindInfo {
  kind: KindName;
  summary: string;
  givenRule: string;
  given: GivenInfo[];
  computed: ComputedInfo[];
  defaultBody: BodyName;
}

/** Reads and validates the `given` object of one claim. */
export class Inputs {
  constructor(
    private readonly raw: Record<string, unknown>,
    private readonly kind: string,
  ) {}

  has(name: string): boolean {
    const v = this.raw[name];
    return v !== undefined && v !== null;
  }

  num(name: string, rule: "any" | "positive" | "nonNegative" = "any"): number {
    if (!this.has(name)) fail(`${this.kind} needs given.${name} (${unitOf(name)})`);
    const v = this.raw[name];
    if (typeof v !== "number" || !Number.isFinite(v)) fail(`given.${name} must be a finite number in ${unitOf(name)} (got ${describe(v)})`);
    if (rule === "positive" && !(v > 0)) fail(`given.${name} must be positive (got ${fmt(v)} ${unitOf(name)})`);
    if (rule === "nonNegative" && !(v >= 0)) fail(`given.${name} must be zero or positive (got ${fmt(v)} ${unitOf(name)})`);
    return v;
  }

  optNum(name: string, rule: "any" | "positive" | "nonNegative" = "any"): number | undefined {
    return this.has(name) ? this.num(name, rule) : undefined;
  }

  vec(name: string): Vec3 {
    if (!this.has(name)) fail(`${this.kind} needs given.${name} as [x, y, z] in ${unitOf(name)}`);
    const v = this.raw[name];
    if (!Array.isArray(v) || v.length !== 3 || !v.every((c) => typeof c === "number" && Number.isFinite(c)))
      fail(`given.${name} must be an array of three finite numbers in ${unitOf(name)} (got ${describe(v)})`);
    return [v[0] as number, v[1] as number, v[2] as number];
  }

  text(name: string, allowed: readonly string[], fallback: string): string {
    if (!this.has(name)) return fallback;
    const v = this.raw[name];
    if (typeof v !== "string" || !allowed.includes(v)) fail(`given.${name} must be one of ${allowed.join(", ")} (got ${describe(v)})`);
    return v;
  }

  value(name: string): unknown {
    return this.raw[name];
  }
}

function unitOf(name: string): string {
  const u = quantityInfo(name)?.unit;
  return u === undefined || u === "" ? "" : u === "1" ? "(dimensionless)" : u;
}

function describe(v: unknown): string {
  if (typeof v === "number") return String(v);
  if (typeof v === "string") return `the text ${JSON.stringify(v.length > 40 ? v.slice(0, 40) + "…" : v)}`;
  if (Array.isArray(v)) return `an array of ${v.length}`;
  if (v === null) return "null";
  return typeof v;
}

// ---------------------------------------------------------------------------------------

export interface KindDef {
  summary: string;
  givenRule: string;
  given: [string, GivenInfo["use"]][];
  computed: string[];
  defaultBody?: BodyName;
  /** False for kinds whose result does not depend on the body's constants. */
  usesBody?: false;
  evaluate(g: Inputs, body: Body, options?: EvaluateOptions): Evaluation;
}

/** Knobs the hint search turns to recompute a kind with another commonly used constant. */
export interface EvaluateOptions {
  /** Standard gravity used by the rocket equation, km/s² (default 9.80665e-3). */
  g0?: number;
}
