/**
 * Runs an orbit-check request: each claim is evaluated on its own, every claimed value is
 * compared with the recomputed one under the tolerance rules of the contract, and nothing
 * throws out of here — a claim that cannot be evaluated comes back `invalid` with a message.
 */
import { resolveBody } from "./bodies";
import { isBodyName, type Body, type BodyName } from "./constants";
import { readClaimedNumber } from "./decimal";
import { OrbitInputError } from "./errors";
import { CONTACT_BUDGET_MESSAGE, claimsOverContactBudget } from "./kinds/contact-time";
import { findHint } from "./hints";
import { allowedGiven, defaultBodyOf, type Evaluation, Inputs, kindDef, KIND_NAMES, usesBody } from "./kinds";
import { quantityInfoFor } from "./quantities";
import { type CheckRow, type ClaimResult, type ClaimStatus, type ComputedValue, type OrbitCheckResponse, requestEnvelopeSchema } from "./schema";
import { boundFor, DEFAULT_TOLERANCE, mergeTolerance, parseTolerancePolicy, scalarError, type Tolerance } from "./tolerance";

export { DEFAULT_TOLERANCE, mergeTolerance, type Tolerance } from "./tolerance";

// The contract version and the notice live in notice.ts (no engine there, for the browser).
import { CONTRACT_VERSION, NOTICE } from "./notice";
export { CONTRACT_VERSION, NOTICE };

const MAX_CLAIMED_VALUES = 200;

/** Names a contract version 1 quantity had; claims may still use them for one version. */
const OLD_NAMES: Record<string, string> = { earthCentralAngle: "centralAngle" };

/** What a claimed value becomes once read: its number(s) and precision allowance. */
type ReadValue = { scalar: number; precision: number } | { vector: [number, number, number]; precision: [number, number, number] };

function readClaimed(quantity: string, claimed: unknown, computed: ComputedValue, unit: string): ReadValue | string {
  const unitWords = unit === "" || unit === "1" ? "(dimensionless)" : unit;
  if (typeof computed === "number") {
    const r = readClaimedNumber(claimed);
    if ("error" in r) return `claimed.${quantity} ${r.error}; give it in ${unitWords}`;
    return { scalar: r.value, precision: r.allowance };
  }
  if (!Array.isArray(claimed) || claimed.length !== 3) return `claimed.${quantity} must be an array of three numbers in ${unitWords}`;
  const out: number[] = [];
  const prec: number[] = [];
  for (let i = 0; i < 3; i++) {
    const r = readClaimedNumber(claimed[i]);
    if ("error" in r) return `claimed.${quantity}[${i}] ${r.error}; give it in ${unitWords}`;
    out.push(r.value);
    prec.push(r.allowance);
  }
  return { vector: out as [number, number, number], precision: prec as [number, number, number] };
}

/**
 * Compares one claimed value with the computed one under contract version 2's rule.
 * Returns the check row, or a message when the claimed value cannot be read.
 */
export function compareQuantity(quantity: string, claimed: unknown, computed: ComputedValue, tolerance: Tolerance, kind = ""): CheckRow | string {
  const info = quantityInfoFor(kind, quantity);
  const unit = info?.unit ?? "";
  const finite = (x: number) => (Number.isFinite(x) ? x : null);
  if (typeof computed === "string" || typeof computed === "boolean") {
    if (typeof claimed !== typeof computed) return `claimed.${quantity} must be a ${typeof computed === "string" ? "text" : "true/false value"}`;
    return { quantity, claimed, computed, unit, relativeError: null, absoluteError: null, ok: claimed === computed, allowance: null, basis: "exact" };
  }
  // Tables (decay profiles, budget phases) are shown, not claimed.
  if (typeof computed !== "number" && (computed.length !== 3 || typeof computed[0] !== "number"))
    return `${quantity} is a table of computed values for plots and reports; claim its single values (e.g. the totals) instead`;
  const read = readClaimed(quantity, claimed, computed, unit);
  if (typeof read === "string") return read;
  if ("scalar" in read) {
    const c = computed as number;
    const diff = scalarError(read.scalar, c, unit);
    const rel = c === 0 ? (diff === 0 ? 0 : Infinity) : diff / Math.abs(c);
    const b = boundFor(c, unit, read.precision, tolerance);
    return {
      quantity,
      claimed,
      computed,
      unit,
      relativeError: finite(rel),
      absoluteError: finite(diff),
      ok: diff <= b.allowance,
      allowance: b.allowance,
      basis: b.basis,
      precision: read.precision,
    };
  }
  // Vectors: the error is the length of the difference; each component's written digits
  // earn their own allowance, and the vector's is the length of those allowances.
  const v = computed as [number, number, number];
  const c = read.vector;
  const diff = Math.hypot(c[0] - v[0], c[1] - v[1], c[2] - v[2]);
  const len = Math.hypot(v[0], v[1], v[2]);
  const rel = len === 0 ? (diff === 0 ? 0 : Infinity) : diff / len;
  const b = boundFor(len, unit, Math.hypot(...read.precision), tolerance);
  return {
    quantity,
    claimed,
    computed,
    unit,
    relativeError: finite(rel),
    absoluteError: finite(diff),
    ok: diff <= b.allowance,
    allowance: b.allowance,
    basis: b.basis,
    precision: read.precision,
  };
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
export function evaluateClaim(claim: unknown, tolerance: Tolerance = DEFAULT_TOLERANCE, index = 0, options: { hints?: boolean } = {}): ClaimResult {
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
      const t = parseTolerancePolicy(c.tolerance, tolerance, "tolerance");
      if (!t.ok) return invalid(id, kind, [`the claim's tolerance is refused: ${t.message}`]);
      tol = t.tolerance;
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
    const bodyName = tableBodyName(c.body, defaultBodyOf(kind));
    const overridden = new Set(typeof c.body === "object" && c.body !== null ? Object.keys(c.body) : []);
    const bodyUsed = usesBody(kind) ? body : undefined;
    // Recomputations for the hint search, shared by the claim's failing rows.
    const recomputed = new Map<string, Record<string, ComputedValue> | undefined>();
    const recompute = (b: Body = body, g0?: number) => {
      const key = `${b.name}|${b.mu}|${b.radius}|${b.j2ReferenceRadius}|${b.year}|${g0}`;
      if (!recomputed.has(key)) {
        let values: Record<string, ComputedValue> | undefined;
        try {
          values = def.evaluate(new Inputs(given, kind), b, g0 === undefined ? undefined : { g0 }).values;
        } catch {
          values = undefined;
        }
        recomputed.set(key, values);
      }
      return recomputed.get(key);
    };
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
      if (OLD_NAMES[q] !== undefined && def.computed.includes(q))
        messages.push(`${q} is the contract version 1 name of ${OLD_NAMES[q]}; it is accepted for one more version, so rename it`);
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
      else {
        if (!r.ok && options.hints !== false && (typeof comp === "number" || (Array.isArray(comp) && comp.every((c) => typeof c === "number")))) {
          const hint = findHint({
            quantity: q,
            unit: r.unit,
            claimed: Array.isArray(value) ? value.map((x) => Number(x)) : Number(value),
            precision: Array.isArray(r.precision) ? Math.hypot(...r.precision) : (r.precision ?? 0),
            computed: comp as number | readonly number[],
            tolerance: tol,
            computedAll: computed,
            kind,
            body: bodyUsed,
            bodyName: bodyUsed ? bodyName : undefined,
            overridden,
            recompute,
          });
          if (hint) r.hint = hint;
        }
        checks.push(r);
      }
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

/** The table body a claim's `body` names (directly or as an override's `name`), if any. */
function tableBodyName(input: unknown, fallback: BodyName): BodyName | undefined {
  if (input === undefined || input === null) return fallback;
  const name = typeof input === "string" ? input : typeof input === "object" && !Array.isArray(input) ? (input as Record<string, unknown>).name : undefined;
  if (typeof name !== "string") return undefined;
  const key = name.trim().toLowerCase();
  return isBodyName(key) ? key : undefined;
}

/** Evaluates one claim under a tolerance policy (`{ relative?, absolute? }` over the defaults). Never throws. */
export function evaluateClaimWithPolicy(claim: unknown, policy?: unknown, index = 0): ClaimResult {
  const t = parseTolerancePolicy(policy, DEFAULT_TOLERANCE, "tolerance");
  if (!t.ok) {
    const c = typeof claim === "object" && claim !== null ? (claim as Record<string, unknown>) : {};
    return invalid(typeof c.id === "string" ? c.id : `claim-${index + 1}`, typeof c.kind === "string" ? c.kind : "unknown", [
      `the tolerance policy is refused: ${t.message}`,
    ]);
  }
  return evaluateClaim(claim, t.tolerance, index);
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
      const details = env.error.issues.map((i) => ({ path: i.path.map(String).join("."), message: i.message }));
      const tolIssues = details.filter((d) => d.path === "tolerance" || d.path.startsWith("tolerance."));
      return {
        contractVersion: CONTRACT_VERSION,
        notice: NOTICE,
        error:
          tolIssues.length > 0
            ? `the tolerance is refused: ${tolIssues.map((d) => `${d.path}: ${d.message}`).join("; ")}`
            : 'the request must be an object { "tolerance"?: {...}, "claims": [...] }',
        details,
        results: [],
      };
    }
    const tolerance = mergeTolerance(DEFAULT_TOLERANCE, env.data.tolerance);
    const overBudget = claimsOverContactBudget(env.data.claims);
    return {
      contractVersion: CONTRACT_VERSION,
      notice: NOTICE,
      results: env.data.claims.map((c, i) =>
        overBudget.has(i) ? invalid(claimIdOf(c, i), "contactTime", [CONTACT_BUDGET_MESSAGE]) : evaluateClaim(c, tolerance, i),
      ),
    };
  } catch {
    return { contractVersion: CONTRACT_VERSION, notice: NOTICE, error: "the engine could not read this request (internal error)", results: [] };
  }
}

/** Exit status of the command line for a response (0 consistent, 1 inconsistent, 2 invalid or malformed). */
export function exitCodeFor(response: OrbitCheckResponse): 0 | 1 | 2 {
  if (response.error !== undefined) return 2;
  if (response.results.some((r) => r.status === "invalid")) return 2;
  if (response.results.some((r) => r.status === "inconsistent")) return 1;
  return 0;
}
