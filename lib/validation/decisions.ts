import { z } from "zod";
import { decisionOutcomes } from "@/db/vocabulary";

/** A Tiptap JSON document (the letter); its nodes are checked and reduced by lib/decisions/letter.ts. */
export const letterDocument = z
  .object({ type: z.literal("doc", { message: 'must be a document (type "doc")' }), content: z.array(z.unknown()).max(2000, "has too many blocks") })
  .loose()
  .refine((doc) => JSON.stringify(doc).length <= 200_000, "is longer than 200 000 characters");

export const decisionOutcome = z.enum(decisionOutcomes, { message: "must be accept, revise or decline" });

export const decisionInput = z.object({
  outcome: decisionOutcome,
  letter: letterDocument,
  /** Review items of the version under decision to list in the letter ({{reviewItems.selected}}). */
  selectedReviewItemIds: z.array(z.uuid("must be review item ids")).max(200).default([]),
  /** Required when fewer reviews than the call asks for have been submitted. */
  overrideReason: z
    .string()
    .trim()
    .max(2000, "keep the reason under 2000 characters")
    .optional()
    .transform((v) => (v ? v : undefined)),
  /** Attach the version's review report (PDF, as the proposers read it) to the letter e-mail. */
  attachReport: z.boolean({ message: "must be true or false" }).default(false),
});
export type DecisionInput = z.infer<typeof decisionInput>;

/** The preview takes the same fields; the outcome is optional while the chair has not chosen. */
export const decisionPreviewInput = decisionInput.extend({ outcome: decisionOutcome.default("revise") });
export type DecisionPreviewInput = z.infer<typeof decisionPreviewInput>;

export const outboxListQuery = z.object({
  status: z.enum(["queued", "sending", "sent", "failed"]).optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
  offset: z.coerce.number().int().min(0).default(0),
});
export type OutboxListQuery = z.infer<typeof outboxListQuery>;

export const compareQuery = z.object({
  from: z.coerce.number().int().min(1, "must be a version number"),
  to: z.coerce.number().int().min(1, "must be a version number"),
});

export const MIN_OVERRIDE_REASON = 10;

export const letterDownloadQuery = z.object({
  redirect: z
    .enum(["0", "1"], { message: "must be 0 or 1" })
    .optional()
    .transform((v) => v === "1"),
});

export const reassignInput = z.object({
  boardId: z.uuid(),
  proposalId: z.uuid(),
  /** Due date of the new reviews; two weeks from now when left out. */
  dueAt: z.coerce.date({ message: "must be a date" }).optional(),
});
