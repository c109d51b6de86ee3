"use client";
// The dossier page imports the editor workspace through this loader, so its JavaScript (Tiptap,
// ProseMirror, the engine, the upload and orbit-file panels) is a chunk of its own: people who
// may edit get it with the page (the server still renders the workspace), readers of a
// submitted version never download it.
import dynamic from "next/dynamic";

export const DossierWorkspaceLoader = dynamic(() => import("./dossier-workspace").then((m) => m.DossierWorkspace), {
  loading: () => (
    <p className="rounded-panel border border-ink-200 bg-white p-4 text-sm text-ink-600" aria-busy="true">
      Loading the editor…
    </p>
  ),
});
