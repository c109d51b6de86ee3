"use client";
// The dossier editor's toolbar: text formatting, structure, tables, figures from the
// proposal's image attachments, and orbit-check blocks.
import { useEditorState } from "@tiptap/react";
import type { Editor } from "@tiptap/core";
import { safeHref } from "@/lib/dossier/schema";
import { newOrbitCheckAttrs } from "./extensions/orbit-check/extension";

export interface ImageChoice {
  src: string;
  filename: string;
}

const buttonClass =
  "rounded-chip border border-transparent px-2 py-1 text-sm font-semibold text-ink-800 hover:border-ink-300 aria-pressed:border-trajectory-500 aria-pressed:bg-trajectory-100 disabled:opacity-40";

export function Toolbar({ editor, images = [] }: { editor: Editor; images?: ImageChoice[] }) {
  const state = useEditorState({
    editor,
    selector: ({ editor: e }) => ({
      bold: e.isActive("bold"),
      italic: e.isActive("italic"),
      h2: e.isActive("heading", { level: 2 }),
      h3: e.isActive("heading", { level: 3 }),
      bullet: e.isActive("bulletList"),
      ordered: e.isActive("orderedList"),
      quote: e.isActive("blockquote"),
      link: e.isActive("link"),
      inTable: e.isActive("table"),
    }),
  });
  const toggle = (label: string, pressed: boolean, run: () => void, shortcut?: string) => (
    <button type="button" className={buttonClass} aria-pressed={pressed} onClick={run} title={shortcut ? `${label} (${shortcut})` : label}>
      {label}
    </button>
  );
  const action = (label: string, run: () => void, disabled = false) => (
    <button type="button" className={buttonClass} onClick={run} disabled={disabled}>
      {label}
    </button>
  );
  return (
    <div role="toolbar" aria-label="Formatting" className="sticky top-0 z-10 flex flex-wrap items-center gap-1 border-b border-ink-200 bg-white/95 p-2">
      {toggle("Bold", state.bold, () => editor.chain().focus().toggleBold().run(), "Ctrl+B")}
      {toggle("Italic", state.italic, () => editor.chain().focus().toggleItalic().run(), "Ctrl+I")}
      {toggle("Section", state.h2, () => editor.chain().focus().toggleHeading({ level: 2 }).run(), "Ctrl+Alt+2")}
      {toggle("Subsection", state.h3, () => editor.chain().focus().toggleHeading({ level: 3 }).run(), "Ctrl+Alt+3")}
      {toggle("Bullets", state.bullet, () => editor.chain().focus().toggleBulletList().run())}
      {toggle("Numbered", state.ordered, () => editor.chain().focus().toggleOrderedList().run())}
      {toggle("Quote", state.quote, () => editor.chain().focus().toggleBlockquote().run())}
      {toggle("Link", state.link, () => {
        if (editor.isActive("link")) {
          editor.chain().focus().unsetLink().run();
          return;
        }
        const href = safeHref(window.prompt("Link address (https://…, mailto:… or /path)") ?? "");
        if (href) editor.chain().focus().extendMarkRange("link").setLink({ href }).run();
      })}
      {action("Table", () => editor.chain().focus().insertTable({ rows: 3, cols: 3, withHeaderRow: true }).run())}
      {state.inTable ? (
        <>
          {action("+ row", () => editor.chain().focus().addRowAfter().run())}
          {action("+ column", () => editor.chain().focus().addColumnAfter().run())}
          {action("− table", () => editor.chain().focus().deleteTable().run())}
        </>
      ) : null}
      {images.length > 0 ? (
        <select
          aria-label="Insert a figure from the attachments"
          value=""
          onChange={(e) => {
            const img = images.find((i) => i.src === e.target.value);
            if (img) editor.chain().focus().setImage({ src: img.src, alt: img.filename }).run();
          }}
          className="rounded-chip border border-ink-300 bg-white px-2 py-1 text-sm"
        >
          <option value="">Figure…</option>
          {images.map((i) => (
            <option key={i.src} value={i.src}>
              {i.filename}
            </option>
          ))}
        </select>
      ) : null}
      <span className="mx-1 h-5 w-px bg-ink-200" aria-hidden />
      <button
        type="button"
        className="rounded-chip bg-trajectory-600 px-3 py-1 text-sm font-semibold text-white hover:bg-trajectory-700"
        onClick={() => {
          // After the selection, so a selected block is never replaced by the new one.
          const at = editor.state.selection.to;
          const attrs = newOrbitCheckAttrs();
          editor.chain().insertContentAt(at, { type: "orbitCheck", attrs }).run();
          // Keyboard users continue in the new block's first field (its view mounts a frame later).
          const focusNewBlock = (frames: number) => {
            const input = editor.view.dom.querySelector<HTMLInputElement>(`[data-block-id="${attrs.blockId}"] input`);
            if (input) input.focus();
            else if (frames > 0) requestAnimationFrame(() => focusNewBlock(frames - 1));
          };
          requestAnimationFrame(() => focusNewBlock(30));
        }}
      >
        Insert orbit check
      </button>
    </div>
  );
}
