/**
 * zod 4 schemas of the orbit-check request and response (the public contract in
 * docs/contracts/orbit-checks.md). The HTTP route and the OpenAPI document use these;
 * `orbitCheckRequestJsonSchema()` gives the JSON Schema text.
 *
 * Per-claim values (`given`, `claimed`) are validated by the engine itself, claim by claim,
 * so that one bad claim is reported as `invalid` without failing the whole request.
 */
import { z } from "zod";
import { BODY_NAMES } from "./constants";

const finite = z.number();
const positive = finite.positive();

export const bodyNameSchema = z.enum(BODY_NAMES as unknown as [string, ...string[]]).describe("a body of the constants table");

export const bodyOverrideSchema = z
  .strictObject({
    name: z.string().min(1).max(40).optional().describe("a table body to start from, or a free label when mu and radius are given"),
    mu: positive.optional().describe("gravitational parameter, km³/s²"),
    radius: finite.nonnegative().optional().describe("equatorial radius, km"),
    j2: finite.optional().describe("second zonal harmonic J2"),
    rotationRate: finite.optional().describe("sidereal rotation rate, rad/s"),
    orbitRadius: positive.optional().describe("mean orbit radius about the parent (the sun, or the earth for the moon), km"),
    parentMu: positive.optional().describe("GM of the parent body, km³/s² (sphere of influence)"),
    j2ReferenceRadius: positive.optional().describe("reference radius the j2 was published with, km"),
    year: positive.optional().describe("the body's orbital period about the sun (its year), days"),
  })
  .describe("constants that override the table for this claim");

export const bodySchema = z.union([bodyNameSchema, bodyOverrideSchema]);

/** A bound: a finite number ≥ 0 (JSON.parse turns 1e400 into Infinity, so finiteness is checked here). */
const bound = (what: string) =>
  z
    .number({ error: `${what} must be a finite number` })
    .refine((x) => Number.isFinite(x), { message: `${what} must be a finite number` })
    .refine((x) => x >= 0, { message: `${what} must not be negative` });

export const toleranceSchema = z
  .strictObject({
    relative: bound("the relative bound")
      .refine((x) => x < 0.5, { message: "the relative bound must be below 0.5 (50 %); write 0.001 for 0.1 %" })
      .optional()
      .describe("relative tolerance as a fraction, default 0.001 (0.1 %); never applies to angles"),
    absolute: z.record(z.string().min(1).max(20), bound("an absolute bound")).optional().describe('absolute tolerance per unit, e.g. { "km": 1, "deg": 0.05 }'),
  })
  .describe("a quantity passes within the largest of the relative bound, its unit's absolute bound and its precision allowance");

export const vectorSchema = z.tuple([finite, finite, finite]);

export const claimSchema = z.object({
  id: z
    .union([z.string().max(200), z.number()])
    .optional()
    .describe("the proposer's identifier for the claim"),
  kind: z.string().min(1).max(60).describe("the kind of claim, e.g. orbit, hohmann, lambert"),
  body: bodySchema.optional().describe("central body; earth by default (sun for interplanetaryHohmann)"),
  given: z.record(z.string(), z.unknown()).describe("inputs in contract units"),
  claimed: z.record(z.string(), z.unknown()).optional().describe("values the dossier states, to be checked"),
  tolerance: toleranceSchema.optional().describe("per-claim override of the request tolerance"),
});

/** The full request, for documentation and typing. */
export const orbitCheckRequestSchema = z.object({
  tolerance: toleranceSchema.optional(),
  claims: z.array(claimSchema).max(1000),
});

/** The envelope the engine validates first; claims are then checked one by one. */
export const requestEnvelopeSchema = z.object({
  tolerance: toleranceSchema.optional(),
  claims: z.array(z.unknown()).max(1000, "at most 1000 claims per request"),
});

export const statusSchema = z.enum(["consistent", "inconsistent", "invalid"]);

const computedValueSchema = z.union([finite, z.string(), z.boolean(), vectorSchema]);

/** The hint codes of contract version 2, in the order they are searched. */
export const HINT_CODES = [
  "other-quantity",
  "altitude-radius",
  "unit-scale",
  "degrees-radians",
  "solar-day",
  "standard-gravity",
  "sign",
  "other-constants",
] as const;

export const hintCodeSchema = z.enum(HINT_CODES);

/** A likely slip behind a failing check; it never changes a status. */
export const hintSchema = z.looseObject({
  code: hintCodeSchema,
  message: z.string(),
  quantity: z.string().optional().describe("other-quantity: the computed quantity the claimed value equals"),
  factor: z.number().optional().describe("unit-scale, degrees-radians, standard-gravity: the factor that makes the claim agree"),
  constant: z.string().optional().describe("other-constants: the constant exchanged, e.g. earth.radius"),
  value: z.number().optional().describe("other-constants: the commonly used value that makes the claim agree"),
});

/** Which bound a check passed or failed on (`exact` for texts and true/false values). */
export const basisSchema = z.enum(["relative", "absolute", "precision", "exact"]);

export const checkRowSchema = z.object({
  quantity: z.string(),
  /** As the claim wrote it: a JSON number, a decimal string, a vector, a text. */
  claimed: z.unknown(),
  computed: z.unknown(),
  unit: z.string(),
  relativeError: finite.nullable(),
  absoluteError: finite.nullable(),
  ok: z.boolean(),
  /** The bound that was applied, in the quantity's unit (null for texts and true/false values). */
  allowance: finite.nullable(),
  basis: basisSchema,
  /** The precision allowance earned by the written digits (0 when none; per component for vectors). */
  precision: z
    .union([finite, z.tuple([finite, finite, finite])])
    .nullable()
    .optional(),
  hint: hintSchema.optional(),
});

export const claimResultSchema = z.object({
  id: z.string(),
  kind: z.string(),
  status: statusSchema,
  computed: z.record(z.string(), computedValueSchema),
  checks: z.array(checkRowSchema),
  messages: z.array(z.string()),
});

export const orbitCheckResponseSchema = z.object({
  /** The contract version that produced these results. */
  contractVersion: z.number().int().optional(),
  /** The screening caution: every response carries it. */
  notice: z.string(),
  results: z.array(claimResultSchema),
  error: z.string().optional(),
  details: z.unknown().optional(),
});

export type BodyInput = z.infer<typeof bodySchema>;
export type ToleranceInput = z.infer<typeof toleranceSchema>;
export type ClaimInput = z.infer<typeof claimSchema>;
export type OrbitCheckRequest = z.infer<typeof orbitCheckRequestSchema>;
export type ClaimStatus = z.infer<typeof statusSchema>;
export type CheckRow = z.infer<typeof checkRowSchema>;
export type Hint = z.infer<typeof hintSchema>;
export type HintCode = z.infer<typeof hintCodeSchema>;
export type Basis = z.infer<typeof basisSchema>;
export type ClaimResult = z.infer<typeof claimResultSchema>;
export type OrbitCheckResponse = z.infer<typeof orbitCheckResponseSchema>;
export type ComputedValue = z.infer<typeof computedValueSchema>;

/** JSON Schema documents for the request and response (for the OpenAPI text). */
export function orbitCheckJsonSchemas(): { request: unknown; response: unknown } {
  return {
    request: z.toJSONSchema(orbitCheckRequestSchema, { unrepresentable: "any" }),
    response: z.toJSONSchema(orbitCheckResponseSchema, { unrepresentable: "any" }),
  };
}
