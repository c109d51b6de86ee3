import crypto from "node:crypto";
import { requireUser } from "@/lib/auth/session";
import { getReviewReport } from "@/lib/dal/reports";
import { formatDateTime } from "@/lib/format/dates";
import { json, parseWith, route, searchParamsObject } from "@/lib/http/api";
import { renderReviewReportPdf } from "@/lib/pdf/review-report";
import { renderReportDocument, REPORT_STYLE } from "@/lib/reports/html";
import { reportFilename } from "@/lib/reports/review-report";
import { versionNumberSchema } from "@/lib/validation/dossier";
import { reportFormatOf, reportQuery } from "@/lib/validation/reports";

// The standalone HTML document runs no script; its one style sheet is allowed by hash.
const STYLE_HASH = crypto.createHash("sha256").update(REPORT_STYLE).digest("base64");

/** The review report of a version: HTML (default), PDF or JSON, by ?format= or the Accept header. */
export const GET = route(async (request, { boardId, proposalId, number }) => {
  const user = await requireUser();
  const query = parseWith(reportQuery, searchParamsObject(request), 400);
  const n = parseWith(versionNumberSchema, number, 400);
  const format = reportFormatOf(query.format, request.headers.get("accept"));
  const report = await getReviewReport(user, boardId!, proposalId!, n);
  const common = { "cache-control": "no-store", vary: "Accept" };
  if (format === "json") return json({ report }, { headers: common });
  if (format === "pdf") {
    const pdf = await renderReviewReportPdf(report);
    return new Response(new Uint8Array(pdf), {
      status: 200,
      headers: {
        ...common,
        "content-type": "application/pdf",
        "content-disposition": `attachment; filename="${reportFilename(report.proposal.title, report.version.number)}"`,
      },
    });
  }
  return new Response(renderReportDocument(report, formatDateTime), {
    status: 200,
    headers: {
      ...common,
      "content-type": "text/html; charset=utf-8",
      "content-security-policy": `default-src 'none'; style-src 'sha256-${STYLE_HASH}'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'`,
    },
  });
});
