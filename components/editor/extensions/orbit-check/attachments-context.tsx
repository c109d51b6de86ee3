"use client";
// The draft's attachments (id, file name, SHA-256) for the orbit-check blocks, so a block made
// from an orbit file can say when that file changed or left. Node views render through portals
// inside the editor's React tree, so a provider around the editor reaches them.
import { createContext, useContext } from "react";
import type { AttachmentRef } from "@/lib/orbit-files/source";

const DraftAttachments = createContext<readonly AttachmentRef[] | null>(null);

export const DraftAttachmentsProvider = DraftAttachments.Provider;

/** The draft's attachments, or null where they are not known (the block then only names its file). */
export function useDraftAttachments(): readonly AttachmentRef[] | null {
  return useContext(DraftAttachments);
}
