import { z } from "zod";

/** How the review report is answered; without `format` the Accept header decides (HTML by default). */
export const reportFormats = ["html", "pdf", "json"] as const;
export type ReportFormat = (typeof reportFormats)[number];

export const reportQuery = z.object({
  format: z.enum(reportFormats, { message: "must be html, pdf or json" }).optional(),
});

/** The format a request asks for: ?format= first, then Accept (PDF, then JSON without HTML), else HTML. */
export function reportFormatOf(format: ReportFormat | undefined, accept: string | null): ReportFormat {
  if (format) return format;
  const a = (accept ?? "").toLowerCase();
  if (a.includes("application/pdf")) return "pdf";
  if (a.includes("application/json") && !a.includes("text/html")) return "json";
  return "html";
}
