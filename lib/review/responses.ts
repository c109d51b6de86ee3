// Plain labels of the response round (pure, shared by screens, e-mails and the API docs).
// No imports from db/: client components use these.

/** Our own plain labels for what became of a review item (codes stored in review_item_dispositions). */
export const DISPOSITION_CODES = ["agreed", "fix-next-version", "not-accepted", "closed"] as const;
export type DispositionCode = (typeof DISPOSITION_CODES)[number];

/** Three levels for a reviewer's confidence and expertise (stored in reviews.confidence / expertise). */
export const REVIEWER_LEVELS = ["low", "medium", "high"] as const;
export type ReviewerLevel = (typeof REVIEWER_LEVELS)[number];

export const DISPOSITION_LABELS: Record<DispositionCode, string> = {
  agreed: "Agreed",
  "fix-next-version": "Will be fixed in the next version",
  "not-accepted": "Not accepted",
  closed: "Closed",
};

export const DISPOSITION_HELP: Record<DispositionCode, string> = {
  agreed: "The answer settles the item.",
  "fix-next-version": "The proposer will change the dossier in the next version.",
  "not-accepted": "The answer does not settle the item; say why.",
  closed: "Nothing more is needed on this item.",
};

export const CONFIDENCE_LABELS: Record<ReviewerLevel, string> = {
  low: "Low: I may have misjudged parts of this",
  medium: "Medium: fairly sure of my judgement",
  high: "High: sure of my judgement",
};

export const EXPERTISE_LABELS: Record<ReviewerLevel, string> = {
  low: "Outside my field",
  medium: "Working knowledge of the subject",
  high: "Specialist in the subject",
};

export const LEVEL_SHORT: Record<ReviewerLevel, string> = { low: "low", medium: "medium", high: "high" };

/** Maximum lengths of the round's texts (characters). */
export const ANSWER_MAX = 8000;
export const REASON_MAX = 2000;

export type WindowState = "upcoming" | "open" | "closed";

export function windowState(w: { opensAt: Date | string; closesAt: Date | string }, now = new Date()): WindowState {
  const opens = new Date(w.opensAt).getTime();
  const closes = new Date(w.closesAt).getTime();
  if (now.getTime() < opens) return "upcoming";
  if (now.getTime() >= closes) return "closed";
  return "open";
}
