/**
 * Three-way merge of two edits of one dossier draft, block by block: the document both tabs
 * started from (base), this tab's text (ours) and the revision saved elsewhere (theirs). Top-
 * level blocks (paragraphs, headings, tables, orbit checks) are compared whole; when the two
 * edits changed different blocks, both changes are kept. When they touched the same block,
 * or inserted at the same place, there is no safe merge and the caller decides.
 */
import { diff3Merge } from "node-diff3";
import { sanitizeDossier } from "./sanitize";

export type DossierDocument = Record<string, unknown> & { content?: unknown[] };

export type DocumentMerge = { ok: true; document: DossierDocument } | { ok: false; conflicts: number };

/** JSON with object keys in sorted order, so equal blocks give equal strings whoever wrote them. */
function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(",")}]`;
  if (value !== null && typeof value === "object") {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonical(v)}`).join(",")}}`;
  }
  return JSON.stringify(value);
}

/**
 * The blocks as the server stores them: the editor's JSON and the stored JSON differ in
 * defaults and key order, so all three sides go through the same sanitizer first.
 */
function blocksOf(doc: DossierDocument): string[] {
  return sanitizeDossier(doc).doc.content.map((node) => canonical(node));
}

export function mergeDocuments(base: DossierDocument, ours: DossierDocument, theirs: DossierDocument): DocumentMerge {
  const regions = diff3Merge(blocksOf(ours), blocksOf(base), blocksOf(theirs), { excludeFalseConflicts: true });
  const merged: string[] = [];
  let conflicts = 0;
  for (const region of regions) {
    if (region.ok) merged.push(...region.ok);
    else conflicts++;
  }
  if (conflicts > 0) return { ok: false, conflicts };
  return { ok: true, document: { type: "doc", content: merged.map((block) => JSON.parse(block) as unknown) } };
}
