/**
 * Decision letters: the Tiptap JSON the chair writes (and the board's template) reduced to
 * a small block model that three renderers share: HTML (e-mail and preview), plain text
 * (e-mail twin) and PDF (lib/pdf/letter.ts). Pure; unknown nodes and marks are dropped, so
 * whatever the browser sends, only these shapes reach a renderer.
 */

export interface LetterRun {
  text: string;
  bold?: boolean;
  italic?: boolean;
  href?: string;
}

export type LetterBlock =
  | { type: "paragraph"; runs: LetterRun[] }
  | { type: "heading"; level: 1 | 2 | 3; runs: LetterRun[] }
  | { type: "list"; ordered: boolean; items: LetterRun[][] }
  | { type: "quote"; runs: LetterRun[] }
  | { type: "rule" };

interface TiptapNode {
  type?: unknown;
  attrs?: Record<string, unknown>;
  content?: unknown;
  marks?: unknown;
  text?: unknown;
}

const MAX_NODES = 5000;

function children(node: TiptapNode): TiptapNode[] {
  return Array.isArray(node.content) ? (node.content.filter((c) => c && typeof c === "object") as TiptapNode[]) : [];
}

function safeHref(value: unknown): string | undefined {
  if (typeof value !== "string") return undefined;
  return /^(https?:\/\/|mailto:)/i.test(value.trim()) ? value.trim().slice(0, 2000) : undefined;
}

/** Text runs of an inline container; a hard break becomes a "\n" run. */
function runsOf(node: TiptapNode, budget: { left: number }): LetterRun[] {
  const out: LetterRun[] = [];
  for (const child of children(node)) {
    if (--budget.left < 0) break;
    if (child.type === "text" && typeof child.text === "string") {
      const run: LetterRun = { text: child.text };
      for (const mark of Array.isArray(child.marks) ? (child.marks as TiptapNode[]) : []) {
        if (mark?.type === "bold") run.bold = true;
        else if (mark?.type === "italic") run.italic = true;
        else if (mark?.type === "link") {
          const href = safeHref(mark.attrs?.href);
          if (href) run.href = href;
        }
      }
      out.push(run);
    } else if (child.type === "hardBreak") {
      out.push({ text: "\n" });
    } else {
      out.push(...runsOf(child, budget));
    }
  }
  return mergeRuns(out);
}

function sameMarks(a: LetterRun, b: LetterRun): boolean {
  return !!a.bold === !!b.bold && !!a.italic === !!b.italic && a.href === b.href;
}

/** Joins neighbours with the same marks so a merge field is never split across runs. */
export function mergeRuns(runs: LetterRun[]): LetterRun[] {
  const out: LetterRun[] = [];
  for (const run of runs) {
    if (run.text === "") continue;
    const last = out[out.length - 1];
    if (last && sameMarks(last, run)) last.text += run.text;
    else out.push({ ...run });
  }
  return out;
}

function listItems(node: TiptapNode, budget: { left: number }): LetterRun[][] {
  const items: LetterRun[][] = [];
  for (const item of children(node)) {
    if (--budget.left < 0) break;
    const runs: LetterRun[] = [];
    for (const part of children(item)) {
      if (part.type === "bulletList" || part.type === "orderedList") {
        // A nested list becomes further items: letters stay flat and print cleanly.
        if (runs.length) items.push(mergeRuns(runs.splice(0)));
        items.push(...listItems(part, budget));
      } else {
        if (runs.length) runs.push({ text: "\n" });
        runs.push(...runsOf(part, budget));
      }
    }
    if (runs.length) items.push(mergeRuns(runs));
  }
  return items;
}

/** The block model of a Tiptap JSON letter. Never throws. */
export function letterBlocks(doc: unknown): LetterBlock[] {
  const root = (doc && typeof doc === "object" ? doc : {}) as TiptapNode;
  const budget = { left: MAX_NODES };
  const blocks: LetterBlock[] = [];
  const visit = (node: TiptapNode) => {
    if (--budget.left < 0) return;
    switch (node.type) {
      case "paragraph":
        blocks.push({ type: "paragraph", runs: runsOf(node, budget) });
        return;
      case "heading": {
        const raw = Number(node.attrs?.level);
        const level = (raw === 1 || raw === 2 || raw === 3 ? raw : 2) as 1 | 2 | 3;
        blocks.push({ type: "heading", level, runs: runsOf(node, budget) });
        return;
      }
      case "bulletList":
      case "orderedList":
        blocks.push({ type: "list", ordered: node.type === "orderedList", items: listItems(node, budget) });
        return;
      case "blockquote":
        blocks.push({ type: "quote", runs: children(node).flatMap((c, i) => [...(i ? [{ text: "\n" }] : []), ...runsOf(c, budget)]) });
        return;
      case "horizontalRule":
        blocks.push({ type: "rule" });
        return;
      default:
        children(node).forEach(visit);
    }
  };
  children(root).forEach(visit);
  return blocks;
}

export function blockText(runs: LetterRun[]): string {
  return runs.map((r) => r.text).join("");
}

export function escapeHtml(text: string): string {
  return text.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");
}

function runsHtml(runs: LetterRun[]): string {
  return runs
    .map((run) => {
      let html = escapeHtml(run.text).replace(/\n/g, "<br>");
      if (run.bold) html = `<strong>${html}</strong>`;
      if (run.italic) html = `<em>${html}</em>`;
      if (run.href) html = `<a href="${escapeHtml(run.href)}">${html}</a>`;
      return html;
    })
    .join("");
}

/** Escaped HTML of the letter (e-mail body and preview). */
export function renderLetterHtml(blocks: LetterBlock[]): string {
  return blocks
    .map((b) => {
      switch (b.type) {
        case "paragraph":
          return `<p>${runsHtml(b.runs)}</p>`;
        case "heading":
          return `<h${b.level + 1}>${runsHtml(b.runs)}</h${b.level + 1}>`;
        case "list": {
          const tag = b.ordered ? "ol" : "ul";
          return `<${tag}>${b.items.map((item) => `<li>${runsHtml(item)}</li>`).join("")}</${tag}>`;
        }
        case "quote":
          return `<blockquote>${runsHtml(b.runs)}</blockquote>`;
        case "rule":
          return "<hr>";
      }
    })
    .join("\n");
}

/** The letter as plain text: a blank line between blocks, "-" or "1." before list items. */
export function renderLetterText(blocks: LetterBlock[]): string {
  return blocks
    .map((b) => {
      switch (b.type) {
        case "paragraph":
        case "heading":
          return blockText(b.runs);
        case "list":
          return b.items.map((item, i) => `${b.ordered ? `${i + 1}.` : "-"} ${blockText(item).replace(/\n/g, "\n   ")}`).join("\n");
        case "quote":
          return blockText(b.runs)
            .split("\n")
            .map((l) => `> ${l}`)
            .join("\n");
        case "rule":
          return "----";
      }
    })
    .join("\n\n")
    .trim();
}

/** True when the letter has no words at all (an empty editor). */
export function letterIsEmpty(blocks: LetterBlock[]): boolean {
  return renderLetterText(blocks).replace(/[-\s>]/g, "") === "";
}
