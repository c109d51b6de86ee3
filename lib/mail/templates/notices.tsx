import { renderMail } from "./layout";
import { formatDateTime } from "@/lib/format/dates";
import { orbitCheckNotice } from "@/lib/dossier/verdict-text";

/** The decision letter e-mail: a short lead, the letter itself, and where to read more. */
export function renderDecisionMail(input: {
  boardName: string;
  proposalTitle: string;
  versionNumber: number;
  outcomeLabel: string;
  letterHtml: string;
  letterText: string;
  url: string;
}) {
  return renderMail({
    subject: `Decision on “${input.proposalTitle}” (version ${input.versionNumber}): ${input.outcomeLabel}`,
    preview: `${input.boardName} has decided: ${input.outcomeLabel}.`,
    heading: `Decision: ${input.outcomeLabel}`,
    paragraphs: [
      `${input.boardName} has decided on version ${input.versionNumber} of “${input.proposalTitle}”. The letter follows; the same letter is attached as a PDF.`,
    ],
    body: { html: input.letterHtml, text: input.letterText },
    action: { label: "Open the decision", url: input.url },
    // The orbit-check contract's notice: the letter may cite the server's verdicts.
    footnote: `You receive this because you are an author of this proposal. About the orbit checks: ${orbitCheckNotice()}`,
  });
}

export function renderSubmissionReceipt(input: {
  boardName: string;
  callTitle: string;
  proposalTitle: string;
  versionNumber: number;
  submittedAt: Date;
  url: string;
}) {
  const when = formatDateTime(input.submittedAt);
  return renderMail({
    subject: `Received: “${input.proposalTitle}”, version ${input.versionNumber}`,
    preview: `Version ${input.versionNumber} reached ${input.boardName}.`,
    heading: "Your dossier was received",
    paragraphs: [
      `Version ${input.versionNumber} of “${input.proposalTitle}” was submitted to ${input.callTitle} on ${when}.`,
      "This version is now frozen; the server has recomputed its orbit claims and the board can begin its review. You may keep editing a draft, which becomes the next version when you submit it.",
    ],
    action: { label: "View the submitted version", url: input.url },
    footnote: "You receive this because you are an author of this proposal.",
  });
}

export function renderReviewerAssignment(input: {
  boardName: string;
  proposalTitle: string;
  versionNumber: number;
  dueAt: Date;
  url: string;
  resubmission?: boolean;
}) {
  return renderMail({
    subject: `${input.resubmission ? "Resubmission to review" : "Review requested"}: “${input.proposalTitle}”`,
    preview: `Due ${formatDateTime(input.dueAt)}.`,
    heading: input.resubmission ? "A resubmitted dossier awaits your review" : "A dossier awaits your review",
    paragraphs: [
      input.resubmission
        ? `The proposers have resubmitted “${input.proposalTitle}” as version ${input.versionNumber} after the board's request for revision, and ${input.boardName} asks you to review it again.`
        : `${input.boardName} asks you to review version ${input.versionNumber} of “${input.proposalTitle}”.`,
      `Please submit your review by ${formatDateTime(input.dueAt)}. If you have a conflict of interest with this proposal, declare it before you open the dossier.`,
    ],
    action: { label: "Open the review", url: input.url },
    footnote: "You receive this because you are a reviewer on this board.",
  });
}

export function renderReviewReminder(input: { boardName: string; proposalTitle: string; dueAt: Date; daysLeft: number; url: string }) {
  const due = formatDateTime(input.dueAt);
  return renderMail({
    subject: `Review due ${input.daysLeft === 1 ? "tomorrow" : `in ${input.daysLeft} days`}: “${input.proposalTitle}”`,
    preview: `Due ${due}.`,
    heading: `Your review is due ${input.daysLeft === 1 ? "tomorrow" : `in ${input.daysLeft} days`}`,
    paragraphs: [`Your review of “${input.proposalTitle}” for ${input.boardName} is due on ${due}. It has not been submitted yet.`],
    action: { label: "Continue the review", url: input.url },
    footnote: "You receive this because you are assigned as a reviewer. Reminders go out three days and one day before the due date.",
  });
}
