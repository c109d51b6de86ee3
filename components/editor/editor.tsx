"use client";
// The dossier editor: Tiptap with the shared extension list (lib/dossier/schema.ts), the
// live orbit-check node view, and the toolbar. Stores getJSON(); the server validates it.
import { useEffect, useRef, useState } from "react";
import { EditorContent, useEditor, type Editor } from "@tiptap/react";
import { dossierExtensions } from "@/lib/dossier/schema";
import type { ToleranceInput } from "@/lib/dossier/claims";
import { OrbitCheckEditorNode } from "./extensions/orbit-check/extension";
import { Toolbar, type ImageChoice } from "./toolbar";

export function useDossierEditor({
  content,
  tolerance,
  editable = true,
  onUpdate,
}: {
  content: Record<string, unknown>;
  tolerance?: ToleranceInput;
  editable?: boolean;
  onUpdate?: (doc: Record<string, unknown>) => void;
}): Editor | null {
  // Options stay identical between renders, so the editor is neither rebuilt nor re-configured
  // on every keystroke; the latest onUpdate is reached through a ref.
  const [extensions] = useState(() => dossierExtensions(OrbitCheckEditorNode.configure({ tolerance })));
  const [initialContent] = useState(content);
  const onUpdateRef = useRef(onUpdate);
  useEffect(() => {
    onUpdateRef.current = onUpdate;
  });
  return useEditor({
    extensions,
    content: initialContent,
    editable,
    immediatelyRender: false,
    editorProps: EDITOR_PROPS,
    onUpdate: ({ editor }) => onUpdateRef.current?.(editor.getJSON() as Record<string, unknown>),
  });
}

const EDITOR_PROPS = {
  // A visible focus ring inside the panel's border (the page-wide outline would be clipped).
  attributes: {
    class: "prose-dossier min-h-[24rem] rounded-b-panel px-5 py-4 focus:outline-2 focus:-outline-offset-4 focus:outline-trajectory-500",
    "aria-label": "Dossier text",
    "aria-multiline": "true",
    role: "textbox",
  },
};

export function DossierEditor({ editor, images }: { editor: Editor | null; images?: ImageChoice[] }) {
  if (!editor)
    return <div className="min-h-[24rem] animate-pulse rounded-panel border border-ink-200 bg-white" aria-busy="true" aria-label="Loading the editor" />;
  return (
    <div className="rounded-panel border border-ink-200 bg-white focus-within:border-trajectory-500">
      <Toolbar editor={editor} images={images} />
      <EditorContent editor={editor} />
    </div>
  );
}
