/**
 * Runs an orbit-check request: each claim is evaluated on its own, every claimed value is
 * compared with the recomputed one under the tolerance rules of the contract, and nothing
 * throws out of here — a claim that cannot be evaluated comes back `invalid` with a message.
 */
import { resolveBody } from "./bodies";
import { OrbitInputError } from "./errors";
import { CONTACT_BUDGET_MESSAGE, claimsOverContactBudget } from "./kinds/contact-time";
import { allowedGiven, defaultBodyOf, type Evaluation, Inputs, kindDef, KIND_NAMES, usesBody } from "./kinds";
import { DEFAULT_ABSOLUTE_TOLERANCE, DEFAULT_RELATIVE_TOLERANCE, quantityInfoFor } from "./quantities";
import {
  type CheckRow,
  type ClaimResult,
  type ClaimStatus,
  type ComputedValue,
  type OrbitCheckResponse,
  requestEnvelopeSchema,
  toleranceSchema,
} from "./schema";
import { wrapDeg180 } from "./vector";

/** Tolerance after defaults are applied. */
export interface Tolerance {
  relative: number;
  absolute: Record<string, number>;
}

export const DEFAULT_TOLERANCE: Tolerance = { relative: DEFAULT_RELATIVE_TOLERANCE, absolute: { ...DEFAULT_ABSOLUTE_TOLERANCE } };

/** Merges a (validated) tolerance input over a base tolerance. */
export function mergeTolerance(base: Tolerance, input?: { relative?: number; absolute?: Record<string, number> }): Tolerance {
  return {
    relative: input?.relative ?? base.relative,
    absolute: { ...base.absolute, ...(input?.absolute ?? {}) },
  };
}

const MAX_CLAIMED_VALUES = 200;

/** Compares one claimed value with the computed one. */
export function compareQuantity(quantity: string, claimed: unknown, computed: ComputedValue, tolerance: Tolerance, kind = ""): CheckRow | string {
  const info = quantityInfoFor(kind, quantity);
  const unit = info?.unit ?? "";
  const row = (relativeError: number | null, absoluteError: number | null, ok: boolean): CheckRow => ({
    quantity,
    claimed,
    computed,
    unit,
    relativeError: relativeError !== null && Number.isFinite(relativeError) ? relativeError : null,
    absoluteError: absoluteError !== null && Number.isFinite(absoluteError) ? absoluteError : null,
    ok,
  });
  const absTol = tolerance.absolute[unit] ?? 0;
  const within = (abs: number, rel: number) => abs <= absTol || rel <= tolerance.relative;
  if (typeof computed === "number") {
    if (typeof claimed !== "number" || !Number.isFinite(claimed))
      return `claimed.${quantity} must be a finite number in ${unit || "(dimensionless)"} (got ${JSON.stringify(claimed) ?? typeof claimed})`;
    const diff = info?.periodicAngle ? Math.abs(wrapDeg180(claimed - computed)) : Math.abs(claimed - computed);
    const rel = computed === 0 ? (diff === 0 ? 0 : Infinity) : diff / Math.abs(computed);
    return row(rel, diff, within(diff, rel));
  }
  if (typeof computed === "string" || typeof computed === "boolean") {
    if (typeof claimed !== typeof computed) return `claimed.${quantity} must be a ${typeof computed === "string" ? "text" : "true/false value"}`;
    return row(null, null, claimed === computed);
  }
  // Tables (decay profiles, budget phases) are shown, not claimed.
  if (computed.length !== 3 || typeof computed[0] !== "number")
    return `${quantity} is a table of computed values for plots and reports; claim its single values (e.g. the totals) instead`;
  // Vectors: error is the length of the difference, relative to the computed vector's length.
  if (!Array.isArray(claimed) || claimed.length !== 3 || !claimed.every((c) => typeof c === "number" && Number.isFinite(c)))
    return `claimed.${quantity} must be an array of three finite numbers in ${unit}`;
  const c = claimed as number[];
  const v = computed as [number, number, number];
  const diff = Math.hypot(c[0]! - v[0], c[1]! - v[1], c[2]! - v[2]);
  const len = Math.hypot(v[0], v[1], v[2]);
  const rel = len === 0 ? (diff === 0 ? 0 : Infinity) : diff / len;
  return row(rel, diff, within(diff, rel));
}

function invalid(id: string, kind: string, messages: string[], computed: Record<string, ComputedValue> = {}, checks: CheckRow[] = []): ClaimResult {
  return { id, kind, status: "invalid", computed, checks, messages };
}

function errorMessage(e: unknown): string {
  if (e instanceof OrbitInputError) return e.message;
  // Anything else is a defect of the engine; say so without leaking internals.
  return "the engine could not evaluate this claim (internal error); please report it with the claim";
}

/** Evaluates one claim (any JSON value) under a tolerance. Never throws. */
export function evaluateClaim(claim: unknown, tolerance: Tolerance = DEFAULT_TOLERANCE, index = 0): ClaimResult {
  let id = `claim-${index + 1}`;
  let kind = "unknown";
  try {
    if (typeof claim !== "object" || claim === null || Array.isArray(claim))
      return invalid(id, kind, ['a claim must be an object such as { "id": "c1", "kind": "orbit", "body": "earth", "given": {…}, "claimed": {…} }']);
    const c = claim as Record<string, unknown>;
    if (typeof c.id === "string" && c.id.length > 0) id = c.id.slice(0, 200);
    else if (typeof c.id === "number" && Number.isFinite(c.id)) id = String(c.id);
    if (typeof c.kind !== "string" || c.kind.length === 0) return invalid(id, kind, [`the claim needs a kind; valid kinds: ${KIND_NAMES.join(", ")}`]);
    kind = c.kind.slice(0, 60);
    const def = kindDef(c.kind);
    if (!def) return invalid(id, kind, [`unknown kind "${kind}"; valid kinds: ${KIND_NAMES.join(", ")}`]);
    const known = new Set(["id", "kind", "body", "given", "claimed", "tolerance"]);
    const extra = Object.keys(c).filter((k) => !known.has(k));
    const messages: string[] = [];
    if (extra.length > 0) messages.push(`ignored unknown claim field(s): ${extra.slice(0, 10).join(", ")}`);
    if (c.given !== undefined && (typeof c.given !== "object" || c.given === null || Array.isArray(c.given)))
      return invalid(id, kind, ["given must be an object of named input values"]);
    const given = (c.given ?? {}) as Record<string, unknown>;
    if (c.claimed !== undefined && c.claimed !== null && (typeof c.claimed !== "object" || Array.isArray(c.claimed)))
      return invalid(id, kind, ["claimed must be an object of named values"]);
    const claimed = (c.claimed ?? {}) as Record<string, unknown>;
    let tol = tolerance;
    if (c.tolerance !== undefined) {
      const t = toleranceSchema.safeParse(c.tolerance);
      if (!t.success)
        return invalid(id, kind, [`tolerance is malformed: ${t.error.issues.map((i) => `${i.path.join(".") || "tolerance"}: ${i.message}`).join("; ")}`]);
      tol = mergeTolerance(tolerance, t.data);
    }
    const allowed = allowedGiven(kind);
    const unknownGiven = Object.keys(given).filter((k) => !allowed.includes(k));
    if (unknownGiven.length > 0)
      return invalid(id, kind, [
        `unknown given value(s) for ${kind}: ${unknownGiven.slice(0, 10).join(", ")}; valid names: ${allowed.join(", ") || "(none: this kind uses only body)"}`,
      ]);
    if (c.body === undefined && usesBody(kind)) messages.push(`no body given: ${defaultBodyOf(kind)} constants are used`);
    const body = resolveBody(c.body, defaultBodyOf(kind));
    const ev: Evaluation = def.evaluate(new Inputs(given, kind), body);
    messages.push(...ev.messages);
    const computed: Record<string, ComputedValue> = {};
    for (const [k, v] of Object.entries(ev.values)) {
      if (typeof v === "number" && !Number.isFinite(v)) return invalid(id, kind, [...messages, `${k} is not finite for these inputs; check their magnitudes`]);
      if (Array.isArray(v) && v.some((x) => typeof x === "number" && !Number.isFinite(x)))
        return invalid(id, kind, [...messages, `${k} is not finite for these inputs; check their magnitudes`]);
      computed[k] = v;
    }
    const checks: CheckRow[] = [];
    const problems: string[] = [];
    const names = Object.keys(claimed);
    if (names.length > MAX_CLAIMED_VALUES) return invalid(id, kind, [`at most ${MAX_CLAIMED_VALUES} claimed values per claim`], computed);
    for (const q of names) {
      const value = claimed[q];
      if (value === undefined || value === null) continue;
      if (!def.computed.includes(q)) {
        problems.push(`${kind} cannot derive "${q}"; valid names: ${def.computed.join(", ")}`);
        continue;
      }
      const comp = computed[q];
      if (comp === undefined) {
        problems.push(ev.unavailable[q] ?? `${q} cannot be computed for these inputs`);
        continue;
      }
      const r = compareQuantity(q, value, comp, tol, kind);
      if (typeof r === "string") problems.push(r);
      else checks.push(r);
    }
    if (names.length === 0) messages.push("nothing claimed: the computed values are shown for reference");
    let status: ClaimStatus = "consistent";
    if (problems.length > 0) status = "invalid";
    else if (checks.some((r) => !r.ok)) status = "inconsistent";
    return { id, kind, status, computed, checks, messages: [...problems, ...messages] };
  } catch (e) {
    return invalid(id, kind, [errorMessage(e)]);
  }
}

/** The id a claim's result carries (as evaluateClaim assigns it). */
function claimIdOf(claim: unknown, index: number): string {
  const id = typeof claim === "object" && claim !== null ? (claim as { id?: unknown }).id : undefined;
  if (typeof id === "string" && id.length > 0) return id.slice(0, 200);
  if (typeof id === "number" && Number.isFinite(id)) return String(id);
  return `claim-${index + 1}`;
}

/** Checks a whole request (any JSON value). Never throws. */
export function checkOrbitClaims(request: unknown): OrbitCheckResponse {
  try {
    const env = requestEnvelopeSchema.safeParse(request);
    if (!env.success) {
      return {
        error: 'the request must be an object { "tolerance"?: {...}, "claims": [...] }',
        details: env.error.issues.map((i) => ({ path: i.path.map(String).join("."), message: i.message })),
        results: [],
      };
    }
    const tolerance = mergeTolerance(DEFAULT_TOLERANCE, env.data.tolerance);
    const overBudget = claimsOverContactBudget(env.data.claims);
    return {
      results: env.data.claims.map((c, i) =>
        overBudget.has(i) ? invalid(claimIdOf(c, i), "contactTime", [CONTACT_BUDGET_MESSAGE]) : evaluateClaim(c, tolerance, i),
      ),
    };
  } catch {
    return { error: "the engine could not read this request (internal error)", results: [] };
  }
}

/** Exit status of the command line for a response (0 consistent, 1 inconsistent, 2 invalid or malformed). */
export function exitCodeFor(response: OrbitCheckResponse): 0 | 1 | 2 {
  if (response.error !== undefined) return 2;
  if (response.results.some((r) => r.status === "invalid")) return 2;
  if (response.results.some((r) => r.status === "inconsistent")) return 1;
  return 0;
}
