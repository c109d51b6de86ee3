import "server-only";
import path from "node:path";
import PDFDocument from "pdfkit";
import type { MeetingMinutes } from "@/lib/dal/meetings";
import { formatDateTime } from "@/lib/format/dates";
import { DEFAULT_LAMBDA } from "@/lib/review/calibration";
import { drawFooters, drawMark, registerFonts, writeRuns } from "./letter";

/**
 * The panel meeting's minutes as a PDF, in the letter's look (same fonts, mark and footer
 * with the orbit-check caution): attendance, then per proposal in the meeting's order the
 * scores (raw and calibrated), who stepped out, the consensus score, recommendation and notes.
 */

const MARGIN = 56;
const FOOTER_SPACE = 64;
const colours = { ink: "#121a30", muted: "#45537a", brand: "#4b52d1", rule: "#d9deeb" };

const fmt = (v: number | null, digits = 2) => (v === null ? "none" : v.toFixed(digits));

export function renderMinutesPdf(input: MeetingMinutes & { boardName: string }): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    try {
      const doc = new PDFDocument({
        size: "A4",
        margins: { top: MARGIN, left: MARGIN, right: MARGIN, bottom: FOOTER_SPACE + 12 },
        bufferPages: true,
        font: path.join(process.cwd(), "node_modules", "@fontsource", "source-sans-3", "files", "source-sans-3-latin-400-normal.woff"),
        info: { Title: `Minutes of the panel meeting: ${input.callTitle}`, Author: input.boardName, Creator: "VisViva", Producer: "VisViva" },
      });
      const chunks: Buffer[] = [];
      doc.on("data", (c: Buffer) => chunks.push(c));
      doc.on("end", () => resolve(Buffer.concat(chunks)));
      doc.on("error", reject);
      registerFonts(doc);
      const width = doc.page.width - 2 * MARGIN;

      drawMark(doc, MARGIN, MARGIN - 6, 30);
      doc
        .font("latin-bold")
        .fontSize(16)
        .fillColor(colours.brand)
        .text("VisViva", MARGIN + 38, MARGIN, { lineBreak: false });
      doc.y = MARGIN + 40;
      const heading = (text: string, size = 14) => {
        doc.moveDown(0.4);
        writeRuns(doc, [{ text, bold: true }], { x: MARGIN, width, size, colour: colours.ink });
        doc.moveDown(0.2);
      };
      const line = (label: string, value: string) => writeRuns(doc, [{ text: `${label}: `, bold: true }, { text: value }], { x: MARGIN, width, size: 10.5 });

      heading("Minutes of the panel meeting", 18);
      line("Board", input.boardName);
      line("Call", input.callTitle);
      line("Started", formatDateTime(input.startedAt));
      line("Closed", input.closedAt ? formatDateTime(input.closedAt) : "still open when these minutes were exported");
      line("Rubric scale", input.scale ? `${input.scale.min} to ${input.scale.max}` : "no rubric");

      heading("Attendance");
      line("Present", input.present.length ? input.present.join(", ") : "nobody marked present");
      line("Not marked present", input.absent.length ? input.absent.join(", ") : "none");

      heading("Proposals discussed");
      writeRuns(
        doc,
        [
          {
            text: `Calibrated means remove each reviewer's fitted leniency (additive reviewer effects shrunk toward zero, ridge λ = ${DEFAULT_LAMBDA}); raw means are the plain average of the reviewers' weighted totals. Spread is the sample standard deviation of the raw scores.`,
            italic: true,
          },
        ],
        { x: MARGIN, width, size: 9.5, colour: colours.muted },
      );
      for (const e of input.entries) {
        heading(`${e.position}. ${e.title}`, 12);
        line("Scores", `raw mean ${fmt(e.rawMean)}, calibrated mean ${fmt(e.calibratedMean)}, spread ${fmt(e.spread)}`);
        if (e.rankNote) line("Ranking", e.rankNote);
        if (e.outliers) line("Outlying scores", `${e.outliers} flagged for discussion`);
        line("Stepped out (conflict)", e.steppedOut.length ? e.steppedOut.join(", ") : "nobody");
        line("Consensus score", fmt(e.consensusScore));
        line("Recommendation", e.recommendation ?? "none recorded");
        line("Notes", e.notes.trim() || "none");
      }
      drawFooters(doc);
      doc.end();
    } catch (error) {
      reject(error as Error);
    }
  });
}
