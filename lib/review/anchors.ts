/**
 * Review-item anchors: character offsets into a version's plain text plus the quoted text
 * and a little context either side, so an anchor can be found again when the offsets no
 * longer fit (the dossier was re-rendered or its whitespace changed). Pure.
 */
import type { ReviewItemAnchor } from "@/db/schema/reviews";

export type Anchor = ReviewItemAnchor;

/** Characters of context kept either side of the quote. */
export const CONTEXT_LENGTH = 32;

export function makeAnchor(text: string, from: number, to: number, context = CONTEXT_LENGTH): Anchor {
  return {
    from,
    to,
    quote: text.slice(from, to),
    prefix: text.slice(Math.max(0, from - context), from),
    suffix: text.slice(to, to + context),
  };
}

/** Whether the offsets lie inside a text of this length and select at least one character. */
export function anchorInBounds(anchor: Pick<Anchor, "from" | "to">, textLength: number): boolean {
  return Number.isInteger(anchor.from) && Number.isInteger(anchor.to) && anchor.from >= 0 && anchor.to > anchor.from && anchor.to <= textLength;
}

export interface ResolvedAnchor {
  from: number;
  to: number;
  /** "exact": the stored offsets still hold the quote; "moved": found again by quote and context; "fuzzy": found ignoring whitespace differences. */
  match: "exact" | "moved" | "fuzzy";
}

function commonSuffixLength(a: string, b: string): number {
  let n = 0;
  while (n < a.length && n < b.length && a[a.length - 1 - n] === b[b.length - 1 - n]) n++;
  return n;
}

function commonPrefixLength(a: string, b: string): number {
  let n = 0;
  while (n < a.length && n < b.length && a[n] === b[n]) n++;
  return n;
}

function occurrences(haystack: string, needle: string): number[] {
  const found: number[] = [];
  if (needle === "") return found;
  let at = haystack.indexOf(needle);
  while (at >= 0) {
    found.push(at);
    at = haystack.indexOf(needle, at + 1);
  }
  return found;
}

/** Collapses whitespace runs to one space, keeping where each kept character came from. */
function collapseWhitespace(text: string): { text: string; origin: number[] } {
  let out = "";
  const origin: number[] = [];
  for (let i = 0; i < text.length; i++) {
    const ch = text[i]!;
    if (/\s/.test(ch)) {
      if (out.endsWith(" ")) continue;
      out += " ";
    } else out += ch;
    origin.push(i);
  }
  return { text: out, origin };
}

function best(text: string, anchor: Anchor, candidates: number[], quoteLength: number): number | undefined {
  let chosen: number | undefined;
  let bestScore = -Infinity;
  for (const at of candidates) {
    const context =
      commonSuffixLength(text.slice(Math.max(0, at - anchor.prefix.length), at), anchor.prefix) +
      commonPrefixLength(text.slice(at + quoteLength, at + quoteLength + anchor.suffix.length), anchor.suffix);
    // Context decides; nearness to the old offset breaks ties.
    const score = context * 1e6 - Math.abs(at - anchor.from);
    if (score > bestScore) {
      bestScore = score;
      chosen = at;
    }
  }
  return chosen;
}

/**
 * Finds the anchor in `text`: at its offsets when they still hold the quote, else at the
 * occurrence of the quote whose surroundings best match the stored prefix and suffix, else
 * the same ignoring whitespace differences. Null when the quote is gone.
 */
export function resolveAnchor(text: string, anchor: Anchor): ResolvedAnchor | null {
  if (anchor.quote === "") return null;
  if (anchorInBounds(anchor, text.length) && text.slice(anchor.from, anchor.to) === anchor.quote) return { from: anchor.from, to: anchor.to, match: "exact" };
  const at = best(text, anchor, occurrences(text, anchor.quote), anchor.quote.length);
  if (at !== undefined) return { from: at, to: at + anchor.quote.length, match: "moved" };

  const collapsed = collapseWhitespace(text);
  const quote = collapseWhitespace(anchor.quote).text.trim();
  if (quote === "") return null;
  const squeezed = { ...anchor, prefix: collapseWhitespace(anchor.prefix).text, suffix: collapseWhitespace(anchor.suffix).text };
  const hit = best(collapsed.text, squeezed, occurrences(collapsed.text, quote), quote.length);
  if (hit === undefined) return null;
  const from = collapsed.origin[hit]!;
  const to = collapsed.origin[hit + quote.length - 1]! + 1;
  return { from, to, match: "fuzzy" };
}

/** Splits [0, length) at the given ranges, for rendering highlights over text runs. */
export function clipRange(range: { from: number; to: number }, runStart: number, runEnd: number): { from: number; to: number } | null {
  const from = Math.max(range.from, runStart);
  const to = Math.min(range.to, runEnd);
  return to > from ? { from: from - runStart, to: to - runStart } : null;
}

export type TypedQuoteResult = { ok: true; anchor: Anchor } | { ok: false; message: string };

/**
 * Anchors an item to words the reviewer typed instead of selecting them (keyboard and
 * screen-reader users): the words must occur exactly once in the text, matched first as
 * typed, then ignoring case; runs of white space count as one space.
 */
export function anchorForTypedQuote(text: string, typed: string): TypedQuoteResult {
  const wanted = typed.trim().replace(/\s+/g, " ");
  if (wanted.length < 3) return { ok: false, message: "Type at least three characters of the passage." };
  // Escape the words for a pattern in which any white space matches any run of white space.
  const source = wanted
    .split(" ")
    .map((w) => w.replace(/[.*+?^${}()|[\]\\]/g, "\\$&"))
    .join("\\s+");
  for (const flags of ["g", "gi"]) {
    const hits = [...text.matchAll(new RegExp(source, flags))];
    if (hits.length === 1) {
      const from = hits[0]!.index;
      return { ok: true, anchor: makeAnchor(text, from, from + hits[0]![0].length) };
    }
    if (hits.length > 1) return { ok: false, message: `Those words occur ${hits.length} times in the dossier; type a few more around them.` };
  }
  return { ok: false, message: "Those words do not occur in the dossier's text." };
}
