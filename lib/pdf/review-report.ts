import "server-only";
import path from "node:path";
import PDFDocument from "pdfkit";
import { formatDateTime } from "@/lib/format/dates";
import { orbitCheckNotice } from "@/lib/dossier/verdict-text";
import { reportNodes, reportTitle, type ReportNode, type ReviewReport } from "@/lib/reports/review-report";

/**
 * The review report as a PDF, drawn with pdfkit like the decision letter (lib/pdf/letter.ts):
 * the same Source Sans 3 files embedded, VisViva's heading, the report's nodes (headings,
 * facts, paragraphs, tables that repeat their header on a new page) and on every page a
 * footer with the two-body caution and the page number.
 */

export const REPORT_CAUTION = `Orbit checks: ${orbitCheckNotice()}`;

const FONT_DIR = () => path.join(process.cwd(), "node_modules", "@fontsource", "source-sans-3", "files");
const fontFile = (subset: string, weight: number, style: "normal" | "italic") => path.join(FONT_DIR(), `source-sans-3-${subset}-${weight}-${style}.woff`);
const colours = { ink: "#121a30", muted: "#45537a", brand: "#4b52d1", craft: "#d98a1c", rule: "#d9deeb", caution: "#8a4b00", row: "#f3f5fa" };

type Face = "regular" | "bold";
type Subset = "latin" | "latin-ext" | "greek";

function subsetOf(cp: number): Subset {
  if ((cp >= 0x370 && cp <= 0x3ff) || (cp >= 0x1f00 && cp <= 0x1fff)) return "greek";
  if ((cp >= 0x100 && cp <= 0x24f && cp !== 0x131 && cp !== 0x152 && cp !== 0x153) || (cp >= 0x1e00 && cp <= 0x1eff) || (cp >= 0x2c60 && cp <= 0x2c7f))
    return "latin-ext";
  return "latin";
}

function pieces(text: string): { subset: Subset; text: string }[] {
  const out: { subset: Subset; text: string }[] = [];
  for (const ch of text) {
    const subset = subsetOf(ch.codePointAt(0)!);
    const last = out[out.length - 1];
    if (last && last.subset === subset) last.text += ch;
    else out.push({ subset, text: ch });
  }
  return out.length ? out : [{ subset: "latin", text: " " }];
}

function registerFonts(doc: PDFKit.PDFDocument) {
  for (const subset of ["latin", "latin-ext", "greek"] as Subset[]) {
    doc.registerFont(`${subset}-regular`, fontFile(subset, 400, "normal"));
    doc.registerFont(`${subset}-bold`, fontFile(subset, 700, "normal"));
  }
}

const MARGIN = 48;
const FOOTER_SPACE = 60;
const MAX_CELL = 800;

/** Writes text that may mix Latin and Greek (Δv) in the right font files. */
function write(
  doc: PDFKit.PDFDocument,
  text: string,
  o: { x: number; y?: number; width: number; size: number; face?: Face; colour?: string; align?: "left" | "right" },
) {
  const parts = pieces(text);
  doc.fillColor(o.colour ?? colours.ink).fontSize(o.size);
  parts.forEach((p, i) => {
    doc.font(`${p.subset}-${o.face ?? "regular"}`);
    const options: PDFKit.Mixins.TextOptions = { width: o.width, continued: i < parts.length - 1, lineGap: o.size * 0.2, align: o.align ?? "left" };
    if (i === 0) doc.text(p.text, o.x, o.y ?? doc.y, options);
    else doc.text(p.text, options);
  });
}

function heightOf(doc: PDFKit.PDFDocument, text: string, width: number, size: number, face: Face = "regular"): number {
  doc.font(`latin-${face}`).fontSize(size);
  return doc.heightOfString(text || " ", { width, lineGap: size * 0.2 });
}

const bottom = (doc: PDFKit.PDFDocument) => doc.page.height - doc.page.margins.bottom;

function ensureRoom(doc: PDFKit.PDFDocument, height: number) {
  if (doc.y + height > bottom(doc)) doc.addPage();
}

function columnWidths(doc: PDFKit.PDFDocument, node: Extract<ReportNode, { type: "table" }>, width: number): number[] {
  doc.font("latin-regular").fontSize(8.5);
  const natural = node.columns.map((c, i) => {
    const longest = Math.max(doc.widthOfString(c), ...node.rows.map((r) => doc.widthOfString((r[i] ?? "").slice(0, 200))));
    return Math.min(Math.max(longest + 8, 40), 260);
  });
  const total = natural.reduce((a, b) => a + b, 0);
  return natural.map((w) => (w / total) * width);
}

function drawTable(doc: PDFKit.PDFDocument, node: Extract<ReportNode, { type: "table" }>, width: number) {
  const size = 8.5;
  const widths = columnWidths(doc, node, width);
  const numeric = new Set(node.numeric ?? []);
  const pad = 3;
  const rowHeight = (cells: string[], face: Face) =>
    Math.max(...cells.map((c, i) => heightOf(doc, c.slice(0, MAX_CELL), widths[i]! - 2 * pad, size, face))) + 2 * pad;
  const drawRow = (cells: string[], face: Face, shade: boolean) => {
    const h = rowHeight(cells, face);
    ensureRoom(doc, h);
    const y = doc.y;
    if (shade) doc.rect(MARGIN, y, width, h).fillColor(colours.row).fill();
    let x = MARGIN;
    cells.forEach((c, i) => {
      write(doc, c.slice(0, MAX_CELL) + (c.length > MAX_CELL ? "…" : ""), {
        x: x + pad,
        y: y + pad,
        width: widths[i]! - 2 * pad,
        size,
        face,
        colour: face === "bold" ? colours.muted : colours.ink,
        align: numeric.has(i) ? "right" : "left",
      });
      x += widths[i]!;
    });
    doc
      .moveTo(MARGIN, y + h)
      .lineTo(MARGIN + width, y + h)
      .lineWidth(0.4)
      .strokeColor(colours.rule)
      .stroke();
    doc.x = MARGIN;
    doc.y = y + h;
  };
  ensureRoom(doc, 40);
  write(doc, node.caption, { x: MARGIN, width, size: 8.5, face: "bold", colour: colours.muted });
  doc.y += 2;
  drawRow(node.columns, "bold", false);
  node.rows.forEach((row, r) => {
    const h = rowHeight(row, "regular");
    if (doc.y + h > bottom(doc)) {
      doc.addPage();
      drawRow(node.columns, "bold", false);
    }
    drawRow(row, "regular", r % 2 === 1);
  });
  doc.y += 8;
}

function drawNode(doc: PDFKit.PDFDocument, node: ReportNode, width: number) {
  switch (node.type) {
    case "heading": {
      const size = node.level === 2 ? 14 : 11;
      ensureRoom(doc, size * 4);
      doc.y += node.level === 2 ? 10 : 4;
      write(doc, node.text, { x: MARGIN, width, size, face: "bold", colour: node.level === 2 ? colours.brand : colours.ink });
      if (node.level === 2) {
        doc
          .moveTo(MARGIN, doc.y + 1)
          .lineTo(MARGIN + width, doc.y + 1)
          .lineWidth(0.6)
          .strokeColor(colours.rule)
          .stroke();
        doc.y += 5;
      } else doc.y += 2;
      return;
    }
    case "paragraph":
      write(doc, node.text, {
        x: MARGIN,
        width,
        size: node.tone === "muted" ? 9 : 10,
        face: node.tone === "strong" ? "bold" : "regular",
        colour: node.tone === "muted" ? colours.muted : node.tone === "caution" ? colours.caution : colours.ink,
      });
      doc.y += 4;
      return;
    case "facts":
      for (const [k, v] of node.pairs) {
        const h = Math.max(heightOf(doc, v, width - 96, 10), 12);
        ensureRoom(doc, h);
        const y = doc.y;
        write(doc, k, { x: MARGIN, y, width: 90, size: 9, colour: colours.muted });
        write(doc, v, { x: MARGIN + 96, y, width: width - 96, size: 10 });
        doc.y = Math.max(doc.y, y + h) + 1;
      }
      doc.y += 4;
      return;
    case "list":
      for (const item of node.items) {
        ensureRoom(doc, 14);
        const y = doc.y;
        write(doc, "•", { x: MARGIN + 4, y, width: 10, size: 10, colour: colours.brand });
        write(doc, item, { x: MARGIN + 16, y, width: width - 16, size: 9.5 });
        doc.y += 2;
      }
      doc.y += 2;
      return;
    case "table":
      drawTable(doc, node, width);
      return;
  }
}

function drawFooters(doc: PDFKit.PDFDocument, title: string) {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const keep = doc.page.margins.bottom;
    doc.page.margins.bottom = 0; // writing inside the margin must not open a new page
    const width = doc.page.width - 2 * MARGIN;
    const y = doc.page.height - FOOTER_SPACE + 8;
    doc
      .moveTo(MARGIN, y - 8)
      .lineTo(MARGIN + width, y - 8)
      .lineWidth(0.5)
      .strokeColor(colours.rule)
      .stroke();
    doc
      .font("latin-regular")
      .fontSize(7.5)
      .fillColor(colours.muted)
      .text(REPORT_CAUTION, MARGIN, y, { width: width - 70, lineGap: 1 });
    doc.text(`Page ${i - range.start + 1} of ${range.count}`, MARGIN + width - 60, y, { width: 60, align: "right" });
    doc.text(title.slice(0, 120), MARGIN, doc.page.height - 22, { width: width - 70, lineBreak: false });
    doc.page.margins.bottom = keep;
  }
}

/** Renders the report; resolves with the PDF bytes. */
export function renderReviewReportPdf(report: ReviewReport): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    try {
      const title = reportTitle(report);
      const doc = new PDFDocument({
        size: "A4",
        margins: { top: MARGIN, left: MARGIN, right: MARGIN, bottom: FOOTER_SPACE + 10 },
        bufferPages: true,
        font: fontFile("latin", 400, "normal"),
        info: { Title: title, Author: report.board.name, Creator: "VisViva", Producer: "VisViva", CreationDate: new Date(report.generatedAt) },
      });
      const chunks: Buffer[] = [];
      doc.on("data", (c: Buffer) => chunks.push(c));
      doc.on("end", () => resolve(Buffer.concat(chunks)));
      doc.on("error", reject);
      registerFonts(doc);
      const width = doc.page.width - 2 * MARGIN;
      write(doc, "VisViva", { x: MARGIN, y: MARGIN, width, size: 10, face: "bold", colour: colours.brand });
      write(doc, report.board.name, { x: MARGIN, y: MARGIN, width, size: 10, colour: colours.muted, align: "right" });
      doc.y = MARGIN + 20;
      write(doc, title, { x: MARGIN, width, size: 17, face: "bold" });
      doc.y += 6;
      for (const node of reportNodes(report, formatDateTime)) drawNode(doc, node, width);
      drawFooters(doc, title);
      doc.end();
    } catch (error) {
      reject(error);
    }
  });
}
