/**
 * The default decision letter of a board (used until the chair saves the board's own in
 * Settings → Letter), outcome wording, and the merge values of one decision. Pure.
 */
import type { MergeValues } from "./merge-fields";

export const OUTCOMES = ["accept", "revise", "decline"] as const;
export type Outcome = (typeof OUTCOMES)[number];

export const OUTCOME_LABELS: Record<Outcome, string> = {
  accept: "accepted",
  revise: "revise and resubmit",
  decline: "declined",
};

/** Button and heading wording for the chair's choice. */
export const OUTCOME_CHOICES: Record<Outcome, string> = {
  accept: "Accept",
  revise: "Revise and resubmit",
  decline: "Decline",
};

const p = (text: string) => ({ type: "paragraph", content: text ? [{ type: "text", text }] : [] });

/** A plain, factual letter in VisViva's own words; every sentence can be edited per board. */
export const DEFAULT_LETTER_TEMPLATE: Record<string, unknown> = {
  type: "doc",
  content: [
    p("Dear {{proposer.name}},"),
    p(
      "The {{board.name}} has closed its review of version {{version.number}} of “{{proposal.title}}”, submitted on {{version.submittedOn}} to {{call.title}}.",
    ),
    {
      type: "paragraph",
      content: [
        { type: "text", text: "Outcome: " },
        { type: "text", text: "{{decision.outcome}}", marks: [{ type: "bold" }] },
        { type: "text", text: "." },
      ],
    },
    p(
      "The panel returned {{reviews.submitted}} reviews; the mean of their weighted totals is {{score.weighted}} (spread {{score.spread}}). The server recomputed {{checks.total}} orbit claims of this version and flagged {{checks.flagged}}.",
    ),
    p("Values the server found outside tolerance, with the likely slip:"),
    p("{{checks.flaggedDetails}}"),
    p("{{checks.meaning}}"),
    p("The board asks you to consider these review items:"),
    p("{{reviewItems.selected}}"),
    p("The full reviews and review items are open to you on VisViva. A copy of this letter is attached as a PDF."),
    {
      type: "paragraph",
      content: [
        { type: "text", text: "With kind regards," },
        { type: "hardBreak" },
        { type: "text", text: "{{chair.name}}" },
        { type: "hardBreak" },
        { type: "text", text: "Chair, {{board.name}}" },
      ],
    },
  ],
};

export interface MergeFacts {
  proposalTitle: string;
  missionType: string;
  proposerName: string;
  boardName: string;
  callTitle: string;
  versionNumber: number;
  versionSubmittedAt: Date;
  outcome: Outcome;
  decidedAt: Date;
  weightedMean: number | null;
  spread: number | null;
  reviewsSubmitted: number;
  reviewsRequired: number;
  /** "[major] Title: body" lines of the items the chair selected. */
  selectedItems: string[];
  openItemCount: number;
  checksTotal: number;
  checksFlagged: number;
  /** Failing checks as sentences with their hint (lib/dossier/verdict-text.ts); empty when none. */
  checksFlaggedDetails?: string[];
  /** What "consistent" means, with the policy the checks were found under. */
  checksMeaning?: string;
  chairName: string;
}

const isoDate = (d: Date) => d.toISOString().slice(0, 10);
const twoDecimals = (n: number | null) => (n === null ? "not available" : n.toFixed(2));

export function mergeValues(f: MergeFacts): MergeValues {
  return {
    "proposal.title": f.proposalTitle,
    "proposal.missionType": f.missionType || "not stated",
    "proposer.name": f.proposerName,
    "board.name": f.boardName,
    "call.title": f.callTitle,
    "version.number": String(f.versionNumber),
    "version.submittedOn": isoDate(f.versionSubmittedAt),
    "decision.outcome": OUTCOME_LABELS[f.outcome],
    "decision.date": isoDate(f.decidedAt),
    "score.weighted": twoDecimals(f.weightedMean),
    "score.spread": twoDecimals(f.spread),
    "reviews.submitted": String(f.reviewsSubmitted),
    "reviews.required": String(f.reviewsRequired),
    "reviewItems.selected": f.selectedItems,
    "reviewItems.openCount": String(f.openItemCount),
    "checks.total": String(f.checksTotal),
    "checks.flagged": String(f.checksFlagged),
    "checks.flaggedDetails": f.checksFlaggedDetails ?? [],
    "checks.meaning": f.checksMeaning ?? "",
    "chair.name": f.chairName,
  };
}

export function reviewItemLine(item: { severity: string; title: string; body: string }): string {
  const body = item.body.trim().replace(/\s+/g, " ");
  return `[${item.severity}] ${item.title.trim()}${body ? `: ${body.length > 400 ? `${body.slice(0, 399)}…` : body}` : ""}`;
}
