/**
 * Server-side HTML of a dossier, from its JSON, through the same sanitizer the API uses.
 * A hand-walk rather than a DOM serializer: every piece of text and every attribute value
 * is escaped here, and only the elements below can appear.
 */
import { quantityInfo } from "@/lib/orbit";
import { REQUIREMENT_STATUS_LABELS, type RequirementOutcome } from "@/lib/requirements/types";
import { CONSISTENT_MEANS, bodyLabel, kindLabel, policySummary, quantityLabel } from "@/lib/orbit/labels";
import { sanitizeDossier } from "./sanitize";
import type { DossierClaim, DossierMark, DossierNode, SanitizeContext, WrittenValues } from "./schema";
import { convertWritten } from "./units";
import { checkSentence, rowHint } from "./verdict-text";
import { sourceNote, sourceOf, type AttachmentRef } from "@/lib/orbit-files/source";

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/** The verdict the server found for a block, shown beside it when given. */
export interface BlockVerdict {
  status: "consistent" | "inconsistent" | "invalid";
  checks?: {
    quantity: string;
    claimed: unknown;
    computed: unknown;
    unit: string;
    relativeError: number | null;
    ok: boolean;
    allowance?: unknown;
    basis?: unknown;
    hint?: unknown;
  }[];
  messages?: string[];
  /** The call's requirements judged on this claim at submission. */
  requirements?: RequirementOutcome[];
}

export interface RenderOptions extends SanitizeContext {
  /** Server verdicts by blockId. */
  verdicts?: Record<string, BlockVerdict>;
  /** The call's tolerance policy, named beside each verdict. */
  tolerance?: { relative?: number; absolute?: Record<string, number | undefined> };
  /** The proposal's attachments now: a block made from a file then says when that file changed or left. */
  attachments?: readonly AttachmentRef[];
}

const attr = (name: string, value: unknown) => (value === undefined || value === null ? "" : ` ${name}="${escapeHtml(String(value))}"`);

function renderMarks(text: string, marks: DossierMark[] | undefined): string {
  let html = escapeHtml(text);
  for (const mark of marks ?? []) {
    switch (mark.type) {
      case "bold":
        html = `<strong>${html}</strong>`;
        break;
      case "italic":
        html = `<em>${html}</em>`;
        break;
      case "strike":
        html = `<s>${html}</s>`;
        break;
      case "underline":
        html = `<u>${html}</u>`;
        break;
      case "code":
        html = `<code>${html}</code>`;
        break;
      case "link":
        html = `<a${attr("href", mark.attrs?.href)} rel="noopener noreferrer nofollow">${html}</a>`;
        break;
    }
  }
  return html;
}

export function formatValue(value: unknown): string {
  if (typeof value === "number") return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(6)));
  if (Array.isArray(value)) return `[${value.map(formatValue).join(", ")}]`;
  if (typeof value === "object" && value !== null) {
    const rec = value as Record<string, unknown>;
    if ("name" in rec && "deltaV" in rec) return `${String(rec.name)}: ${formatValue(rec.deltaV)}`;
    return Object.entries(rec)
      .map(([k, v]) => `${k} ${formatValue(v)}`)
      .join(", ");
  }
  return String(value);
}

function unitOf(name: string): string {
  const unit = quantityInfo(name)?.unit ?? "";
  return unit === "1" ? "" : unit;
}

function bodyName(body: unknown): string {
  if (typeof body === "string" || (typeof body === "object" && body !== null)) return bodyLabel(body);
  return "default body";
}

const STATUS_TEXT: Record<BlockVerdict["status"], string> = {
  consistent: "Consistent",
  inconsistent: "Inconsistent",
  invalid: "Cannot be evaluated",
};

/** "Orbital period: claimed 6052 s, recomputed 6052.3 s, within ±1 s (absolute bound) (0.005 % off)", and the likely slip. */
function checkLine(c: NonNullable<BlockVerdict["checks"]>[number]): string {
  const off = typeof c.relativeError === "number" && Number.isFinite(c.relativeError) ? ` (${formatPercent(c.relativeError)} off)` : "";
  const hint = rowHint(c);
  return `${checkSentence(c)}${off}${hint ? `. Likely slip: ${hint}` : ""}`;
}

/** "96.5 min (= 5790 s)": the value as written, with the contract-unit value when converted. */
function writtenValue(name: string, value: unknown, written: { text: string; unit: string; station?: string } | undefined): string {
  const unit = unitOf(name);
  if (!written) return `${formatValue(value)}${unit ? ` ${unit}` : ""}`;
  // A value copied from a board station says so ("10 deg, from the board station North site").
  const from = written.station ? `, from the board station ${written.station}` : "";
  const c = convertWritten(written, quantityInfo(name)?.unit ?? "");
  if ("error" in c || c.factor === 1) return `${written.text}${written.unit && written.unit !== "1" ? ` ${written.unit}` : ""}${from}`;
  return `${written.text} ${written.unit} (= ${formatValue(c.value)}${unit ? ` ${unit}` : ""})${from}`;
}

function formatPercent(fraction: number): string {
  const pct = fraction * 100;
  return `${pct >= 10 ? pct.toFixed(0) : pct >= 0.1 ? pct.toFixed(2) : pct.toPrecision(1)} %`;
}

/** "Requirement not met: Re-entry within 25 years … — re-entry takes 57.7 years …" per outcome. */
function requirementsHtml(outcomes: RequirementOutcome[] | undefined): string {
  if (!outcomes || outcomes.length === 0) return "";
  const line = (o: RequirementOutcome) =>
    `<li data-requirement-status="${escapeHtml(o.status)}"><strong>Requirement ${escapeHtml(REQUIREMENT_STATUS_LABELS[o.status])}:</strong> ` +
    `${escapeHtml(o.title)} — ${escapeHtml(o.reason)}</li>`;
  return `<div class="orbit-check-requirements"><strong>Call requirements</strong><ul>${outcomes.map(line).join("")}</ul></div>`;
}

/** "Made from <file>, orbit <n>", and what happened to that file since, when the attachments are known. */
function sourceHtml(value: unknown, options: RenderOptions): string {
  const source = sourceOf(value);
  if (!source) return "";
  const note = sourceNote(source, options.attachments ?? null);
  return (
    `<div class="orbit-check-source" data-orbit-check-source="${escapeHtml(note.state)}">${escapeHtml(note.madeFrom)}` +
    (note.problem ? `<div class="orbit-check-source-problem" role="status">${escapeHtml(note.problem)}</div>` : "") +
    `</div>`
  );
}

function renderOrbitCheck(node: DossierNode, options: RenderOptions): string {
  const a = node.attrs ?? {};
  const blockId = String(a.blockId ?? "");
  const claim = (a.claim ?? { kind: "orbit", given: {} }) as DossierClaim;
  const label = typeof a.label === "string" && a.label.trim() ? a.label.trim() : `${kindLabel(claim.kind)} claim`;
  const written = (a.written ?? {}) as WrittenValues;
  const rows = (title: string, values: Record<string, unknown> | undefined, side: "given" | "claimed") => {
    const entries = Object.entries(values ?? {});
    if (entries.length === 0) return "";
    return (
      `<tr><th colspan="2" scope="colgroup">${escapeHtml(title)}</th></tr>` +
      entries
        .map(
          ([k, v]) =>
            `<tr><th scope="row">${escapeHtml(quantityLabel(k, "", claim.kind))}</th><td>${escapeHtml(writtenValue(k, v, written[side]?.[k]))}</td></tr>`,
        )
        .join("")
    );
  };
  const verdict = options.verdicts?.[blockId];
  const verdictHtml = verdict
    ? `<div class="orbit-check-verdict" data-status="${escapeHtml(verdict.status)}"><strong>Server check: ${escapeHtml(STATUS_TEXT[verdict.status])}</strong>` +
      (verdict.checks ?? []).map((c) => `<div data-check-ok="${c.ok}">${escapeHtml(checkLine(c))}</div>`).join("") +
      (verdict.messages ?? []).map((m) => `<div>${escapeHtml(m)}</div>`).join("") +
      `<div class="orbit-check-means" data-consistent-means="">${escapeHtml(CONSISTENT_MEANS)}${options.tolerance ? ` This call: ${escapeHtml(policySummary(options.tolerance))}.` : ""}</div>` +
      `</div>` +
      requirementsHtml(verdict.requirements)
    : "";
  return (
    `<figure class="orbit-check" id="orbit-check-${escapeHtml(blockId)}" data-orbit-check="" data-block-id="${escapeHtml(blockId)}" data-kind="${escapeHtml(claim.kind)}"${verdict ? attr("data-status", verdict.status) : ""}>` +
    `<figcaption><strong>${escapeHtml(label)}</strong> · ${escapeHtml(kindLabel(claim.kind))} · ${escapeHtml(bodyName(claim.body))}</figcaption>` +
    sourceHtml(a.source, options) +
    `<table class="orbit-check-values"><tbody>${rows("Given", claim.given, "given")}${rows("Claimed", claim.claimed, "claimed")}</tbody></table>` +
    verdictHtml +
    `</figure>`
  );
}

function renderNode(node: DossierNode, options: RenderOptions): string {
  const inner = () => (node.content ?? []).map((child) => renderNode(child, options)).join("");
  switch (node.type) {
    case "text":
      return renderMarks(node.text ?? "", node.marks);
    case "paragraph":
      return `<p>${inner()}</p>`;
    case "heading": {
      const level = Number(node.attrs?.level ?? 2);
      const tag = `h${level >= 1 && level <= 3 ? level : 2}`;
      return `<${tag}>${inner()}</${tag}>`;
    }
    case "bulletList":
      return `<ul>${inner()}</ul>`;
    case "orderedList":
      return `<ol${node.attrs?.start !== undefined && node.attrs.start !== 1 ? attr("start", node.attrs.start) : ""}>${inner()}</ol>`;
    case "listItem":
      return `<li>${inner()}</li>`;
    case "blockquote":
      return `<blockquote>${inner()}</blockquote>`;
    case "codeBlock":
      return `<pre><code>${inner()}</code></pre>`;
    case "hardBreak":
      return "<br>";
    case "horizontalRule":
      return "<hr>";
    case "table":
      return `<table><tbody>${inner()}</tbody></table>`;
    case "tableRow":
      return `<tr>${inner()}</tr>`;
    case "tableHeader":
    case "tableCell": {
      const tag = node.type === "tableHeader" ? "th" : "td";
      const span = (n: string) => (typeof node.attrs?.[n] === "number" && node.attrs[n] !== 1 ? attr(n, node.attrs[n]) : "");
      return `<${tag}${span("colspan")}${span("rowspan")}>${inner()}</${tag}>`;
    }
    case "image":
      return `<img${attr("src", node.attrs?.src)}${attr("alt", node.attrs?.alt ?? "")}${attr("title", node.attrs?.title)} loading="lazy">`;
    case "orbitCheck":
      return renderOrbitCheck(node, options);
    default:
      return "";
  }
}

/** Sanitized HTML of a stored or submitted document. Never throws on bad input. */
export function renderDossierHtml(doc: unknown, options: RenderOptions = {}): string {
  const { doc: clean } = sanitizeDossier(doc, options);
  return clean.content.map((node) => renderNode(node, options)).join("\n");
}

/** The document as plain text (search, e-mail excerpts, diffs): one line per block. */
export function dossierPlainText(doc: unknown): string {
  const { doc: clean } = sanitizeDossier(doc);
  const lines: string[] = [];
  const textOf = (node: DossierNode): string => {
    if (node.type === "text") return node.text ?? "";
    if (node.type === "hardBreak") return "\n";
    return (node.content ?? []).map(textOf).join("");
  };
  const walk = (node: DossierNode) => {
    if (["paragraph", "heading", "codeBlock"].includes(node.type)) {
      lines.push(textOf(node));
    } else if (node.type === "tableRow") {
      lines.push((node.content ?? []).map(textOf).join("\t"));
    } else if (node.type === "orbitCheck") {
      const claim = node.attrs?.claim as DossierClaim | undefined;
      const label = typeof node.attrs?.label === "string" && node.attrs.label ? node.attrs.label : (claim?.kind ?? "orbit check");
      lines.push(`[orbit check: ${label} (${claim?.kind ? kindLabel(claim.kind) : "?"})]`);
    } else if (node.type === "image") {
      lines.push(`[image: ${String(node.attrs?.alt ?? "")}]`);
    } else {
      (node.content ?? []).forEach(walk);
    }
  };
  clean.content.forEach(walk);
  return lines
    .join("\n")
    .replace(/\n{3,}/g, "\n\n")
    .trim();
}
