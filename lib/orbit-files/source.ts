/**
 * A block made from an orbit file, against the draft's attachments now: is the file it was made
 * from still there, unchanged (same SHA-256)? Pure: the editor's block and the read-only render
 * both say it in the same words.
 */
import type { OrbitFileSource } from "./compare";

/** What the block needs to know of an attachment. */
export interface AttachmentRef {
  id: string;
  filename: string;
  sha256: string | null;
}

export type SourceState =
  { state: "same" } | { state: "changed"; sha256: string } | { state: "replaced"; by: AttachmentRef } | { state: "removed" } | { state: "unknown" };

export interface SourceNote {
  /** "Made from lantern.tle, orbit 1" */
  madeFrom: string;
  state: SourceState["state"];
  /** What happened to the file and what to do, or null when it is unchanged (or not known). */
  problem: string | null;
}

/** Reads a block's `source` attribute; anything malformed is no source. */
export function sourceOf(value: unknown): OrbitFileSource | null {
  if (!value || typeof value !== "object") return null;
  const v = value as Record<string, unknown>;
  if (typeof v.attachmentId !== "string" || typeof v.sha256 !== "string" || typeof v.filename !== "string") return null;
  const index = typeof v.index === "number" && Number.isInteger(v.index) && v.index >= 0 ? v.index : 0;
  return { attachmentId: v.attachmentId, sha256: v.sha256, filename: v.filename, index };
}

/**
 * The file by id first; its SHA-256 must match. When the id is gone, a later upload with the same
 * file name is a new version of it. `attachments` null: the attachments are not known here.
 */
export function sourceState(source: OrbitFileSource, attachments: readonly AttachmentRef[] | null): SourceState {
  if (!attachments) return { state: "unknown" };
  const same = attachments.find((a) => a.id === source.attachmentId);
  if (same) {
    if (same.sha256 && same.sha256.toLowerCase() !== source.sha256.toLowerCase()) return { state: "changed", sha256: same.sha256 };
    return { state: "same" };
  }
  const byName = attachments.filter((a) => a.filename === source.filename);
  const newest = byName[byName.length - 1];
  if (newest) return { state: "replaced", by: newest };
  return { state: "removed" };
}

export function sourceNote(source: OrbitFileSource, attachments: readonly AttachmentRef[] | null): SourceNote {
  const madeFrom = `Made from ${source.filename}, orbit ${source.index + 1}`;
  const s = sourceState(source, attachments);
  const again = "the values below are still the earlier file's";
  let problem: string | null = null;
  if (s.state === "changed")
    problem = `${source.filename} has changed since this block was made from it (SHA-256 now ${s.sha256.slice(0, 12)}…, was ${source.sha256.slice(0, 12)}…); ${again}. Make the claim again from the file, or check these values against it.`;
  else if (s.state === "replaced")
    problem = `${source.filename} was replaced by a new upload since this block was made from it; ${again}. Make the claim again from the new ${s.by.filename}, then delete this block.`;
  else if (s.state === "removed")
    problem = `${source.filename} is no longer attached to the dossier. Attach it again, or make the claim from another orbit file.`;
  return { madeFrom, state: s.state, problem };
}
