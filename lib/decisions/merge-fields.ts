/**
 * Merge fields of decision letters. Syntax: a field name in double braces, e.g.
 * `{{proposal.title}}` (spaces inside the braces are allowed: `{{ proposal.title }}`).
 * Names are case-sensitive and come from MERGE_FIELDS below; anything else in double
 * braces is an unknown field and the letter is refused (422) naming it. A paragraph that
 * holds nothing but a list field (`{{reviewItems.selected}}`) becomes a bulleted list;
 * inside running text the list is written inline, separated by semicolons. Pure.
 */
import { blockText, mergeRuns, type LetterBlock, type LetterRun } from "./letter";

export interface MergeFieldInfo {
  name: string;
  description: string;
  /** Expands to several entries (a list) rather than one value. */
  list?: boolean;
}

export const MERGE_FIELDS: readonly MergeFieldInfo[] = [
  { name: "proposal.title", description: "Title of the proposal as submitted in this version" },
  { name: "proposal.missionType", description: "Mission type the proposers gave" },
  { name: "proposer.name", description: "Name of the proposal's owner" },
  { name: "board.name", description: "Name of the review board" },
  { name: "call.title", description: "Title of the call the proposal answers" },
  { name: "version.number", description: "Number of the version under decision" },
  { name: "version.submittedOn", description: "Date that version was submitted (for example 2 Dec 2026 (UTC))" },
  { name: "decision.outcome", description: "accepted / revise and resubmit / declined" },
  { name: "decision.date", description: "Date of the decision (for example 2 Dec 2026 (UTC))" },
  { name: "score.weighted", description: "Mean of the reviewers' weighted totals, two decimals" },
  { name: "score.spread", description: "Sample standard deviation of those totals, two decimals" },
  { name: "reviews.submitted", description: "Number of submitted reviews of this version" },
  { name: "reviews.required", description: "Number of reviews the call asks for" },
  { name: "reviewItems.selected", description: "The review items the chair ticked, one per line", list: true },
  { name: "reviewItems.openCount", description: "Number of review items still open on this version" },
  { name: "checks.total", description: "Number of orbit claims (claimed values, not blocks) the server recomputed" },
  { name: "checks.flagged", description: "Number of those claims found inconsistent or that could not be evaluated" },
  { name: "reviews.summary", description: "A sentence on the submitted reviews, worded for none, one or several" },
  { name: "checks.summary", description: "A sentence on the recomputed orbit claims and how many were flagged" },
  { name: "reviews.whereToRead", description: "A sentence saying where the reviews and items can be read (only what exists)" },
  { name: "requirements.notMetCount", description: "Number of the call's requirements not met on the claims of this version" },
  { name: "requirements.notMet", description: "Each requirement not met: the claim, the requirement and why, one per line", list: true },
  {
    name: "checks.flaggedDetails",
    description: "Each value the server found outside tolerance, as a sentence with the likely slip, one per line",
    list: true,
  },
  { name: "checks.meaning", description: "What a consistent verdict means (and does not), with the call's tolerance policy" },
  { name: "chair.name", description: "Name of the chair issuing the decision" },
];

const KNOWN = new Map(MERGE_FIELDS.map((f) => [f.name, f]));

export type MergeValues = Record<string, string | string[]>;

const FIELD = /\{\{([^{}]*)\}\}/g;

/** Every field name used in the letter, in order of first use, trimmed. */
export function mergeFieldsIn(blocks: LetterBlock[]): string[] {
  const seen = new Set<string>();
  const scan = (runs: LetterRun[]) => {
    for (const match of blockText(runs).matchAll(FIELD)) seen.add((match[1] ?? "").trim());
  };
  for (const b of blocks) {
    if (b.type === "list") b.items.forEach(scan);
    else if (b.type !== "rule") scan(b.runs);
  }
  return [...seen];
}

/** Field names the letter uses that VisViva does not know. */
export function unknownMergeFields(blocks: LetterBlock[]): string[] {
  return mergeFieldsIn(blocks).filter((name) => !KNOWN.has(name));
}

function valueText(value: string | string[] | undefined): string {
  if (value === undefined) return "";
  return Array.isArray(value) ? (value.length ? value.join("; ") : "none") : value;
}

function substitute(runs: LetterRun[], values: MergeValues): LetterRun[] {
  return mergeRuns(runs).map((run) => ({ ...run, text: run.text.replace(FIELD, (_m, name: string) => valueText(values[name.trim()])) }));
}

function listFieldAlone(runs: LetterRun[]): string | null {
  const match = blockText(runs)
    .trim()
    .match(/^\{\{\s*([\w.]+)\s*\}\}$/);
  const name = match?.[1];
  return name && KNOWN.get(name)?.list ? name : null;
}

/** The letter with every field replaced. Call unknownMergeFields first: unknown fields become empty. */
export function applyMergeFields(blocks: LetterBlock[], values: MergeValues): LetterBlock[] {
  const out: LetterBlock[] = [];
  for (const b of blocks) {
    if (b.type === "paragraph") {
      const listName = listFieldAlone(b.runs);
      if (listName) {
        const entries = values[listName];
        const items = Array.isArray(entries) ? entries : entries ? [entries] : [];
        out.push(items.length ? { type: "list", ordered: false, items: items.map((text) => [{ text }]) } : { type: "paragraph", runs: [{ text: "none" }] });
        continue;
      }
      out.push({ type: "paragraph", runs: substitute(b.runs, values) });
    } else if (b.type === "heading" || b.type === "quote") {
      out.push({ ...b, runs: substitute(b.runs, values) });
    } else if (b.type === "list") {
      out.push({ ...b, items: b.items.map((item) => substitute(item, values)) });
    } else {
      out.push(b);
    }
  }
  return out;
}
