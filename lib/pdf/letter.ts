import "server-only";
import path from "node:path";
import PDFDocument from "pdfkit";
import type { LetterBlock, LetterRun } from "@/lib/decisions/letter";
import { formatDate } from "@/lib/format/dates";
import { orbitCheckNotice } from "@/lib/dossier/verdict-text";

/**
 * The decision letter as a PDF, drawn on the server with pdfkit in VisViva's own layout:
 * a letterhead with the mark (drawn as vector paths, not an image), the board's name, the
 * date and reference lines, the letter, and on every page a footer with the two-body caution
 * and the page number. Fonts are the app's own Source Sans 3 files (embedded, subset).
 */

export interface LetterPdfInput {
  boardName: string;
  proposalTitle: string;
  versionNumber: number;
  outcomeLabel: string;
  decidedAt: Date;
  blocks: LetterBlock[];
}

/** The footer: the orbit-check contract's notice, in the engine's own words. */
export const LETTER_CAUTION = `Orbit checks: ${orbitCheckNotice()}`;

const FONT_DIR = () => path.join(process.cwd(), "node_modules", "@fontsource", "source-sans-3", "files");
const fontFile = (subset: string, weight: number, style: "normal" | "italic") => path.join(FONT_DIR(), `source-sans-3-${subset}-${weight}-${style}.woff`);

const colours = { ink: "#121a30", muted: "#45537a", brand: "#4b52d1", craft: "#d98a1c", rule: "#d9deeb" };

type Face = "regular" | "bold" | "italic" | "boldItalic";
type Subset = "latin" | "latin-ext" | "greek";

function faceOf(run: Pick<LetterRun, "bold" | "italic">): Face {
  return run.bold ? (run.italic ? "boldItalic" : "bold") : run.italic ? "italic" : "regular";
}

/** Which font file covers a character: Source Sans ships its subsets as separate files. */
function subsetOf(cp: number): Subset {
  if ((cp >= 0x370 && cp <= 0x3ff) || (cp >= 0x1f00 && cp <= 0x1fff)) return "greek";
  if ((cp >= 0x100 && cp <= 0x24f && cp !== 0x131 && cp !== 0x152 && cp !== 0x153) || (cp >= 0x1e00 && cp <= 0x1eff) || (cp >= 0x2c60 && cp <= 0x2c7f))
    return "latin-ext";
  return "latin";
}

function splitBySubset(text: string): { subset: Subset; text: string }[] {
  const out: { subset: Subset; text: string }[] = [];
  for (const ch of text) {
    const subset = subsetOf(ch.codePointAt(0)!);
    const last = out[out.length - 1];
    if (last && last.subset === subset) last.text += ch;
    else out.push({ subset, text: ch });
  }
  return out;
}

export function registerFonts(doc: PDFKit.PDFDocument) {
  const faces: Record<Face, [number, "normal" | "italic"]> = {
    regular: [400, "normal"],
    bold: [700, "normal"],
    italic: [400, "italic"],
    boldItalic: [700, "italic"],
  };
  for (const subset of ["latin", "latin-ext", "greek"] as Subset[]) {
    for (const [face, [weight, style]] of Object.entries(faces)) doc.registerFont(`${subset}-${face}`, fontFile(subset, weight, style));
  }
  doc.registerFont("semibold", fontFile("latin", 600, "normal"));
}

/** The mark: an eccentric orbit, its focus, and the craft near periapsis (as in components/brand-mark.tsx). */
export function drawMark(doc: PDFKit.PDFDocument, x: number, y: number, size: number) {
  const s = size / 32;
  doc.save();
  doc.translate(x, y).scale(s);
  doc.save();
  doc.rotate(-24, { origin: [18, 16] });
  doc.ellipse(18, 16, 12, 8).lineWidth(2).strokeColor(colours.brand).stroke();
  doc.restore();
  doc.circle(12.5, 18.2, 3).fillColor(colours.brand).fill();
  doc.circle(6.6, 21.2, 2).fillColor(colours.craft).fill();
  doc.restore();
}

const MARGIN = 56;
const FOOTER_SPACE = 64;

export function writeRuns(doc: PDFKit.PDFDocument, runs: LetterRun[], options: { x?: number; y?: number; width: number; size: number; colour?: string }) {
  const pieces = runs.flatMap((run) => splitBySubset(run.text).map((p) => ({ ...p, face: faceOf(run), href: run.href })));
  if (pieces.length === 0) pieces.push({ subset: "latin", text: " ", face: "regular", href: undefined });
  doc.fillColor(options.colour ?? colours.ink).fontSize(options.size);
  pieces.forEach((piece, i) => {
    doc.font(`${piece.subset}-${piece.face}`);
    const textOptions: PDFKit.Mixins.TextOptions = {
      width: options.width,
      continued: i < pieces.length - 1,
      lineGap: options.size * 0.3,
      ...(piece.href ? { link: piece.href, underline: true } : { link: null, underline: false }),
    };
    if (i === 0 && options.x !== undefined) doc.text(piece.text, options.x, options.y ?? doc.y, textOptions);
    else doc.text(piece.text, textOptions);
  });
}

function drawLetterhead(doc: PDFKit.PDFDocument, input: LetterPdfInput) {
  const width = doc.page.width - 2 * MARGIN;
  drawMark(doc, MARGIN, MARGIN - 6, 30);
  doc
    .font("latin-bold")
    .fontSize(16)
    .fillColor(colours.brand)
    .text("VisViva", MARGIN + 38, MARGIN, { lineBreak: false });
  doc
    .font("semibold")
    .fontSize(11)
    .fillColor(colours.ink)
    .text(input.boardName, MARGIN + width / 3, MARGIN + 3, { width: (2 * width) / 3, align: "right" });
  const ruleY = MARGIN + 34;
  doc
    .moveTo(MARGIN, ruleY)
    .lineTo(MARGIN + width, ruleY)
    .lineWidth(0.8)
    .strokeColor(colours.rule)
    .stroke();

  doc.y = ruleY + 16;
  const meta: [string, string][] = [
    ["Date", formatDate(input.decidedAt)],
    ["Proposal", input.proposalTitle],
    ["Version", String(input.versionNumber)],
    ["Decision", input.outcomeLabel],
  ];
  for (const [label, value] of meta) {
    const y = doc.y;
    doc
      .font("latin-regular")
      .fontSize(9)
      .fillColor(colours.muted)
      .text(label.toUpperCase(), MARGIN, y + 1.5, { width: 70, characterSpacing: 0.6 });
    doc.y = y;
    writeRuns(doc, [{ text: value, bold: label === "Decision" }], { x: MARGIN + 76, y, width: width - 76, size: 11 });
    doc.y += 2;
  }
  doc.y += 18;
}

export function drawFooters(doc: PDFKit.PDFDocument) {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
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
      .fontSize(8)
      .fillColor(colours.muted)
      .text(LETTER_CAUTION, MARGIN, y, { width: width - 60, lineGap: 1 });
    doc.text(`Page ${i - range.start + 1} of ${range.count}`, MARGIN + width - 60, y, { width: 60, align: "right" });
    doc.page.margins.bottom = bottom;
  }
}

/** Renders the letter; resolves with the PDF bytes. */
export function renderLetterPdf(input: LetterPdfInput): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    try {
      const doc = new PDFDocument({
        size: "A4",
        margins: { top: MARGIN, left: MARGIN, right: MARGIN, bottom: FOOTER_SPACE + 12 },
        bufferPages: true,
        font: fontFile("latin", 400, "normal"),
        info: {
          Title: `Decision on ${input.proposalTitle} (version ${input.versionNumber})`,
          Author: input.boardName,
          Creator: "VisViva",
          Producer: "VisViva",
          CreationDate: input.decidedAt,
        },
      });
      const chunks: Buffer[] = [];
      doc.on("data", (c: Buffer) => chunks.push(c));
      doc.on("end", () => resolve(Buffer.concat(chunks)));
      doc.on("error", reject);
      registerFonts(doc);
      drawLetterhead(doc, input);

      const width = doc.page.width - 2 * MARGIN;
      for (const block of input.blocks) {
        switch (block.type) {
          case "paragraph":
            writeRuns(doc, block.runs, { x: MARGIN, width, size: 11 });
            doc.moveDown(0.6);
            break;
          case "heading":
            doc.moveDown(0.3);
            writeRuns(
              doc,
              block.runs.map((r) => ({ ...r, bold: true })),
              { x: MARGIN, width, size: block.level === 1 ? 15 : block.level === 2 ? 13 : 12 },
            );
            doc.moveDown(0.4);
            break;
          case "list":
            block.items.forEach((item, i) => {
              const y = doc.y;
              doc
                .font("latin-regular")
                .fontSize(11)
                .fillColor(colours.brand)
                .text(block.ordered ? `${i + 1}.` : "•", MARGIN + 4, y, { width: 18 });
              writeRuns(doc, item, { x: MARGIN + 22, y, width: width - 22, size: 11 });
              doc.moveDown(0.25);
            });
            doc.moveDown(0.4);
            break;
          case "quote": {
            const top = doc.y;
            writeRuns(
              doc,
              block.runs.map((r) => ({ ...r, italic: true })),
              { x: MARGIN + 14, width: width - 14, size: 11, colour: colours.muted },
            );
            doc
              .moveTo(MARGIN + 4, top)
              .lineTo(MARGIN + 4, doc.y)
              .lineWidth(2)
              .strokeColor(colours.brand)
              .stroke();
            doc.moveDown(0.6);
            break;
          }
          case "rule":
            doc
              .moveTo(MARGIN, doc.y + 4)
              .lineTo(MARGIN + width, doc.y + 4)
              .lineWidth(0.5)
              .strokeColor(colours.rule)
              .stroke();
            doc.y += 14;
            break;
        }
      }
      drawFooters(doc);
      doc.end();
    } catch (error) {
      reject(error);
    }
  });
}
