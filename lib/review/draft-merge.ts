// Three-way merge of a review draft (scores, comments, summary) for the review screen's
// autosave. `base` is the saved state the screen's edits started from, `mine` what the
// screen holds now and `theirs` the newest saved state on the server. Fields changed on one
// side only take that side's value; a field changed on both sides to different values is an
// overlap that the reviewer resolves, and the saved value is never dropped silently.
import type { CriterionScore } from "./rubric";

export interface Draft {
  scores: Record<string, CriterionScore>;
  summary: string;
}

type Value = string | number | null;

/** Field keys: "summary", "score:<criterion id>", "comment:<criterion id>". */
export function fieldKeys(d: Draft): string[] {
  const keys = ["summary"];
  for (const id of Object.keys(d.scores)) keys.push(`score:${id}`, `comment:${id}`);
  return keys;
}

function split(key: string): { kind: string; id: string } {
  const at = key.indexOf(":");
  return { kind: key.slice(0, at), id: key.slice(at + 1) };
}

export function getField(d: Draft, key: string): Value {
  if (key === "summary") return d.summary;
  const { kind, id } = split(key);
  const s = d.scores[id];
  return kind === "score" ? (s?.score ?? null) : (s?.comment ?? "");
}

export function setField(d: Draft, key: string, value: Value): Draft {
  if (key === "summary") return { ...d, summary: String(value ?? "") };
  const { kind, id } = split(key);
  const prev = d.scores[id] ?? { score: null, comment: "" };
  const next: CriterionScore = kind === "score" ? { ...prev, score: value === null ? null : Number(value) } : { ...prev, comment: String(value ?? "") };
  return { ...d, scores: { ...d.scores, [id]: next } };
}

/** The fields whose values differ between two drafts. */
export function changedKeys(a: Draft, b: Draft): string[] {
  const keys = new Set([...fieldKeys(a), ...fieldKeys(b)]);
  return [...keys].filter((k) => getField(a, k) !== getField(b, k));
}

export interface Overlap {
  key: string;
  mine: Value;
  theirs: Value;
}

/** Takes every one-sided change; lists the fields both sides changed differently (theirs kept there). */
export function mergeDrafts(base: Draft, mine: Draft, theirs: Draft): { merged: Draft; overlaps: Overlap[] } {
  const theirChanges = new Set(changedKeys(base, theirs));
  let merged: Draft = { scores: { ...theirs.scores }, summary: theirs.summary };
  const overlaps: Overlap[] = [];
  for (const key of changedKeys(base, mine)) {
    const value = getField(mine, key);
    if (!theirChanges.has(key) || getField(theirs, key) === value) merged = setField(merged, key, value);
    else overlaps.push({ key, mine: value, theirs: getField(theirs, key) });
  }
  return { merged, overlaps };
}

export const SAVED_ELSEWHERE = "— saved elsewhere —";

/**
 * Resolves overlaps keeping both: a text gets the reviewer's words followed by the saved words
 * under a marker line; a score takes the reviewer's value (the saved one is shown before they choose).
 */
export function keepBoth(merged: Draft, overlaps: Overlap[]): Draft {
  let out = merged;
  for (const o of overlaps) {
    if (o.key.startsWith("score:")) out = setField(out, o.key, o.mine);
    else {
      const mine = String(o.mine ?? "").trimEnd();
      const theirs = String(o.theirs ?? "").trim();
      out = setField(out, o.key, !theirs ? mine : !mine ? theirs : `${mine}\n\n${SAVED_ELSEWHERE}\n${theirs}`);
    }
  }
  return out;
}
