import { renderMail } from "./layout";
import { formatDateTime } from "@/lib/format/dates";

/** The three e-mails of a call's response window, to the authors of one proposal (closing: also to its reviewers). */
export function renderResponseWindowMail(input: {
  stage: "opening" | "reminder" | "closing";
  audience: "proposer" | "reviewer";
  boardName: string;
  callTitle: string;
  proposalTitle: string;
  closesAt: Date;
  itemCount: number;
  unanswered: number;
  url: string;
}) {
  const ends = formatDateTime(input.closesAt);
  const items = `${input.itemCount} review item${input.itemCount === 1 ? "" : "s"}`;
  if (input.stage === "opening")
    return renderMail({
      subject: `Answer the review items on “${input.proposalTitle}” by ${ends}`,
      preview: `The response round of ${input.callTitle} is open until ${ends}.`,
      heading: "The response round is open",
      paragraphs: [
        `${input.boardName} has opened the response round of the call “${input.callTitle}”. The reviewers raised ${items} on “${input.proposalTitle}” so far; you can now read them and answer each one.`,
        `An answer may point at a section of a newer version of your dossier. Answers can be changed until the round closes on ${ends}.`,
      ],
      action: { label: "Read and answer the review items", url: input.url },
      footnote: "You receive this because you are an author of this proposal. Reviewers stay anonymous.",
    });
  if (input.stage === "reminder")
    return renderMail({
      subject: `Two days left to answer the review items on “${input.proposalTitle}”`,
      preview: `The response round closes on ${ends}.`,
      heading: "The response round closes in two days",
      paragraphs: [
        `The response round of “${input.callTitle}” closes on ${ends}. ${input.unanswered} of the ${items} on “${input.proposalTitle}” ${input.unanswered === 1 ? "has" : "have"} no answer yet.`,
      ],
      action: { label: "Answer the review items", url: input.url },
      footnote: "You receive this because you are an author of this proposal. This reminder goes out once, two days before the round closes.",
    });
  return renderMail({
    subject: `Response round closed: “${input.proposalTitle}”`,
    preview: `Closed on ${ends}.`,
    heading: "The response round has closed",
    paragraphs:
      input.audience === "proposer"
        ? [
            `The response round of “${input.callTitle}” closed on ${ends}. Your answers to the review items on “${input.proposalTitle}” are with the panel and can no longer be changed.`,
          ]
        : [
            `The response round of “${input.callTitle}” closed on ${ends}. The proposers answered ${input.itemCount - input.unanswered} of the ${items} on “${input.proposalTitle}”.`,
            "Please record a disposition for each item you raised.",
          ],
    action: { label: input.audience === "proposer" ? "Read your answers" : "Record dispositions", url: input.url },
    footnote:
      input.audience === "proposer" ? "You receive this because you are an author of this proposal." : "You receive this because you reviewed this proposal.",
  });
}
