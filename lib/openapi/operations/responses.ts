import { z } from "zod";
import { defineOperations } from "../registry";
import { answerInput, dispositionHistorySchema, dispositionInput, responseWindowInput, responseWindowSchema } from "@/lib/validation/responses";
import { reviewItemSchema } from "./review";

const board = "/api/v1/boards/{boardId}";

/** The response round: the call's window (chairs set it), proposers' answers, dispositions with history. */
export const responseOperations = defineOperations([
  {
    method: "get",
    path: `${board}/calls/{callId}/response-window`,
    operationId: "getResponseWindow",
    summary: "The call's response window and which of its e-mails went out (every member; null when none is set)",
    tag: "response round",
    access: "signed-in",
    response: z.object({ window: responseWindowSchema.nullable() }),
  },
  {
    method: "put",
    path: `${board}/calls/{callId}/response-window`,
    operationId: "setResponseWindow",
    summary:
      'Open the response window or move its dates (chairs). Dates in UTC as people write them ("12 Dec 2026", "2026-12-12 14:00") or ISO 8601; a bare end date means the end of that day. Mails the proposers when it opens.',
    tag: "response round",
    access: "signed-in",
    body: responseWindowInput,
    response: z.object({ window: responseWindowSchema }),
    errors: { 422: "The end is not after the start, or has passed" },
  },
  {
    method: "post",
    path: `${board}/calls/{callId}/response-window/close`,
    operationId: "closeResponseWindow",
    summary: "Close the response window now (chairs); the closing e-mails go out",
    tag: "response round",
    access: "signed-in",
    response: z.object({ window: responseWindowSchema }),
    errors: { 409: "The window has closed already" },
  },
  {
    method: "put",
    path: `${board}/review-items/{itemId}/answer`,
    operationId: "answerReviewItem",
    summary:
      "Answer a review item on your proposal while the call's response window is open (proposal authors); may point at a section heading of a newer version. Replaces an earlier answer.",
    tag: "response round",
    access: "signed-in",
    body: answerInput,
    response: z.object({ item: reviewItemSchema }),
    errors: { 409: "The response window is not open, or the version is decided", 422: "The section is not a heading of a newer version" },
  },
  {
    method: "get",
    path: `${board}/review-items/{itemId}/dispositions`,
    operationId: "listDispositions",
    summary: "An item's disposition history, oldest first: who (by the blind rules), when, why",
    tag: "response round",
    access: "signed-in",
    response: dispositionHistorySchema,
  },
  {
    method: "post",
    path: `${board}/review-items/{itemId}/dispositions`,
    operationId: "recordDisposition",
    summary:
      'Record what became of an item (the reviewer who raised it, or the chair): agreed, fix-next-version ("will be fixed in the next version"), not-accepted (reason required) or closed. Appends to the history.',
    tag: "response round",
    access: "signed-in",
    body: dispositionInput,
    response: z.object({ item: reviewItemSchema }),
    errors: { 409: "The version is decided", 422: "Not accepted without a reason" },
  },
]);
