import { z } from "zod";
import { defineOperations } from "../registry";
import { decisionInput, decisionPreviewInput, letterDownloadQuery, outboxListQuery } from "@/lib/validation/decisions";

const board = "/api/v1/boards/{boardId}";

const decision = z.object({
  id: z.uuid(),
  proposalId: z.uuid(),
  versionNumber: z.number().int(),
  outcome: z.enum(["accept", "revise", "decline"]),
  outcomeLabel: z.string(),
  letterHtml: z.string(),
  letterText: z.string(),
  weightedScore: z.number().nullable(),
  overrideReason: z.string().nullable().describe("The chair's reason for deciding without the required reviews (chair only)"),
  decidedAt: z.string(),
  decidedByName: z.string().nullable(),
  hasPdf: z.boolean(),
  hasReportPdf: z.boolean().describe("The review report PDF went with the letter e-mail"),
  mail: z
    .object({
      status: z.string(),
      attempts: z.number().int(),
      lastError: z.string().nullable(),
      nextAttemptAt: z.string().nullable(),
      sentAt: z.string().nullable(),
    })
    .nullable()
    .describe("The letter e-mail's outbox state (chair only)"),
});

const outboxRow = z.object({
  id: z.uuid(),
  kind: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  boardName: z.string().nullable(),
  status: z.enum(["queued", "sending", "sent", "failed"]),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  attachments: z.number().int(),
  createdAt: z.string(),
  sentAt: z.string().nullable(),
  nextAttemptAt: z.string(),
});

export const decisionOperations = defineOperations([
  {
    method: "get",
    path: `${board}/proposals/{proposalId}/decision`,
    operationId: "listProposalDecisions",
    summary: "Decisions on a proposal's versions, newest first (the chair; the authors once issued)",
    tag: "decisions",
    access: "signed-in",
    response: z.object({ decisions: z.array(decision) }),
  },
  {
    method: "post",
    path: `${board}/proposals/{proposalId}/decision`,
    operationId: "createDecision",
    summary:
      "Decide on the latest version (chair). Writes the decision, the proposal's status and the letter e-mail (with the PDF) in one transaction. The letter is Tiptap JSON with merge fields such as {{proposal.title}}.",
    tag: "decisions",
    access: "signed-in",
    body: decisionInput,
    response: z.object({ decision }),
    errors: {
      409: "The version is already decided, or the proposal is not in a state to be decided",
      422: "Unknown merge field in the letter (details.unknownFields), empty letter, or fewer submitted reviews than the call requires without an override reason",
    },
  },
  {
    method: "post",
    path: `${board}/proposals/{proposalId}/decision/preview`,
    operationId: "previewDecision",
    summary: "The merged letter and its e-mail as the authors would receive them; nothing is stored",
    tag: "decisions",
    access: "signed-in",
    body: decisionPreviewInput,
    response: z.object({ preview: z.object({ subject: z.string(), html: z.string(), text: z.string(), letterHtml: z.string(), letterText: z.string() }) }),
    errors: { 409: "Nothing has been submitted yet", 422: "Unknown merge field in the letter, or an empty letter" },
  },
  {
    method: "get",
    path: `${board}/decisions/{decisionId}`,
    operationId: "getDecision",
    summary: "One decision (the chair, and the proposal's authors)",
    tag: "decisions",
    access: "signed-in",
    response: z.object({ decision }),
  },
  {
    method: "get",
    path: `${board}/decisions/{decisionId}/letter`,
    operationId: "getDecisionLetter",
    summary: "A five-minute download link for the letter PDF; with redirect=1 a 302 to it",
    tag: "decisions",
    access: "signed-in",
    query: letterDownloadQuery,
    response: z.object({ url: z.string(), filename: z.string(), expiresInSeconds: z.number().int() }),
  },
  {
    method: "get",
    path: "/api/v1/admin/outbox",
    operationId: "listOutbox",
    summary: "Every e-mail of the product with its delivery state, newest first (site admins)",
    tag: "outbox",
    access: "signed-in",
    query: outboxListQuery,
    response: z.object({
      rows: z.array(outboxRow),
      hasMore: z.boolean().describe("Whether another page follows (one extra row is fetched; the outbox is not counted per request)"),
      counts: z.record(z.string(), z.number().int()).describe("Messages per status, counted up to countLimit: a value at the limit means that many or more"),
      countLimit: z.number().int(),
    }),
  },
  {
    method: "post",
    path: "/api/v1/admin/outbox/{messageId}/requeue",
    operationId: "requeueOutboxMessage",
    summary: "Send a failed message again (site admins)",
    tag: "outbox",
    access: "signed-in",
    response: z.object({ message: z.object({ id: z.uuid(), status: z.literal("queued") }) }),
    errors: { 409: "The message has not failed (queued, sending or sent)" },
  },
]);
