/**
 * The default decision letter of a board (used until the chair saves the board's own in
 * Settings → Letter), outcome wording, and the merge values of one decision. Pure.
 */
import type { MergeValues } from "./merge-fields";
import { formatDate } from "@/lib/format/dates";

export const OUTCOMES = ["accept", "revise", "decline"] as const;
export type Outcome = (typeof OUTCOMES)[number];

export const OUTCOME_LABELS: Record<Outcome, string> = {
  accept: "accepted",
  revise: "revise and resubmit",
  decline: "declined",
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
    p("{{reviews.summary}} {{checks.summary}}"),
    p("Values the server found outside tolerance, with the likely slip:"),
    p("{{checks.flaggedDetails}}"),
    p("{{checks.meaning}}"),
    p("The board asks you to consider these review items:"),
    p("{{reviewItems.selected}}"),
    p("{{reviews.whereToRead}} A copy of this letter is attached as a PDF."),
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
  /** Claimed values across the version's orbit-check blocks (not the number of blocks). */
  checksTotal: number;
  /** Claims found inconsistent or that could not be evaluated. */
  checksFlagged: number;
  checksInconsistent?: number;
  checksInvalid?: number;
  /** "<claim>: <requirement> — <reason>" for each requirement not met (second verdict axis). */
  requirementsNotMet?: string[];
  /** Failing checks as sentences with their hint (lib/dossier/verdict-text.ts); empty when none. */
  checksFlaggedDetails?: string[];
  /** What "consistent" means, with the policy the checks were found under. */
  checksMeaning?: string;
  chairName: string;
}

const count = (n: number, one: string, many: string) => `${n === 1 ? "one" : n} ${n === 1 ? one : many}`;

/** One sentence on the reviews, worded for none, one and several. */
export function reviewsSentence(f: Pick<MergeFacts, "reviewsSubmitted" | "weightedMean" | "spread">): string {
  if (f.reviewsSubmitted === 0) return "The board took this decision without written reviews from the panel.";
  if (f.reviewsSubmitted === 1) return `The panel returned one review; its weighted total is ${twoDecimals(f.weightedMean)}.`;
  return `The panel returned ${f.reviewsSubmitted} reviews; the mean of their weighted totals is ${twoDecimals(f.weightedMean)}${f.spread === null ? "" : ` (spread ${twoDecimals(f.spread)})`}.`;
}

/** One sentence on the recomputed orbit claims, counting claims, not blocks. */
export function checksSentence(f: Pick<MergeFacts, "checksTotal" | "checksFlagged" | "checksInconsistent" | "checksInvalid">): string {
  if (f.checksTotal === 0) return "This version states no orbit claims for the server to recompute.";
  if (f.checksFlagged === 0)
    return f.checksTotal === 1
      ? "The server recomputed the one orbit claim of this version and found it consistent."
      : `The server recomputed all ${f.checksTotal} orbit claims of this version and found them consistent.`;
  const inconsistent = f.checksInconsistent ?? f.checksFlagged;
  const invalid = f.checksInvalid ?? 0;
  const what =
    inconsistent > 0 && invalid > 0
      ? `flagged ${f.checksFlagged}: ${inconsistent} inconsistent and ${invalid} that could not be evaluated`
      : invalid > 0
        ? `could not evaluate ${invalid}`
        : `flagged ${inconsistent} as inconsistent`;
  return `The server checked the ${count(f.checksTotal, "orbit claim", "orbit claims")} of this version and ${what}.`;
}

/** Where the proposers read more: only what exists is promised. */
export function whereToReadSentence(f: Pick<MergeFacts, "reviewsSubmitted" | "selectedItems" | "openItemCount">): string {
  if (f.reviewsSubmitted > 0) return "The full reviews and review items are open to you on VisViva.";
  if (f.selectedItems.length > 0 || f.openItemCount > 0) return "The review items raised on this version are open to you on VisViva.";
  return "No written reviews accompany this decision.";
}

const isoDate = (d: Date) => formatDate(d);
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
    "reviews.summary": reviewsSentence(f),
    "checks.summary": checksSentence(f),
    "reviews.whereToRead": whereToReadSentence(f),
    "requirements.notMetCount": String(f.requirementsNotMet?.length ?? 0),
    "requirements.notMet":
      f.requirementsNotMet && f.requirementsNotMet.length > 0 ? f.requirementsNotMet : ["none: every requirement judged was met or not evaluated"],
    "checks.flaggedDetails": f.checksFlaggedDetails ?? [],
    "checks.meaning": f.checksMeaning ?? "",
    "chair.name": f.chairName,
  };
}

export function reviewItemLine(item: { severity: string; title: string; body: string }): string {
  const body = item.body.trim().replace(/\s+/g, " ");
  return `[${item.severity}] ${item.title.trim()}${body ? `: ${body.length > 400 ? `${body.slice(0, 399)}…` : body}` : ""}`;
}
