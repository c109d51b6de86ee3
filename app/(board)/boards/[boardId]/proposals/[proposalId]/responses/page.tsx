import { formatDateTime } from "@/lib/format/dates";
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageTitle, Panel } from "@/components/ui/panel";
import { ProposalReviewItems } from "@/components/review/proposal-review-items";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { proposalAccess } from "@/lib/dal/assignments";
import { listReviewItems } from "@/lib/dal/review-items";
import { getProposalResponseWindow, listAnswerSections } from "@/lib/dal/responses";

export const metadata: Metadata = { title: "Response round" };

/**
 * The response round of one proposal: its review items as the viewer may see them, with the
 * proposer's answers and the dispositions. Authors answer here while the window is open;
 * the item's reviewer and the chair record dispositions.
 */
export default async function ResponsesPage({ params }: { params: Promise<{ boardId: string; proposalId: string }> }) {
  const { boardId, proposalId } = await params;
  const user = await pageUser(`/boards/${boardId}/proposals/${proposalId}/responses`);
  const access = await orNotFound(proposalAccess(user, boardId, proposalId));
  if (!can(user, "proposal.view", access.facts)) notFound();
  const [window, items] = await Promise.all([getProposalResponseWindow(user, boardId, proposalId), listReviewItems(user, boardId, proposalId)]);
  const oldest = items.reduce((m, i) => Math.min(m, i.versionNumber), Number.POSITIVE_INFINITY);
  const sections = access.isAuthor && items.length > 0 ? await listAnswerSections(user, boardId, proposalId, oldest) : [];
  const unanswered = items.filter((i) => !i.answer).length;
  return (
    <div className="space-y-6">
      <PageTitle eyebrow="Response round" title={access.proposal.title}>
        {window ? (
          <p data-response-window={window.state}>
            {window.state === "open"
              ? `Open until ${formatDateTime(window.closesAt)}.`
              : window.state === "upcoming"
                ? `Opens on ${formatDateTime(window.opensAt)} and closes on ${formatDateTime(window.closesAt)}.`
                : `Closed on ${formatDateTime(window.closesAt)}.`}
          </p>
        ) : (
          <p>The chair has not opened a response round for this call.</p>
        )}
      </PageTitle>
      <nav aria-label="Around the response round" className="flex flex-wrap gap-3 text-sm">
        <Link
          href={`/boards/${boardId}/proposals/${proposalId}`}
          className="rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
        >
          The proposal
        </Link>
        {access.role === "chair" ? (
          <Link
            href={`/boards/${boardId}/proposals/${proposalId}/decision`}
            className="rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
          >
            {access.proposal.status === "decided" ? "The decision" : "Write the decision"}
          </Link>
        ) : null}
        {access.myAssignments.length > 0 ? (
          <Link
            href={`/boards/${boardId}/proposals/${proposalId}/review`}
            className="rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
          >
            My review
          </Link>
        ) : null}
      </nav>
      {access.isAuthor && window?.state === "open" ? (
        <Panel title="How to answer">
          <p className="text-sm">
            Answer each item below; {unanswered === 0 ? "every item has an answer." : `${unanswered} of ${items.length} still need one.`} An answer may point at
            a section of a newer version of your dossier. You can change answers until the round closes.
          </p>
        </Panel>
      ) : null}
      {items.length > 0 ? (
        <ProposalReviewItems boardId={boardId} initialItems={items} answerSections={sections} />
      ) : (
        <Panel title="Review items">
          <p className="text-sm text-ink-600">No review items you can see yet.</p>
        </Panel>
      )}
    </div>
  );
}
