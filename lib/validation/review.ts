/** zod schemas of the review area, shared by the forms, the route handlers and the OpenAPI document. */
import { z } from "zod";
import { REVIEWER_LEVELS } from "@/lib/review/responses";

export const uuid = z.uuid({ message: "must be an id" });

export const rubricCriterionInput = z.object({
  id: z
    .string()
    .trim()
    .min(1, "needs an id")
    .max(60)
    .regex(/^[a-z0-9][a-z0-9-]*$/, "use lower-case letters, digits and hyphens"),
  title: z.string().trim().min(1, "needs a title").max(200),
  description: z.string().trim().max(4000).default(""),
  weight: z.number({ message: "must be a number" }).gt(0, "must be above 0 %").max(100, "cannot exceed 100 %"),
  scaleMin: z.number().int().min(0).max(10),
  scaleMax: z.number().int().min(1).max(10),
  levels: z.array(z.string().trim().min(1, "each level needs a descriptor").max(300)).min(2).max(11),
  commentRequiredBelow: z.number().int().min(0).max(11).nullable().default(null),
});

export const rubricInput = z.object({
  name: z.string().trim().min(1, "needs a name").max(200),
  criteria: z.array(rubricCriterionInput).min(1, "needs at least one criterion").max(30),
});
export type RubricInput = z.infer<typeof rubricInput>;

export const conflictInput = z
  .object({
    proposalId: uuid.nullable().optional(),
    organisation: z.string().trim().max(200).nullable().optional(),
    reason: z.string().trim().min(3, "give a short reason").max(2000),
  })
  .refine((v) => Boolean(v.proposalId) !== Boolean(v.organisation && v.organisation.length > 0), {
    message: "Declare a conflict with either one proposal or one organisation.",
    path: ["proposalId"],
  });
export type ConflictInput = z.infer<typeof conflictInput>;

export const assignInput = z.object({
  proposalIds: z.array(uuid).min(1, "pick at least one proposal").max(200),
  reviewerIds: z.array(uuid).min(1, "pick at least one reviewer").max(50),
  dueAt: z.coerce.date({ message: "must be a date" }),
  /** The chair read the likely-conflict warnings (same e-mail domain) and assigns anyway. */
  confirmLikelyConflicts: z.boolean().default(false),
});
export type AssignInput = z.infer<typeof assignInput>;

export const criterionScore = z.object({
  score: z.number({ message: "must be a number" }).nullable(),
  comment: z.string().max(8000, "keep a comment under 8000 characters").default(""),
});

export const reviewDraftInput = z.object({
  revision: z.number().int().min(0),
  scores: z.record(z.string().max(60), criterionScore),
  summary: z.string().max(20000).default(""),
  /** The reviewer's confidence in their judgement and expertise in the subject; omitted: unchanged. */
  confidence: z.enum(REVIEWER_LEVELS, "choose low, medium or high").nullable().optional(),
  expertise: z.enum(REVIEWER_LEVELS, "choose low, medium or high").nullable().optional(),
});
export type ReviewDraftInput = z.infer<typeof reviewDraftInput>;

export const reviewSubmitInput = z.object({ revision: z.number().int().min(0) });

export const reopenInput = z.object({ reason: z.string().trim().min(3, "say why the review is reopened").max(2000) });

export const checkNoteInput = z.object({ note: z.string().trim().max(4000) });

export const anchorInput = z.object({
  from: z.number().int(),
  to: z.number().int(),
  quote: z.string().min(1, "select some text").max(4000),
  prefix: z.string().max(200).default(""),
  suffix: z.string().max(200).default(""),
});

export const reviewItemInput = z.object({
  proposalId: uuid,
  severity: z.enum(["major", "minor", "comment"]),
  title: z.string().trim().min(1, "needs a title").max(200),
  body: z.string().trim().min(1, "needs a body").max(20000),
  anchor: anchorInput,
});
export type ReviewItemInput = z.infer<typeof reviewItemInput>;

export const reviewItemPatch = z.object({ status: z.enum(["open", "resolved"]) });
export const replyInput = z.object({ body: z.string().trim().min(1, "write a reply").max(20000) });

export const listItemsQuery = z.object({ proposalId: uuid });
export const callQuery = z.object({ callId: uuid });
export const reviewsQuery = z.object({ proposalId: uuid.optional() });
