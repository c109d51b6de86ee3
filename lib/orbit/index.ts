/**
 * VisViva orbit-check engine: two-body screening recomputation of the orbit, transfer and
 * propulsion claims in a mission dossier. Pure TypeScript (runs in the browser and on the
 * server). The contract is docs/contracts/orbit-checks.md.
 *
 * - `checkOrbitClaims(request)` checks a whole request (any JSON value) and never throws.
 * - `evaluateClaim(claim, tolerance)` checks one claim.
 * - `ORBIT_CHECK_KINDS` lists each kind with its given and computed quantities and units,
 *   for building editor forms.
 * - `conicForPlot(claim)` returns the conic(s) to draw for a claim.
 *
 * Results are two-body screening estimates, not a substitute for high-fidelity analysis.
 */
import { resolveBody } from "./bodies";
import { evaluateClaimWithPolicy, exitCodeFor, NOTICE, type Tolerance } from "./check";
import { OrbitInputError } from "./errors";
import { defaultBodyOf, Inputs, kindDef, type PlotConic } from "./kinds";
import type { ClaimResult, OrbitCheckResponse, ToleranceInput } from "./schema";

export { checkOrbitClaims, exitCodeFor, DEFAULT_TOLERANCE, compareQuantity, evaluateClaimWithPolicy, CONTRACT_VERSION, NOTICE } from "./check";
export { contactPicture, type ContactPicture } from "./contact-picture";
export type { Tolerance } from "./check";
export { parseTolerancePolicy, toleranceSummary, mergeTolerance, boundFor, ANGLE_UNIT } from "./tolerance";
export type { ToleranceIssue, Bound } from "./tolerance";
export { parseDecimal, parsePlainDecimal, precisionAllowance, readClaimedNumber, shortestDecimal } from "./decimal";
export type { ParsedDecimal, DecimalError } from "./decimal";
export { findHint, hintSentence, OTHER_CONSTANTS, UNIT_SCALE_FACTORS, SIDEREAL_DAY_S, SOLAR_DAY_S } from "./hints";
export type { OtherConstant } from "./hints";
export { ORBIT_CHECK_KINDS, KIND_NAMES, QUANTITY_ALIASES, isKindName } from "./kinds";
export type { KindInfo, GivenInfo, ComputedInfo, PlotConic, KindName } from "./kinds";
export { QUANTITIES, DEFAULT_ABSOLUTE_TOLERANCE, DEFAULT_RELATIVE_TOLERANCE, quantityInfo } from "./quantities";
export type { QuantityInfo } from "./quantities";
export { BODIES, BODY_NAMES, AU_KM, STANDARD_GRAVITY_KM_S2, MEAN_SUN_RATE_DEG_PER_DAY } from "./constants";
export type { Body, BodyName, BodyConstants } from "./constants";
export {
  orbitCheckRequestSchema,
  orbitCheckResponseSchema,
  claimSchema,
  claimResultSchema,
  bodySchema,
  toleranceSchema,
  requestEnvelopeSchema,
  orbitCheckJsonSchemas,
  HINT_CODES,
  hintSchema,
  hintCodeSchema,
  basisSchema,
  checkRowSchema,
} from "./schema";
export type {
  OrbitCheckRequest,
  OrbitCheckResponse,
  ClaimInput,
  ClaimResult,
  ClaimStatus,
  CheckRow,
  ComputedValue,
  Hint,
  HintCode,
  Basis,
  ToleranceInput,
} from "./schema";

/** Screening caution to show wherever results are displayed (the contract's `notice`). */
export const SCREENING_CAUTION = NOTICE;

/**
 * Evaluates one claim under a tolerance policy. `tolerance` may be a full Tolerance or the
 * contract's partial `{ relative?, absolute? }`; defaults fill the rest. A refused policy
 * (negative or non-finite bounds, relative ≥ 0.5) makes the claim invalid with a message
 * naming the field. Never throws.
 */
export function evaluateClaim(claim: unknown, tolerance?: Tolerance | ToleranceInput): ClaimResult {
  return evaluateClaimWithPolicy(claim, tolerance, 0);
}

export interface ConicPlot {
  /** Radius of the body at the focus, km. */
  bodyRadius: number;
  /** Conics to draw (initial, transfer and final orbits for transfers). */
  conics: PlotConic[];
  /** Why nothing can be drawn, when conics is empty. */
  message?: string;
}

/**
 * The conic(s) behind a claim, for drawing r(θ) = p / (1 + e cos θ). Never throws:
 * a claim that cannot be evaluated gives no conics and the reason.
 */
export function conicForPlot(claim: unknown): ConicPlot {
  try {
    if (typeof claim !== "object" || claim === null || Array.isArray(claim)) return { bodyRadius: 0, conics: [], message: "not a claim object" };
    const c = claim as Record<string, unknown>;
    const def = typeof c.kind === "string" ? kindDef(c.kind) : undefined;
    if (!def) return { bodyRadius: 0, conics: [], message: "unknown kind" };
    const given = typeof c.given === "object" && c.given !== null && !Array.isArray(c.given) ? (c.given as Record<string, unknown>) : {};
    const body = resolveBody(c.body, defaultBodyOf(c.kind as string));
    const ev = def.evaluate(new Inputs(given, c.kind as string), body);
    const conics = ev.conics.filter((k) => Number.isFinite(k.p) && Number.isFinite(k.e));
    return conics.length > 0
      ? { bodyRadius: ev.plotBodyRadius, conics }
      : { bodyRadius: ev.plotBodyRadius, conics: [], message: "this kind has no orbit to draw" };
  } catch (e) {
    return { bodyRadius: 0, conics: [], message: e instanceof OrbitInputError ? e.message : "the claim could not be evaluated" };
  }
}

/** Convenience for callers that only need the verdict of a response. */
export function overallStatus(response: OrbitCheckResponse): "consistent" | "inconsistent" | "invalid" {
  const code = exitCodeFor(response);
  return code === 0 ? "consistent" : code === 1 ? "inconsistent" : "invalid";
}
