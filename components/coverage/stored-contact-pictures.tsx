// The contact pictures of a submitted version (ground-track map and 24-hour contact timeline),
// drawn on the server from the claim recorded at submission, beside the figures recorded with
// it. Used wherever stored orbit-check results are shown read-only (version pages, the review
// screen). No client code: the SVG and its text alternatives arrive as HTML.
import type { ReactNode } from "react";
import { claimsOverContactBudget, MAX_CONTACT_STATION_DAYS_PER_REQUEST } from "@/lib/orbit/kinds/contact-time";
import { ContactPictures } from "./contact-pictures";

export interface StoredContactResult {
  blockId: string;
  label: string;
  kind: string;
  /** The claim as recorded at submission (references resolved). */
  claim?: unknown;
  /** The stored result; its `computed` holds the recorded figures. */
  result?: unknown;
}

const objectOr = (v: unknown): Record<string, unknown> => (typeof v === "object" && v !== null && !Array.isArray(v) ? (v as Record<string, unknown>) : {});

/**
 * One picture block per stored contactTime result, by block id. A page draws at most the
 * contact search one request may ask for (the engine's station-day budget); later blocks get
 * a note instead, so a dossier cannot make its readers' pages slow.
 */
export function storedContactPictures(rows: readonly StoredContactResult[]): Record<string, ReactNode> {
  const contact = rows.filter((r) => r.kind === "contactTime" && r.claim !== undefined);
  const over = claimsOverContactBudget(contact.map((r) => r.claim));
  return Object.fromEntries(
    contact.map((r, i) => [
      r.blockId,
      over.has(i) ? (
        <p key={r.blockId} className="text-xs text-ink-600" data-contact-pictures-skipped="">
          No contact pictures for {r.label || "this block"} here: this page draws at most {MAX_CONTACT_STATION_DAYS_PER_REQUEST} station-days of contact search,
          and the blocks before it use them. Its recorded figures above stand.
        </p>
      ) : (
        <ContactPictures key={r.blockId} claim={r.claim} label={r.label} computed={objectOr(objectOr(r.result).computed)} />
      ),
    ]),
  );
}
