import "server-only";
import type { Tx } from "@/lib/dal/transaction";
import { env } from "@/lib/env";
import { enqueueMail } from "./outbox";
import { renderReviewerAssignment, renderSubmissionReceipt } from "./templates/notices";

/**
 * Product notices other areas enqueue inside their own transactions. Each has a dedupe key
 * naming the event, so a retried request never mails twice.
 */

export interface SubmissionReceiptInput {
  boardId: string;
  proposalId: string;
  versionId: string;
  versionNumber: number;
  boardName: string;
  callTitle: string;
  proposalTitle: string;
  submittedAt: Date;
  /** The owner and co-authors. */
  to: string[];
}

/** Receipt to the authors for a submitted version (dedupe key "submission-receipt:<versionId>"). */
export async function enqueueSubmissionReceipt(tx: Tx, input: SubmissionReceiptInput) {
  const mail = await renderSubmissionReceipt({
    ...input,
    url: `${env().APP_URL}/boards/${input.boardId}/proposals/${input.proposalId}/versions/${input.versionNumber}`,
  });
  return enqueueMail({ kind: "submission-receipt", dedupeKey: `submission-receipt:${input.versionId}`, to: input.to, boardId: input.boardId, ...mail }, tx);
}

export interface ReviewerAssignmentInput {
  assignmentId: string;
  boardId: string;
  proposalId: string;
  boardName: string;
  proposalTitle: string;
  versionNumber: number;
  dueAt: Date;
  to: string;
  /** A re-assignment to a resubmitted version. */
  resubmission?: boolean;
}

/** Tells a reviewer of a new assignment (dedupe key "assignment:<assignmentId>"). */
export async function enqueueReviewerAssignment(tx: Tx, input: ReviewerAssignmentInput) {
  const mail = await renderReviewerAssignment({ ...input, url: `${env().APP_URL}/boards/${input.boardId}/proposals/${input.proposalId}/review` });
  return enqueueMail({ kind: "reviewer-assignment", dedupeKey: `assignment:${input.assignmentId}`, to: [input.to], boardId: input.boardId, ...mail }, tx);
}
