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
  })
  .describe("constants that override the table for this claim");

export const bodySchema = z.union([bodyNameSchema, bodyOverrideSchema]);

export const toleranceSchema = z
  .strictObject({
    relative: finite.nonnegative().optional().describe("relative tolerance, default 0.01"),
    absolute: z.record(z.string(), finite.nonnegative()).optional().describe('absolute tolerance per unit, e.g. { "km": 1 }'),
  })
  .describe("a quantity passes when it is within either bound");

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

/** A table computed for plots and reports (e.g. a decay profile, budget phases); not claimable as one value. */
const computedTableSchema = z.array(z.record(z.string(), z.union([finite, z.string(), z.boolean()])));

const computedValueSchema = z.union([finite, z.string(), z.boolean(), vectorSchema, computedTableSchema]);

export const checkRowSchema = z.object({
  quantity: z.string(),
  claimed: z.unknown(),
  computed: z.unknown(),
  unit: z.string(),
  relativeError: finite.nullable(),
  absoluteError: finite.nullable(),
  ok: z.boolean(),
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
