import { formatDateTime } from "@/lib/format/dates";
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageTitle } from "@/components/ui/panel";
import { formatScore } from "@/components/review/api";
import { ReviewWorkspace } from "@/components/review/review-workspace";
import { storedContactPictures } from "@/components/coverage/stored-contact-pictures";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { proposalAccess } from "@/lib/dal/assignments";
import { listReviewItems } from "@/lib/dal/review-items";
import { canReadReviewReport } from "@/lib/dal/reports";
import { getReviewScreen, listProposalReviews } from "@/lib/dal/reviews";

export const metadata: Metadata = { title: "Review" };

export default async function ReviewPage({
  params,
  searchParams,
}: {
  params: Promise<{ boardId: string; proposalId: string }>;
  searchParams: Promise<{ assignment?: string }>;
}) {
  const { boardId, proposalId } = await params;
  const { assignment: wanted } = await searchParams;
  const user = await pageUser(`/boards/${boardId}/proposals/${proposalId}/review`);
  const access = await orNotFound(proposalAccess(user, boardId, proposalId));
  // Someone who may not open the proposal (an unassigned or conflicted reviewer) learns nothing about it.
  if (!can(user, "proposal.view", access.facts)) notFound();
  const isChair = can(user, "review.view-all", { role: access.role });
  const reviews = isChair ? await listProposalReviews(user, boardId, proposalId) : [];
  // Reviewers open their own (newest) assignment; the chair picks one of the proposal's reviews.
  const assignmentId = wanted ?? access.myAssignments.at(-1)?.id ?? reviews[0]?.assignmentId;
  if (!assignmentId) {
    return (
      <div className="space-y-4">
        <PageTitle eyebrow="Review" title={access.proposal.title} />
        <p className="text-ink-700">{isChair ? "No reviewer is assigned to this proposal yet." : "You are not assigned to review this proposal."}</p>
        {isChair ? (
          <Link className="text-trajectory-700 underline" href={`/boards/${boardId}/calls/${access.proposal.callId}/assignments`}>
            Assign reviewers
          </Link>
        ) : null}
      </div>
    );
  }
  const screen = await orNotFound(getReviewScreen(user, boardId, assignmentId));
  const items = await listReviewItems(user, boardId, proposalId, { versionId: screen.version.id });
  // The version's review report, for a reviewer once the board's rules open it to them (and for the chair).
  const reportReadable = await canReadReviewReport(user, access, screen.version.id);
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={`Review · ${screen.proposal.callTitle}`} title={screen.proposal.title}>
        <p>
          Version {screen.version.number}, submitted {formatDateTime(screen.version.submittedAt)}
          {screen.proposal.proposerName ? ` by ${screen.proposal.proposerName}` : ""}. Due {formatDateTime(screen.assignment.dueAt)}
          {isChair ? ` · reviewer: ${screen.assignment.reviewerName}` : ""}.
        </p>
      </PageTitle>
      <nav aria-label="Around this review" className="flex flex-wrap gap-3 text-sm">
        {isChair ? (
          <>
            <Link
              href={`/boards/${boardId}/proposals/${proposalId}/decision`}
              className="rounded-chip bg-trajectory-600 px-3 py-1.5 font-semibold text-white hover:bg-trajectory-700"
            >
              {access.proposal.status === "decided" ? "The decision" : "Write the decision"}
            </Link>
            <Link
              href={`/boards/${boardId}/proposals/${proposalId}`}
              className="rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
            >
              The proposal
            </Link>
            <Link
              href={`/boards/${boardId}/calls/${access.proposal.callId}/overview`}
              className="rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
            >
              Call overview
            </Link>
          </>
        ) : (
          <Link href={`/boards/${boardId}/reviews`} className="rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500">
            My reviews
          </Link>
        )}
        <Link
          href={`/boards/${boardId}/proposals/${proposalId}/responses`}
          className="rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
        >
          Response round
        </Link>
        {reportReadable ? (
          <Link
            href={`/boards/${boardId}/proposals/${proposalId}/versions/${screen.version.number}/report`}
            className="rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
          >
            Review report, version {screen.version.number}
          </Link>
        ) : null}
      </nav>
      {isChair && reviews.length > 0 ? (
        <nav aria-label="Reviews of this proposal" className="flex flex-wrap gap-2 text-sm">
          {reviews.map((r) => (
            <Link
              key={r.assignmentId}
              href={`?assignment=${r.assignmentId}`}
              aria-current={r.assignmentId === assignmentId ? "page" : undefined}
              className="rounded-chip border border-ink-300 px-3 py-1 hover:border-trajectory-500 aria-[current=page]:border-trajectory-600 aria-[current=page]:bg-trajectory-100"
            >
              {r.reviewerName} · v{r.versionNumber} · {r.status}
              {r.weightedTotal !== null ? ` · ${formatScore(r.weightedTotal)}` : ""}
              {r.confidence ? ` · confidence ${r.confidence}` : ""}
              {r.expertise ? ` · expertise ${r.expertise}` : ""}
            </Link>
          ))}
        </nav>
      ) : null}
      <ReviewWorkspace
        key={assignmentId}
        boardId={boardId}
        screen={screen}
        items={items}
        canRaise={isChair}
        contactPictures={storedContactPictures(
          screen.checks.map((c) => ({ blockId: c.blockId, label: c.label, kind: c.kind, claim: c.contact?.claim, result: { computed: c.contact?.computed } })),
        )}
      />
    </div>
  );
}
