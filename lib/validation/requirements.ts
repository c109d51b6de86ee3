import { z } from "zod";
import { REQUIREMENT_STATUSES, REQUIREMENT_TYPES, requirementType } from "@/lib/requirements";

const typeNames = REQUIREMENT_TYPES.map((d) => d.type) as [string, ...string[]];

/** A requirement the chair adds to a call: its type, parameters (checked by the type's own schema) and rationale. */
export const requirementBodySchema = z.strictObject({
  type: z.enum(typeNames, { error: `choose a requirement type: ${typeNames.join(", ")}` }).describe("the requirement type"),
  params: z.record(z.string(), z.unknown()).describe("parameters of the type, in contract units (fractions for margins, years, seconds)"),
  rationale: z
    .string()
    .trim()
    .max(2000, "keep the rationale under 2000 characters")
    .default("")
    .describe("shown to proposers; the type's own wording when empty"),
});

export const requirementInputSchema = requirementBodySchema.transform((input, ctx) => {
  const def = requirementType(input.type)!;
  const parsed = def.params.safeParse(input.params);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) ctx.addIssue({ code: "custom", message: issue.message, path: ["params", ...issue.path.map(String)] });
    return z.NEVER;
  }
  return { type: input.type, params: parsed.data as Record<string, unknown>, rationale: input.rationale || def.defaultRationale };
});
export type RequirementInput = z.output<typeof requirementInputSchema>;

export const requirementRowSchema = z.object({
  label: z.string(),
  actual: z.number().nullable(),
  required: z.number(),
  unit: z.string(),
  sense: z.enum(["min", "max"]),
  closeWithin: z.number(),
});

export const requirementOutcomeSchema = z.object({
  requirementId: z.string(),
  type: z.string(),
  title: z.string(),
  status: z.enum(REQUIREMENT_STATUSES),
  reason: z.string(),
  rows: z.array(requirementRowSchema),
});

export const callRequirementSchema = z.object({
  id: z.uuid(),
  callId: z.uuid(),
  type: z.string(),
  params: z.record(z.string(), z.unknown()),
  rationale: z.string(),
  summary: z.string(),
  createdAt: z.string(),
});
