/**
 * The server's gate for dossier documents: walks untrusted Tiptap JSON, keeps only the
 * nodes, marks and attributes of the shared schema (schema.ts), cleans every orbit-check
 * claim, then checks the structure against the ProseMirror schema the editor uses.
 * Unknown things are dropped, never passed through; text is kept as text (the renderer
 * escapes it), so no raw HTML can reach a reader.
 */
import { getSchema } from "@tiptap/core";
import type { Schema } from "@tiptap/pm/model";
import {
  MARK_ATTRS,
  MAX_DEPTH,
  MAX_ORBIT_CHECKS,
  NODE_ATTRS,
  REQUIRED_NODE_ATTRS,
  dossierExtensions,
  type DossierClaim,
  type DossierDoc,
  type DossierMark,
  type DossierNode,
  type SanitizeContext,
} from "./schema";

export interface SanitizeResult {
  doc: DossierDoc;
  /** What was dropped, for logs and for telling the author (e.g. "node script", "attr image.onerror"). */
  dropped: string[];
}

const KEY = /^[A-Za-z][A-Za-z0-9_]{0,59}$/;

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

/**
 * A claim value: numbers, short strings, booleans, small arrays and objects (vectors,
 * maneuvers, body overrides, Δv budget phases with their manoeuvres, mass items). Objects
 * nest at most three deep; a list does not count as a level, but a list directly inside a
 * list does, so every value stays shallow.
 */
function cleanValue(v: unknown, depth: number, inList = false): unknown {
  if (typeof v === "number") return Number.isFinite(v) ? v : undefined;
  if (typeof v === "string") return v.slice(0, 200);
  if (typeof v === "boolean") return v;
  if (depth >= 3) return undefined;
  if (Array.isArray(v)) {
    const d = inList ? depth + 1 : depth;
    return v
      .slice(0, 50)
      .map((x) => cleanValue(x, d, true))
      .filter((x) => x !== undefined);
  }
  if (isRecord(v)) return cleanRecord(v, depth + 1, 30);
  return undefined;
}

function cleanRecord(v: Record<string, unknown>, depth: number, maxKeys: number): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, x] of Object.entries(v).slice(0, maxKeys)) {
    if (!KEY.test(k)) continue;
    const c = cleanValue(x, depth);
    if (c !== undefined) out[k] = c;
  }
  return out;
}

/** Cleans an orbit-check claim to the contract's claim shape (without id). */
export function cleanClaim(v: unknown): DossierClaim {
  const raw = isRecord(v) ? v : {};
  const kind = typeof raw.kind === "string" && KEY.test(raw.kind) ? raw.kind : "orbit";
  const claim: DossierClaim = { kind, given: isRecord(raw.given) ? cleanRecord(raw.given, 1, 40) : {} };
  if (typeof raw.body === "string" && KEY.test(raw.body)) claim.body = raw.body;
  else if (isRecord(raw.body)) claim.body = cleanRecord(raw.body, 2, 10);
  if (isRecord(raw.claimed)) claim.claimed = cleanRecord(raw.claimed, 1, 40);
  return claim;
}

/** The link of a block made from an orbit file: attachment id, SHA-256, file name, orbit index. */
export function cleanSource(v: unknown): { attachmentId: string; sha256: string; filename: string; index: number } | null {
  if (!isRecord(v)) return null;
  const { attachmentId, sha256, filename, index } = v;
  if (typeof attachmentId !== "string" || !/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(attachmentId)) return null;
  if (typeof sha256 !== "string" || !/^[0-9a-f]{64}$/.test(sha256)) return null;
  if (typeof filename !== "string" || filename.length === 0 || filename.length > 255) return null;
  const i = typeof index === "number" && Number.isInteger(index) && index >= 0 && index < 10_000 ? index : 0;
  return { attachmentId: attachmentId.toLowerCase(), sha256, filename, index: i };
}

interface WalkState {
  dropped: string[];
  orbitChecks: number;
  blockIds: Set<string>;
  context: SanitizeContext;
}

function newUuid(): string {
  return globalThis.crypto.randomUUID();
}

function cleanAttrs(
  kind: "node" | "mark",
  type: string,
  attrs: unknown,
  allowed: Record<string, (value: unknown, context: SanitizeContext) => unknown>,
  state: WalkState,
): Record<string, unknown> | undefined {
  if (!isRecord(attrs)) return undefined;
  const out: Record<string, unknown> = {};
  for (const [name, value] of Object.entries(attrs)) {
    const cleaner = allowed[name];
    if (!cleaner) {
      if (value !== null && value !== undefined) state.dropped.push(`${kind === "node" ? "attr" : "mark attr"} ${type}.${name}`);
      continue;
    }
    const cleaned = cleaner(value, state.context);
    if (cleaned === undefined) {
      if (value !== null && value !== undefined && value !== "") state.dropped.push(`value of ${type}.${name}`);
      continue;
    }
    out[name] = cleaned;
  }
  return Object.keys(out).length > 0 ? out : undefined;
}

function cleanMarks(marks: unknown, state: WalkState): DossierMark[] | undefined {
  if (!Array.isArray(marks)) return undefined;
  const out: DossierMark[] = [];
  const seen = new Set<string>();
  for (const m of marks) {
    if (!isRecord(m) || typeof m.type !== "string") continue;
    const allowed = MARK_ATTRS[m.type];
    if (!allowed || seen.has(m.type)) {
      if (!allowed) state.dropped.push(`mark ${String(m.type).slice(0, 40)}`);
      continue;
    }
    const attrs = cleanAttrs("mark", m.type, m.attrs, allowed, state);
    if (m.type === "link" && !attrs?.href) {
      state.dropped.push("mark link without a safe href");
      continue;
    }
    seen.add(m.type);
    out.push(attrs ? { type: m.type, attrs } : { type: m.type });
  }
  return out.length > 0 ? out : undefined;
}

function cleanNode(node: unknown, depth: number, state: WalkState): DossierNode[] {
  if (!isRecord(node) || typeof node.type !== "string") return [];
  const type = node.type;
  const allowed = NODE_ATTRS[type];
  if (!allowed || type === "doc") {
    state.dropped.push(`node ${type.slice(0, 40)}`);
    return [];
  }
  if (depth > MAX_DEPTH) {
    state.dropped.push(`node ${type} nested too deep`);
    return [];
  }
  if (type === "text") {
    if (typeof node.text !== "string" || node.text.length === 0) return [];
    const marks = cleanMarks(node.marks, state);
    return [marks ? { type, text: node.text, marks } : { type, text: node.text }];
  }
  const attrs = cleanAttrs("node", type, node.attrs, allowed, state);
  for (const required of REQUIRED_NODE_ATTRS[type] ?? []) {
    if (attrs?.[required] === undefined) {
      if (type === "orbitCheck") {
        // A block without a usable id still carries a claim: give it a fresh id rather than lose it.
        continue;
      }
      state.dropped.push(`node ${type} without ${required}`);
      return [];
    }
  }
  const out: DossierNode = { type };
  if (type === "orbitCheck") {
    state.orbitChecks += 1;
    if (state.orbitChecks > MAX_ORBIT_CHECKS) {
      state.dropped.push(`orbit-check blocks beyond ${MAX_ORBIT_CHECKS}`);
      return [];
    }
    const a = attrs ?? {};
    let blockId = typeof a.blockId === "string" ? a.blockId : newUuid();
    // Copy and paste duplicates ids; the verdicts are stored per id, so keep them unique.
    if (state.blockIds.has(blockId)) blockId = newUuid();
    state.blockIds.add(blockId);
    out.attrs = {
      blockId,
      label: typeof a.label === "string" ? a.label : "",
      claim: cleanClaim(a.claim),
      initialFrom: typeof a.initialFrom === "string" && a.initialFrom !== blockId ? a.initialFrom : null,
    };
    const source = cleanSource(a.source);
    if (source) out.attrs.source = source;
    if (a.written) out.attrs.written = a.written;
    return [out];
  }
  if (attrs) out.attrs = attrs;
  if (Array.isArray(node.content)) {
    const content = node.content.flatMap((child) => cleanNode(child, depth + 1, state));
    if (content.length > 0) out.content = content;
  }
  return [out];
}

let cachedSchema: Schema | undefined;

/** The ProseMirror schema of the shared extension list. */
export function dossierSchema(): Schema {
  cachedSchema ??= getSchema(dossierExtensions());
  return cachedSchema;
}

/** Drops everything the schema does not know. Never throws. */
export function sanitizeDossier(input: unknown, context: SanitizeContext = {}): SanitizeResult {
  const state: WalkState = { dropped: [], orbitChecks: 0, blockIds: new Set(), context };
  const root = isRecord(input) && input.type === "doc" ? input : null;
  if (!root) state.dropped.push("document root (not a doc node)");
  const content = Array.isArray(root?.content) ? root.content.flatMap((child) => cleanNode(child, 1, state)) : [];
  return { doc: { type: "doc", content: content.length > 0 ? content : [{ type: "paragraph" }] }, dropped: state.dropped };
}

export type ValidateResult = ({ ok: true } & SanitizeResult) | { ok: false; message: string; dropped: string[] };

/**
 * Sanitizes, then checks that what remains is a document the editor's schema accepts
 * (e.g. a table holds rows, a list holds items). A structural error is the author's to fix.
 */
export function validateDossier(input: unknown, context: SanitizeContext = {}): ValidateResult {
  if (!isRecord(input) || input.type !== "doc") {
    return { ok: false, message: 'The document must be a Tiptap JSON object with type "doc".', dropped: [] };
  }
  const result = sanitizeDossier(input, context);
  try {
    dossierSchema().nodeFromJSON(result.doc).check();
  } catch (error) {
    const detail = error instanceof Error ? error.message.slice(0, 200) : "invalid structure";
    return { ok: false, message: `The document's structure is not valid (${detail}). Reload the editor and try again.`, dropped: result.dropped };
  }
  return { ok: true, ...result };
}
