import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageTitle } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { getReviewReport } from "@/lib/dal/reports";
import { formatDateTime } from "@/lib/format/dates";
import { renderReportFragment } from "@/lib/reports/html";
import { REPORT_SECTIONS } from "@/lib/reports/review-report";

export const metadata: Metadata = { title: "Review report" };

/** The review report of one version: the same document the API and the PDF give (lib/reports). */
export default async function ReviewReportPage({ params }: { params: Promise<{ boardId: string; proposalId: string; n: string }> }) {
  const { boardId, proposalId, n } = await params;
  const number = Number(n);
  if (!Number.isInteger(number) || number < 1) notFound();
  const user = await pageUser(`/boards/${boardId}/proposals/${proposalId}/versions/${n}/report`);
  const report = await orNotFound(getReviewReport(user, boardId, proposalId, number));
  const api = `/api/v1/boards/${boardId}/proposals/${proposalId}/versions/${number}/report`;
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={`Review report · ${report.call.title}`} title={`${report.proposal.title}: version ${report.version.number}`}>
        <p className="flex flex-wrap gap-3 text-sm">
          <a className="rounded-chip border border-trajectory-500 px-3 py-1.5 font-semibold text-trajectory-700" href={`${api}?format=pdf`}>
            Download the report (PDF)
          </a>
          <Link className="rounded-chip border border-ink-300 px-3 py-1.5 text-ink-800" href={`/boards/${boardId}/proposals/${proposalId}`}>
            Back to the proposal
          </Link>
          <Link className="rounded-chip border border-ink-300 px-3 py-1.5 text-ink-800" href={`/boards/${boardId}/proposals/${proposalId}/versions/${number}`}>
            Read version {number}
          </Link>
        </p>
      </PageTitle>
      <nav aria-label="Sections of the report" className="text-sm">
        <ul className="flex flex-wrap gap-3">
          {(Object.entries(REPORT_SECTIONS) as [string, string][]).map(([id, title]) => (
            <li key={id}>
              <a className="text-trajectory-700 underline" href={`#report-${id}`}>
                {title}
              </a>
            </li>
          ))}
        </ul>
      </nav>
      <article
        aria-label="Review report"
        className="rounded-panel border border-ink-200 bg-paper p-5"
        // Built from escaped text only (lib/reports/html.ts): no markup from users reaches it.
        dangerouslySetInnerHTML={{ __html: renderReportFragment(report, formatDateTime) }}
      />
    </div>
  );
}
