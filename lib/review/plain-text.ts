/**
 * The plain text of a submitted dossier that review-item anchors point into, and where
 * each text run of the Tiptap JSON starts in it. The review screen renders the dossier from
 * the same walk, so a browser selection maps to exactly these offsets. Pure.
 *
 * Text runs are concatenated; a hard break is "\n"; every text block (paragraph, heading,
 * code block) ends with "\n"; atom nodes such as orbit-check blocks add nothing.
 */

export interface DocNode {
  type?: string;
  text?: string;
  attrs?: Record<string, unknown>;
  marks?: { type: string; attrs?: Record<string, unknown> }[];
  content?: DocNode[];
}

const TEXT_BLOCKS = new Set(["paragraph", "heading", "codeBlock"]);

export interface IndexedDocument {
  text: string;
  /** Start offset of each text node (and hard break), by its path of child indexes, e.g. "0.2.1". */
  starts: Map<string, number>;
}

export function indexDocument(doc: DocNode | null | undefined): IndexedDocument {
  const starts = new Map<string, number>();
  let text = "";
  const walk = (node: DocNode, path: string) => {
    if (node.type === "text") {
      starts.set(path, text.length);
      text += node.text ?? "";
      return;
    }
    if (node.type === "hardBreak") {
      starts.set(path, text.length);
      text += "\n";
      return;
    }
    (node.content ?? []).forEach((child, i) => walk(child, path === "" ? String(i) : `${path}.${i}`));
    if (node.type && TEXT_BLOCKS.has(node.type)) text += "\n";
  };
  if (doc) walk(doc, "");
  return { text, starts };
}

export function plainText(doc: DocNode | null | undefined): string {
  return indexDocument(doc).text;
}
