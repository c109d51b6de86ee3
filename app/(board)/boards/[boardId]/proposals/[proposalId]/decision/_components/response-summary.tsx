import { formatDateTime } from "@/lib/format/dates";
import Link from "next/link";
import { Panel } from "@/components/ui/panel";
import { DispositionChip } from "@/components/review/item-response";
import type { SessionUser } from "@/lib/auth/session";
import { getProposalResponseWindow } from "@/lib/dal/responses";
import { listReviewItems } from "@/lib/dal/review-items";
import { listProposalReviews } from "@/lib/dal/reviews";
import { CONFIDENCE_LABELS, EXPERTISE_LABELS } from "@/lib/review/responses";

/**
 * The chair's view of the response round on the decision page: each reviewer's stated
 * confidence and expertise (shown, weighting nothing), and per review item the proposer's
 * answer and the current disposition, with a link to the full history.
 */
export async function ResponseSummary({ user, boardId, proposalId }: { user: SessionUser; boardId: string; proposalId: string }) {
  const [reviews, items, window] = await Promise.all([
    listProposalReviews(user, boardId, proposalId),
    listReviewItems(user, boardId, proposalId),
    getProposalResponseWindow(user, boardId, proposalId),
  ]);
  const responsesUrl = `/boards/${boardId}/proposals/${proposalId}/responses`;
  return (
    <div className="grid gap-4 md:grid-cols-2">
      <Panel
        id="reviewer-levels"
        title="Reviewer confidence and expertise"
        description="As each reviewer stated it. Shown for your judgement; it weights no score."
      >
        <ul className="space-y-1 text-sm" data-reviewer-levels="">
          {reviews.map((r) => (
            <li key={r.assignmentId}>
              <span className="font-semibold">{r.reviewerName}</span> (version {r.versionNumber}):{" "}
              {r.confidence ? `confidence ${CONFIDENCE_LABELS[r.confidence].split(":")[0]!.toLowerCase()}` : "confidence not stated"} ·{" "}
              {r.expertise ? `expertise: ${EXPERTISE_LABELS[r.expertise].toLowerCase()}` : "expertise not stated"}
            </li>
          ))}
          {reviews.length === 0 ? <li className="text-ink-500">No reviewer assigned yet.</li> : null}
        </ul>
      </Panel>
      <Panel
        id="answers-dispositions"
        title="Answers and dispositions"
        description={
          window
            ? `Response round ${window.state === "open" ? `open until ${formatDateTime(window.closesAt)}` : window.state === "upcoming" ? `opens ${formatDateTime(window.opensAt)}` : `closed ${formatDateTime(window.closesAt)}`}.`
            : "No response round was opened for this call."
        }
        actions={
          <Link href={responsesUrl} className="text-sm font-semibold text-trajectory-700 underline">
            Response round page
          </Link>
        }
      >
        <ul className="space-y-2 text-sm" data-decision-responses="">
          {items.map((i) => (
            <li key={i.id} className="border-b border-ink-100 pb-2 last:border-0">
              <p>
                <span className="font-mono text-xs uppercase text-ink-500">{i.severity}</span> <span className="font-semibold">{i.title}</span>{" "}
                <span className="text-xs text-ink-500">
                  — {i.authorLabel}, version {i.versionNumber}
                </span>
              </p>
              <p className="text-ink-700">
                {i.answer ? `Answer: ${i.answer.body.length > 240 ? `${i.answer.body.slice(0, 240)}…` : i.answer.body}` : "No answer."}
              </p>
              <p className="flex flex-wrap items-center gap-2">
                {i.disposition ? (
                  <>
                    <DispositionChip code={i.disposition.disposition} label={i.disposition.label} />
                    <span className="text-xs text-ink-500">
                      {i.disposition.actorLabel} · {formatDateTime(i.disposition.createdAt)}
                      {i.disposition.reason ? ` · ${i.disposition.reason}` : ""}
                      {i.dispositionHistory.length > 1 ? ` · ${i.dispositionHistory.length} entries in its history` : ""}
                    </span>
                  </>
                ) : (
                  <span className="text-xs text-ink-500">No disposition yet.</span>
                )}
              </p>
            </li>
          ))}
          {items.length === 0 ? <li className="text-ink-500">No review items.</li> : null}
        </ul>
      </Panel>
    </div>
  );
}
