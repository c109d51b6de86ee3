"use client";
// The letter editor: Tiptap with StarterKit only (paragraphs, headings, lists, bold, italic,
// links). Merge fields are plain text in double braces; the palette inserts them at the
// cursor. Stores getJSON(); the server reduces and validates it (lib/decisions/letter.ts).
// Tiptap (and ProseMirror under it) is fetched only once the letter editor mounts, so the
// decision and letter-template pages load none of it with their first JavaScript; until it
// arrives the form shows the same placeholder it showed while the editor started.
import dynamic from "next/dynamic";
import { useEffect, useRef, useState } from "react";
import type { Editor } from "@tiptap/core";

const EditorContent = dynamic(() => import("@tiptap/react").then((m) => m.EditorContent), { ssr: false });

export interface MergeFieldChoice {
  name: string;
  description: string;
}

export function useLetterEditor(content: Record<string, unknown>, onUpdate?: (doc: Record<string, unknown>) => void): Editor | null {
  const [editor, setEditor] = useState<Editor | null>(null);
  // The first content and the latest callback, read when the editor is made and on each update.
  const initial = useRef(content);
  const latestOnUpdate = useRef(onUpdate);
  useEffect(() => {
    latestOnUpdate.current = onUpdate;
  }, [onUpdate]);
  useEffect(() => {
    let cancelled = false;
    let made: Editor | null = null;
    void Promise.all([import("@tiptap/core"), import("@tiptap/starter-kit")]).then(([{ Editor: TiptapEditor }, { default: StarterKit }]) => {
      if (cancelled) return;
      made = new TiptapEditor({
        extensions: [StarterKit.configure({ heading: { levels: [1, 2, 3] }, code: false, codeBlock: false, strike: false, underline: false })],
        content: initial.current,
        editorProps: {
          attributes: {
            class: "prose-dossier min-h-[18rem] px-5 py-4 focus:outline-none",
            "aria-label": "Letter text",
            "aria-multiline": "true",
            role: "textbox",
          },
        },
        onUpdate: ({ editor: e }) => latestOnUpdate.current?.(e.getJSON() as Record<string, unknown>),
      });
      setEditor(made);
    });
    return () => {
      cancelled = true;
      made?.destroy();
    };
  }, []);
  return editor;
}

const buttonClass =
  "rounded-chip border border-ink-200 px-2 py-1 text-sm text-ink-800 hover:bg-ink-50 aria-pressed:bg-trajectory-100 aria-pressed:text-trajectory-700";

export function LetterEditor({ editor, fields }: { editor: Editor | null; fields: readonly MergeFieldChoice[] }) {
  if (!editor)
    return <div className="min-h-[18rem] animate-pulse rounded-panel border border-ink-200 bg-white" aria-busy="true" aria-label="Loading the letter editor" />;
  const insertField = (name: string) => editor.chain().focus().insertContent(`{{${name}}}`).run();
  return (
    <div className="space-y-2">
      <div className="rounded-panel border border-ink-200 bg-white">
        <div role="toolbar" aria-label="Letter formatting" className="flex flex-wrap gap-1 border-b border-ink-200 p-2">
          <button type="button" className={buttonClass} aria-pressed={editor.isActive("bold")} onClick={() => editor.chain().focus().toggleBold().run()}>
            Bold
          </button>
          <button type="button" className={buttonClass} aria-pressed={editor.isActive("italic")} onClick={() => editor.chain().focus().toggleItalic().run()}>
            Italic
          </button>
          <button
            type="button"
            className={buttonClass}
            aria-pressed={editor.isActive("heading", { level: 2 })}
            onClick={() => editor.chain().focus().toggleHeading({ level: 2 }).run()}
          >
            Heading
          </button>
          <button
            type="button"
            className={buttonClass}
            aria-pressed={editor.isActive("bulletList")}
            onClick={() => editor.chain().focus().toggleBulletList().run()}
          >
            Bullets
          </button>
          <button
            type="button"
            className={buttonClass}
            aria-pressed={editor.isActive("orderedList")}
            onClick={() => editor.chain().focus().toggleOrderedList().run()}
          >
            Numbered
          </button>
        </div>
        <EditorContent editor={editor} />
      </div>
      <details className="rounded-panel border border-ink-200 bg-ink-50 p-3 text-sm">
        <summary className="cursor-pointer font-semibold text-ink-800">Merge fields</summary>
        <p className="mt-1 text-ink-600">
          Write a field in double braces, e.g. <code className="font-mono">{"{{proposal.title}}"}</code>, or click one to insert it. A paragraph holding only{" "}
          <code className="font-mono">{"{{reviewItems.selected}}"}</code> becomes a bulleted list. Unknown fields are refused when you preview or send.
        </p>
        <ul className="mt-2 grid gap-1 sm:grid-cols-2">
          {fields.map((f) => (
            <li key={f.name}>
              <button type="button" className="font-mono text-xs text-trajectory-700 underline" onClick={() => insertField(f.name)}>
                {`{{${f.name}}}`}
              </button>{" "}
              <span className="text-xs text-ink-600">{f.description}</span>
            </li>
          ))}
        </ul>
      </details>
    </div>
  );
}
