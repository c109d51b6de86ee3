// Maps between the rendered dossier (DOM) and text offsets, for selections and highlights.
// Orbit-check figures are left out (their values are not prose), and each block element ends
// with a newline, close to the server's plain text so quotes and context line up.
import { resolveAnchor, type Anchor } from "@/lib/review/anchors";

const BLOCKS = new Set(["P", "H1", "H2", "H3", "H4", "H5", "H6", "LI", "PRE", "BLOCKQUOTE", "TR"]);

interface Piece {
  node: Text | null;
  start: number;
  text: string;
}

export function domText(root: HTMLElement): { text: string; pieces: Piece[] } {
  const pieces: Piece[] = [];
  let text = "";
  const visit = (node: Node) => {
    if (node.nodeType === Node.TEXT_NODE) {
      const value = node.nodeValue ?? "";
      pieces.push({ node: node as Text, start: text.length, text: value });
      text += value;
      return;
    }
    if (!(node instanceof HTMLElement)) return;
    if (node.matches("figure[data-orbit-check], [data-review-ui]")) return;
    for (const child of Array.from(node.childNodes)) visit(child);
    if (BLOCKS.has(node.tagName)) text += "\n";
    if (node.tagName === "BR") text += "\n";
  };
  visit(root);
  return { text, pieces };
}

/** The DOM-text offset of a (node, offset) boundary of a selection; null when outside the text. */
export function offsetOf(pieces: Piece[], node: Node, offset: number): number | null {
  if (node.nodeType === Node.TEXT_NODE) {
    const piece = pieces.find((p) => p.node === node);
    return piece ? piece.start + offset : null;
  }
  // An element boundary: the first text piece at or after it.
  const boundary = document.createRange();
  boundary.setStart(node, offset);
  boundary.collapse(true);
  for (const p of pieces) if (p.node && boundary.comparePoint(p.node, 0) >= 0) return p.start;
  const last = pieces.at(-1);
  return last ? last.start + last.text.length : null;
}

/** Wraps the resolved range of each anchor in <mark> elements, one per text node it touches. */
export function highlight(root: HTMLElement, items: { id: string; anchor: Anchor; severity: string; status: string }[], active: string | null): Set<string> {
  const placed = new Set<string>();
  for (const item of items) {
    const { text, pieces } = domText(root);
    const resolved = resolveAnchor(text, item.anchor);
    if (!resolved) continue;
    placed.add(item.id);
    for (const piece of pieces) {
      const from = Math.max(resolved.from, piece.start);
      const to = Math.min(resolved.to, piece.start + piece.text.length);
      if (to <= from || !piece.node) continue;
      const range = document.createRange();
      range.setStart(piece.node, from - piece.start);
      range.setEnd(piece.node, to - piece.start);
      const mark = document.createElement("mark");
      mark.dataset.itemId = item.id;
      mark.dataset.severity = item.severity;
      mark.className = `review-mark ${item.status === "resolved" ? "opacity-50" : ""} ${active === item.id ? "ring-2 ring-trajectory-500" : ""} ${
        item.severity === "major" ? "bg-void-100" : item.severity === "minor" ? "bg-drift-100" : "bg-trajectory-100"
      }`;
      range.surroundContents(mark);
    }
  }
  return placed;
}
