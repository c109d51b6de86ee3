/**
 * The dossier document format: Tiptap JSON with a fixed set of nodes and marks (see
 * README.md beside this file). The same list drives the editor (components/editor), the
 * server validator (sanitize.ts) and the server renderer (render.ts), so a document the
 * editor can produce is exactly a document the server accepts and renders.
 */
import { Node, mergeAttributes, type AnyExtension } from "@tiptap/core";
import StarterKit from "@tiptap/starter-kit";
import { Table, TableCell, TableHeader, TableRow } from "@tiptap/extension-table";
import Image from "@tiptap/extension-image";

/** A contract claim without its id (the block's id is the claim's id). */
export interface DossierClaim {
  kind: string;
  body?: unknown;
  given: Record<string, unknown>;
  claimed?: Record<string, unknown>;
}

export interface OrbitCheckAttrs {
  /** Stable uuid of the block; the server stores its verdict under this id. */
  blockId: string;
  /** The name the text uses for this orbit, e.g. "the parking orbit". */
  label: string;
  claim: DossierClaim;
  /** blockId of another block whose orbit is this transfer's initial orbit. */
  initialFrom?: string | null;
  /** The orbit file the block was made from (attachment id and SHA-256). */
  source?: { attachmentId: string; sha256: string; filename: string; index: number } | null;
  /** The values as the proposer typed them, with the unit chosen beside each (lib/dossier/units.ts). */
  written?: WrittenValues;
}

/** Typed text and unit per given and claimed quantity; the claim holds the contract-unit values. */
export interface WrittenValues {
  given?: Record<string, WrittenEntry>;
  claimed?: Record<string, WrittenEntry>;
}

/** One typed value; `station` names the board station a value was copied from (link budget's minimum elevation). */
export interface WrittenEntry {
  text: string;
  unit: string;
  station?: string;
}

export interface DossierMark {
  type: string;
  attrs?: Record<string, unknown>;
}

export interface DossierNode {
  type: string;
  attrs?: Record<string, unknown>;
  content?: DossierNode[];
  marks?: DossierMark[];
  text?: string;
}

export interface DossierDoc extends DossierNode {
  type: "doc";
  content: DossierNode[];
}

export const EMPTY_DOSSIER: DossierDoc = { type: "doc", content: [{ type: "paragraph" }] };

/** Headings the editor offers (level 1 to 3). */
export const HEADING_LEVELS = [1, 2, 3] as const;

function parseSource(text: string | null): unknown {
  if (!text) return null;
  try {
    return JSON.parse(text);
  } catch {
    return null;
  }
}

/** The orbit-check atom without a node view; the editor extends it with its React view. */
export const OrbitCheckNode = Node.create({
  name: "orbitCheck",
  group: "block",
  atom: true,
  selectable: true,
  draggable: true,
  addAttributes() {
    return {
      blockId: { default: "" },
      label: { default: "" },
      claim: { default: { kind: "orbit", body: "earth", given: {}, claimed: {} } },
      initialFrom: { default: null },
      /** The orbit file the block was made from: { attachmentId, sha256, filename, index } (lib/orbit-files/compare.ts). */
      source: { default: null },
      written: { default: null },
    };
  },
  parseHTML() {
    return [
      {
        tag: "figure[data-orbit-check]",
        getAttrs: (element) => {
          const el = element as HTMLElement;
          let claim: unknown = undefined;
          try {
            claim = JSON.parse(el.getAttribute("data-claim") ?? "null");
          } catch {
            claim = undefined;
          }
          return {
            blockId: el.getAttribute("data-block-id") ?? "",
            label: el.getAttribute("data-label") ?? "",
            claim: claim ?? undefined,
            initialFrom: el.getAttribute("data-initial-from"),
            source: parseSource(el.getAttribute("data-source")),
            written: parseWritten(el.getAttribute("data-written")),
          };
        },
      },
    ];
  },
  renderHTML({ HTMLAttributes, node }) {
    return [
      "figure",
      mergeAttributes(
        { "data-orbit-check": "", "data-block-id": node.attrs.blockId, "data-label": node.attrs.label, "data-claim": JSON.stringify(node.attrs.claim) },
        node.attrs.initialFrom ? { "data-initial-from": node.attrs.initialFrom } : {},
        node.attrs.source ? { "data-source": JSON.stringify(node.attrs.source) } : {},
        node.attrs.written ? { "data-written": JSON.stringify(node.attrs.written) } : {},
        // HTMLAttributes carries the attrs again under their own names; drop the JSON one.
        Object.fromEntries(Object.entries(HTMLAttributes).filter(([k]) => !["claim", "blockId", "label", "initialFrom", "source", "written"].includes(k))),
      ),
    ];
  },
});

function parseWritten(text: string | null): WrittenValues | null {
  if (!text) return null;
  try {
    return cleanWritten(JSON.parse(text)) ?? null;
  } catch {
    return null;
  }
}

const WRITTEN_KEY = /^[A-Za-z][A-Za-z0-9_]{0,59}$/;
const WRITTEN_UNIT = /^[A-Za-z/°]{1,12}$/;

/** Keeps only `{ given, claimed }` maps of `{ text ≤ 60 chars, unit, station? ≤ 80 chars }` under quantity names. */
export function cleanWritten(v: unknown): WrittenValues | undefined {
  if (typeof v !== "object" || v === null || Array.isArray(v)) return undefined;
  const out: WrittenValues = {};
  for (const side of ["given", "claimed"] as const) {
    const raw = (v as Record<string, unknown>)[side];
    if (typeof raw !== "object" || raw === null || Array.isArray(raw)) continue;
    const map: Record<string, WrittenEntry> = {};
    for (const [k, e] of Object.entries(raw).slice(0, 40)) {
      if (!WRITTEN_KEY.test(k) || typeof e !== "object" || e === null) continue;
      const { text, unit, station } = e as { text?: unknown; unit?: unknown; station?: unknown };
      if (typeof text !== "string" || typeof unit !== "string" || !WRITTEN_UNIT.test(unit)) continue;
      map[k] = { text: text.slice(0, 60), unit };
      if (typeof station === "string" && station.trim() !== "") map[k].station = station.trim().slice(0, 80);
    }
    if (Object.keys(map).length > 0) out[side] = map;
  }
  return out.given || out.claimed ? out : undefined;
}

export const LINK_PROTOCOLS = ["http", "https", "mailto"] as const;

/** The shared extension list. Pass the editor's orbit-check node (with its node view) to replace the plain one. */
export function dossierExtensions(orbitCheck: AnyExtension = OrbitCheckNode): AnyExtension[] {
  return [
    StarterKit.configure({
      heading: { levels: [...HEADING_LEVELS] },
      link: {
        openOnClick: false,
        autolink: true,
        protocols: [],
        defaultProtocol: "https",
        HTMLAttributes: { rel: "noopener noreferrer nofollow", target: null },
      },
      codeBlock: { HTMLAttributes: {} },
    }),
    Table.configure({ resizable: false }),
    TableRow,
    TableHeader,
    TableCell,
    Image.configure({ inline: false, allowBase64: false }),
    orbitCheck,
  ];
}

/**
 * What the validator lets through, per node type: allowed attributes with a cleaner each
 * (return undefined to drop the attribute). Anything not listed is dropped.
 */
export type AttrCleaner = (value: unknown, context: SanitizeContext) => unknown;

export interface SanitizeContext {
  /** Board of the proposal: image sources must be attachments under this board. */
  boardId?: string;
  /** Attachment ids of the proposal; when given, images must point at one of these. */
  attachmentIds?: ReadonlySet<string>;
}

const clampInt =
  (min: number, max: number): AttrCleaner =>
  (v) => {
    const n = typeof v === "number" ? v : typeof v === "string" ? Number(v) : NaN;
    return Number.isInteger(n) && n >= min && n <= max ? n : undefined;
  };
const shortText =
  (max: number): AttrCleaner =>
  (v) =>
    typeof v === "string" ? v.slice(0, max) : undefined;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

const SAME_SITE_BASE = "https://visviva.invalid";

/** Link targets: http(s), mailto and same-site paths only (no javascript:, data:, etc.). */
export function safeHref(value: unknown): string | undefined {
  if (typeof value !== "string") return undefined;
  const href = value.trim();
  if (href.length === 0 || href.length > 2048) return undefined;
  if (href.startsWith("/") || href.startsWith("#")) {
    // Browsers read "\" as "/" and drop tabs and newlines, so "/\host/path" or "/\t/host" would
    // leave the site: refuse those characters, and keep only what resolves to this origin.
    if (/[\\\u0000-\u001f\u007f]/.test(href)) return undefined;
    try {
      const url = new URL(href, SAME_SITE_BASE);
      if (url.origin !== SAME_SITE_BASE) return undefined;
      return href.startsWith("#") ? href : `${url.pathname}${url.search}${url.hash}`;
    } catch {
      return undefined;
    }
  }
  try {
    const url = new URL(href);
    return (LINK_PROTOCOLS as readonly string[]).includes(url.protocol.replace(":", "")) ? url.toString() : undefined;
  } catch {
    return undefined;
  }
}

const ATTACHMENT_SRC = /^\/api\/v1\/boards\/([0-9a-f-]{36})\/attachments\/([0-9a-f-]{36})\/content$/i;

/** Image sources: only attachments of the proposal, through the download route. */
export function attachmentSrc(value: unknown, context: SanitizeContext): string | undefined {
  if (typeof value !== "string") return undefined;
  const m = ATTACHMENT_SRC.exec(value.trim());
  if (!m) return undefined;
  if (context.boardId && m[1]!.toLowerCase() !== context.boardId.toLowerCase()) return undefined;
  if (context.attachmentIds && !context.attachmentIds.has(m[2]!.toLowerCase())) return undefined;
  return value.trim();
}

export function attachmentContentPath(boardId: string, attachmentId: string): string {
  return `/api/v1/boards/${boardId}/attachments/${attachmentId}/content`;
}

export const NODE_ATTRS: Record<string, Record<string, AttrCleaner>> = {
  doc: {},
  paragraph: {},
  text: {},
  heading: { level: clampInt(1, 3) },
  bulletList: {},
  orderedList: { start: clampInt(0, 100000) },
  listItem: {},
  blockquote: {},
  codeBlock: { language: (v) => (typeof v === "string" && /^[a-z0-9+#-]{1,30}$/i.test(v) ? v : undefined) },
  hardBreak: {},
  horizontalRule: {},
  table: {},
  tableRow: {},
  tableHeader: { colspan: clampInt(1, 50), rowspan: clampInt(1, 500) },
  tableCell: { colspan: clampInt(1, 50), rowspan: clampInt(1, 500) },
  image: { src: attachmentSrc, alt: shortText(500), title: shortText(500) },
  orbitCheck: {
    blockId: (v) => (typeof v === "string" && UUID.test(v) ? v.toLowerCase() : undefined),
    label: shortText(200),
    initialFrom: (v) => (typeof v === "string" && UUID.test(v) ? v.toLowerCase() : undefined),
    // The claim is cleaned in sanitize.ts (it has its own shape).
    claim: (v) => v,
    // The orbit-file link is cleaned in sanitize.ts (cleanSource).
    source: (v) => (v && typeof v === "object" ? v : undefined),
    written: (v) => cleanWritten(v),
  },
};

export const MARK_ATTRS: Record<string, Record<string, AttrCleaner>> = {
  bold: {},
  italic: {},
  strike: {},
  underline: {},
  code: {},
  link: { href: safeHref },
};

/** Nodes that must keep their required attribute, else the node is dropped. */
export const REQUIRED_NODE_ATTRS: Record<string, string[]> = {
  image: ["src"],
  orbitCheck: ["blockId"],
};

export const MAX_ORBIT_CHECKS = 200;
export const MAX_DEPTH = 40;
/** Autosave and submission take a document of at most this size (JSON text). */
export const MAX_DOCUMENT_BYTES = 2 * 1024 * 1024;
