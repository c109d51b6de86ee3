/**
 * Comparing two submitted versions of a dossier: a word-level diff of the plain text and
 * the orbit claims side by side (values claimed, values recomputed, verdicts). Pure.
 */
import { diffWords } from "diff";
import { hintSentence } from "@/lib/orbit/labels";

export interface TextChange {
  kind: "same" | "added" | "removed";
  text: string;
}

export interface TextDiff {
  changes: TextChange[];
  wordsAdded: number;
  wordsRemoved: number;
}

const wordCount = (text: string) => (text.match(/\S+/g) ?? []).length;

/** Word-level differences from `before` to `after` (whitespace changes alone are ignored). */
export function diffText(before: string, after: string): TextDiff {
  const changes: TextChange[] = diffWords(before, after).map((c) => ({
    kind: c.added ? "added" : c.removed ? "removed" : "same",
    text: c.value,
  }));
  return {
    changes,
    wordsAdded: changes.filter((c) => c.kind === "added").reduce((n, c) => n + wordCount(c.text), 0),
    wordsRemoved: changes.filter((c) => c.kind === "removed").reduce((n, c) => n + wordCount(c.text), 0),
  };
}

/** One recomputed claim of a version, as stored in check_results. */
export interface VersionCheck {
  blockId: string;
  label: string;
  kind: string;
  status: "consistent" | "inconsistent" | "invalid";
  claim: Record<string, unknown>;
  result: Record<string, unknown>;
}

export interface QuantityRow {
  quantity: string;
  unit: string;
  before: { claimed: number | null; computed: number | null; ok: boolean | null; hint?: string | null } | null;
  after: { claimed: number | null; computed: number | null; ok: boolean | null; hint?: string | null } | null;
}

export interface ClaimComparison {
  /** How the two were paired: same block, same label, or only in one version. */
  matchedBy: "blockId" | "label" | "none";
  label: string;
  kind: string;
  before: { blockId: string; status: VersionCheck["status"]; given: Record<string, unknown>; messages: string[] } | null;
  after: { blockId: string; status: VersionCheck["status"]; given: Record<string, unknown>; messages: string[] } | null;
  change: "added" | "removed" | "verdict-changed" | "values-changed" | "unchanged";
  quantities: QuantityRow[];
}

interface CheckRow {
  quantity: string;
  unit: string;
  claimed: number | null;
  computed: number | null;
  ok: boolean | null;
  /** The likely slip of a failing row, as a sentence (contract version 2 hints). */
  hint: string | null;
}

// Claimed values are decimal strings as written since contract version 2.
const num = (v: unknown): number | null => {
  const n = typeof v === "string" && /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(v.trim()) ? Number(v) : v;
  return typeof n === "number" && Number.isFinite(n) ? n : null;
};

function rowsOf(check: VersionCheck): CheckRow[] {
  const rows = new Map<string, CheckRow>();
  const claimed = (check.claim.claimed ?? {}) as Record<string, unknown>;
  const computed = (check.result.computed ?? {}) as Record<string, unknown>;
  for (const row of Array.isArray(check.result.checks) ? (check.result.checks as Record<string, unknown>[]) : []) {
    const quantity = String(row.quantity ?? "");
    if (!quantity) continue;
    rows.set(quantity, {
      quantity,
      unit: String(row.unit ?? ""),
      claimed: num(row.claimed),
      computed: num(row.computed),
      ok: typeof row.ok === "boolean" ? row.ok : null,
      hint: row.ok === false ? hintSentence(row.hint, undefined, String(row.unit ?? "")) : null,
    });
  }
  // Claimed values the engine did not check (an invalid claim) still belong in the table.
  for (const [quantity, value] of Object.entries(claimed)) {
    if (!rows.has(quantity)) {
      const c = computed[quantity] as { value?: unknown; unit?: unknown } | number | undefined;
      const computedValue = typeof c === "object" && c ? num(c.value) : num(c);
      const unit = typeof c === "object" && c && typeof c.unit === "string" ? c.unit : "";
      rows.set(quantity, { quantity, unit, claimed: num(value), computed: computedValue, ok: null, hint: null });
    }
  }
  return [...rows.values()];
}

function side(check: VersionCheck) {
  return {
    blockId: check.blockId,
    status: check.status,
    given: (check.claim.given ?? {}) as Record<string, unknown>,
    messages: Array.isArray(check.result.messages) ? (check.result.messages as unknown[]).map(String) : [],
  };
}

function sameNumber(a: number | null | undefined, b: number | null | undefined): boolean {
  if (a === null || a === undefined || b === null || b === undefined) return a == b;
  return a === b || Math.abs(a - b) <= 1e-12 * Math.max(Math.abs(a), Math.abs(b));
}

function compareOne(before: VersionCheck | null, after: VersionCheck | null, matchedBy: ClaimComparison["matchedBy"]): ClaimComparison {
  const quantities = new Map<string, QuantityRow>();
  for (const r of before ? rowsOf(before) : []) quantities.set(r.quantity, { quantity: r.quantity, unit: r.unit, before: r, after: null });
  for (const r of after ? rowsOf(after) : []) {
    const row = quantities.get(r.quantity);
    if (row) {
      row.after = r;
      row.unit ||= r.unit;
    } else quantities.set(r.quantity, { quantity: r.quantity, unit: r.unit, before: null, after: r });
  }
  const list = [...quantities.values()].map((q) => ({
    ...q,
    before: q.before ? { claimed: q.before.claimed, computed: q.before.computed, ok: q.before.ok, ...(q.before.hint ? { hint: q.before.hint } : {}) } : null,
    after: q.after ? { claimed: q.after.claimed, computed: q.after.computed, ok: q.after.ok, ...(q.after.hint ? { hint: q.after.hint } : {}) } : null,
  }));
  let change: ClaimComparison["change"];
  if (!before) change = "added";
  else if (!after) change = "removed";
  else if (before.status !== after.status) change = "verdict-changed";
  else if (
    JSON.stringify(before.claim.given ?? {}) !== JSON.stringify(after.claim.given ?? {}) ||
    list.some((q) => !sameNumber(q.before?.claimed, q.after?.claimed) || !sameNumber(q.before?.computed, q.after?.computed))
  )
    change = "values-changed";
  else change = "unchanged";
  const label = (after?.label || before?.label || after?.kind || before?.kind) ?? "";
  return { matchedBy, label, kind: (after ?? before)!.kind, before: before ? side(before) : null, after: after ? side(after) : null, change, quantities: list };
}

/**
 * Pairs the claims of two versions: first by block id (the editor keeps it when a block is
 * edited), then by label among those left (a block deleted and written again), and lists
 * the rest as added or removed. Order follows the newer version, removed ones last.
 */
export function compareClaims(before: VersionCheck[], after: VersionCheck[]): ClaimComparison[] {
  const leftBefore = new Map(before.map((c) => [c.blockId, c]));
  const out: ClaimComparison[] = [];
  const unmatchedAfter: VersionCheck[] = [];
  for (const a of after) {
    const b = leftBefore.get(a.blockId);
    if (b) {
      leftBefore.delete(a.blockId);
      out.push(compareOne(b, a, "blockId"));
    } else unmatchedAfter.push(a);
  }
  for (const a of unmatchedAfter) {
    const label = a.label.trim().toLowerCase();
    const b = label ? [...leftBefore.values()].find((c) => c.label.trim().toLowerCase() === label) : undefined;
    if (b) {
      leftBefore.delete(b.blockId);
      out.push(compareOne(b, a, "label"));
    } else out.push(compareOne(null, a, "none"));
  }
  // Keep the newer version's order for what it has.
  const order = new Map(after.map((a, i) => [a.blockId, i]));
  out.sort((x, y) => (order.get(x.after?.blockId ?? "") ?? 0) - (order.get(y.after?.blockId ?? "") ?? 0));
  for (const b of leftBefore.values()) out.push(compareOne(b, null, "none"));
  return out;
}
