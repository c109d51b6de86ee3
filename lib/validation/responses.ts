/** zod schemas of the response round, shared by the forms, the route handlers and the OpenAPI document. */
import { z } from "zod";
import { parseWrittenDate, type DateEdge } from "@/lib/format/parse-date";
import { ANSWER_MAX, DISPOSITION_CODES as dispositionCodes, REASON_MAX, REVIEWER_LEVELS as reviewerLevels } from "@/lib/review/responses";

const writtenDate = (edge: DateEdge) =>
  z
    .string("enter a date such as 12 Dec 2026")
    .max(60, "is too long for a date")
    .transform((text, ctx) => {
      const parsed = parseWrittenDate(text, edge);
      if (!parsed.ok) {
        ctx.addIssue({ code: "custom", message: parsed.error });
        return z.NEVER;
      }
      return parsed.date;
    });

/** The chair's window: dates as people write them ("12 Dec 2026", "2026-12-12 14:00") or ISO 8601; UTC. A bare end date means the end of that day. */
export const responseWindowInput = z
  .strictObject({
    opensAt: writtenDate("start"),
    closesAt: writtenDate("end"),
  })
  .refine((w) => w.closesAt.getTime() > w.opensAt.getTime(), { message: "The response window must end after it starts.", path: ["closesAt"] });
export type ResponseWindowInput = z.infer<typeof responseWindowInput>;

export const responseWindowSchema = z.object({
  id: z.uuid(),
  callId: z.uuid(),
  opensAt: z.string(),
  closesAt: z.string(),
  state: z.enum(["upcoming", "open", "closed"]),
  openingMailedAt: z.string().nullable(),
  reminderMailedAt: z.string().nullable(),
  closingMailedAt: z.string().nullable(),
});

export const answerInput = z.strictObject({
  body: z.string("write an answer").trim().min(1, "Write an answer before saving.").max(ANSWER_MAX, `Keep an answer under ${ANSWER_MAX} characters.`),
  sectionVersionId: z.uuid("must be a version id").nullable().optional(),
  sectionHeading: z.string().trim().max(200, "Section headings are at most 200 characters.").nullable().optional(),
});
export type AnswerInputBody = z.infer<typeof answerInput>;

export const dispositionInput = z
  .strictObject({
    disposition: z.enum(dispositionCodes, `choose one of: ${dispositionCodes.join(", ")}`),
    reason: z.string().trim().max(REASON_MAX, `Keep the reason under ${REASON_MAX} characters.`).default(""),
  })
  .refine((d) => d.disposition !== "not-accepted" || d.reason.length > 0, {
    message: "Say why the answer is not accepted: a reason is required.",
    path: ["reason"],
  });
export type DispositionInputBody = z.infer<typeof dispositionInput>;

export const reviewerLevelSchema = z.enum(reviewerLevels);

const dispositionEntrySchema = z.object({
  id: z.uuid(),
  disposition: z.enum(dispositionCodes),
  label: z.string(),
  reason: z.string(),
  actorRole: z.enum(["reviewer", "chair"]),
  actorLabel: z.string(),
  mine: z.boolean(),
  createdAt: z.string(),
});
export const dispositionHistorySchema = z.object({ history: z.array(dispositionEntrySchema) });
