/**
 * The review report's nodes as HTML: a fragment for the report page (Tailwind classes) and
 * a standalone document for the API (its own small style sheet, no script). Every text is
 * escaped; tables have captions and header cells with scope, so screen readers can follow.
 * Pure.
 */
import { escapeHtml } from "@/lib/decisions/letter";
import { reportNodes, reportTitle, type ReportNode, type ReviewReport } from "./review-report";

const toneClass = {
  muted: "text-sm text-ink-600",
  caution: "rounded-chip border border-drift-500 bg-drift-100 px-3 py-2 text-sm text-drift-700",
  strong: "font-semibold text-ink-950",
} as const;

function nodeHtml(node: ReportNode): string {
  switch (node.type) {
    case "heading": {
      const tag = node.level === 2 ? "h2" : "h3";
      const cls =
        node.level === 2 ? "mt-8 mb-2 border-b border-ink-200 pb-1 text-xl font-semibold text-ink-950" : "mt-5 mb-1 text-base font-semibold text-ink-900";
      return `<${tag}${node.id ? ` id="report-${escapeHtml(node.id)}"` : ""} class="${cls}">${escapeHtml(node.text)}</${tag}>`;
    }
    case "paragraph":
      return `<p class="my-2 whitespace-pre-line ${node.tone ? toneClass[node.tone] : "text-ink-800"}">${escapeHtml(node.text)}</p>`;
    case "facts":
      return `<dl class="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">${node.pairs
        .map(([k, v]) => `<dt class="text-ink-600">${escapeHtml(k)}</dt><dd class="text-ink-950">${escapeHtml(v)}</dd>`)
        .join("")}</dl>`;
    case "list":
      return `<ul class="my-2 list-disc pl-6 text-sm text-ink-800">${node.items.map((i) => `<li>${escapeHtml(i)}</li>`).join("")}</ul>`;
    case "table": {
      const numeric = new Set(node.numeric ?? []);
      const cell = (i: number) => (numeric.has(i) ? "px-2 py-1 text-right font-mono" : "px-2 py-1 align-top");
      return `<div class="my-3 overflow-x-auto"><table class="w-full border-collapse text-sm"><caption class="mb-1 text-left text-xs font-semibold text-ink-600">${escapeHtml(
        node.caption,
      )}</caption><thead><tr class="border-b border-ink-300">${node.columns
        .map(
          (c, i) =>
            `<th scope="col" class="${numeric.has(i) ? "px-2 py-1 text-right" : "px-2 py-1 text-left"} font-semibold text-ink-700">${escapeHtml(c)}</th>`,
        )
        .join("")}</tr></thead><tbody>${node.rows
        .map(
          (row) =>
            `<tr class="border-b border-ink-100">${row
              .map((v, i) =>
                i === 0
                  ? `<th scope="row" class="${cell(i)} text-left font-normal text-ink-900">${escapeHtml(v)}</th>`
                  : `<td class="${cell(i)}">${escapeHtml(v)}</td>`,
              )
              .join("")}</tr>`,
        )
        .join("")}</tbody></table></div>`;
    }
  }
}

/** The report body for the report page (inside the app's layout). */
export function renderReportFragment(report: ReviewReport, dateText: (iso: string) => string): string {
  return reportNodes(report, dateText).map(nodeHtml).join("\n");
}

/** The style sheet of the standalone document (the API's text/html answer); its hash goes in that answer's CSP. */
export const REPORT_STYLE = [
  "body{font-family:system-ui,sans-serif;color:#121a30;max-width:60rem;margin:2rem auto;padding:0 1rem;line-height:1.45}",
  "h1{font-size:1.5rem}h2{font-size:1.2rem;border-bottom:1px solid #d9deeb;padding-bottom:.2rem;margin-top:2rem}h3{font-size:1rem;margin-top:1.2rem}",
  "dl{display:grid;grid-template-columns:max-content 1fr;gap:.2rem 1rem}dt{color:#45537a}dd{margin:0}",
  "table{border-collapse:collapse;width:100%;font-size:.9rem;margin:.6rem 0}caption{text-align:left;font-weight:600;color:#45537a}",
  "th,td{border-bottom:1px solid #e6e9f2;padding:.2rem .4rem;text-align:left;vertical-align:top}.text-right{text-align:right}",
  ".text-drift-700{color:#8a4b00}.rounded-chip{border:1px solid #d98a1c;padding:.4rem .6rem}.text-ink-600,.text-sm.text-ink-600{color:#45537a}",
  ".whitespace-pre-line{white-space:pre-line}",
].join("\n");

/** The report as a standalone HTML document (no script, one inline style sheet). */
export function renderReportDocument(report: ReviewReport, dateText: (iso: string) => string): string {
  const title = reportTitle(report);
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>${REPORT_STYLE}</style>
</head>
<body>
<main>
<h1>${escapeHtml(title)}</h1>
${renderReportFragment(report, dateText)}
</main>
</body>
</html>
`;
}
