import type { Metadata } from "next";
import Link from "next/link";
import { PageTitle } from "@/components/ui/panel";
import { formatDateTime } from "@/lib/format/dates";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { getBoard } from "@/lib/dal/boards";
import { listReviewQueue } from "@/lib/dal/reviews";

export const metadata: Metadata = { title: "My reviews" };

const statusStyle = { "not started": "bg-ink-100 text-ink-700", draft: "bg-drift-100 text-drift-700", submitted: "bg-holds-100 text-holds-700" } as const;

export default async function ReviewQueuePage({ params }: { params: Promise<{ boardId: string }> }) {
  const { boardId } = await params;
  const user = await pageUser(`/boards/${boardId}/reviews`);
  const board = await orNotFound(getBoard(user, boardId));
  // Open assignments first; those whose version the board has decided follow, marked closed.
  const queue = (await listReviewQueue(user, boardId)).sort((a, b) => Number(Boolean(a.decidedAt)) - Number(Boolean(b.decidedAt)));
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={board.name} title="My reviews">
        <p>
          Proposals assigned to you, earliest due first. Found a conflict of interest?{" "}
          <Link href={`/boards/${boardId}/conflicts`} className="text-trajectory-700 underline">
            Declare it
          </Link>{" "}
          and the proposal is closed to you.
        </p>
      </PageTitle>
      <div className="overflow-x-auto rounded-panel border border-ink-200 bg-white">
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">Your review assignments</caption>
          <thead className="bg-ink-50 text-ink-700">
            <tr>
              <th scope="col" className="px-3 py-2">
                Proposal
              </th>
              <th scope="col" className="px-3 py-2">
                Call
              </th>
              <th scope="col" className="px-3 py-2">
                Due (UTC)
              </th>
              <th scope="col" className="px-3 py-2">
                Progress
              </th>
              <th scope="col" className="px-3 py-2">
                Status
              </th>
            </tr>
          </thead>
          <tbody>
            {queue.length === 0 ? (
              <tr>
                <td colSpan={5} className="px-3 py-6 text-center text-ink-500">
                  Nothing assigned to you on this board.
                </td>
              </tr>
            ) : (
              queue.map((q) => (
                <tr key={q.assignmentId} className="border-t border-ink-100">
                  <td className="px-3 py-2">
                    {q.conflicted ? (
                      <span>
                        {q.title} <span className="text-xs text-void-700">(conflict declared: the chair will reassign it)</span>
                      </span>
                    ) : (
                      <Link
                        href={`/boards/${boardId}/proposals/${q.proposalId}/review?assignment=${q.assignmentId}`}
                        className="font-semibold text-trajectory-700 hover:underline"
                      >
                        {q.title}
                      </Link>
                    )}
                    <span className="ml-1 text-xs text-ink-500">v{q.versionNumber}</span>
                  </td>
                  <td className="px-3 py-2">{q.callTitle}</td>
                  <td className={`px-3 py-2 ${q.overdue ? "font-semibold text-void-700" : ""}`}>
                    {q.decidedAt ? "—" : formatDateTime(q.dueAt)}
                    {q.overdue ? " · overdue" : ""}
                  </td>
                  <td className="px-3 py-2">
                    <span className="font-mono">
                      {q.scored}/{q.criteria}
                    </span>{" "}
                    criteria scored
                    <span
                      role="progressbar"
                      aria-valuemin={0}
                      aria-valuemax={Math.max(1, q.criteria)}
                      aria-valuenow={q.scored}
                      aria-label={`${q.scored} of ${q.criteria} criteria scored`}
                      className="ml-2 inline-block h-2 w-20 overflow-hidden rounded-chip bg-ink-200 align-middle"
                    >
                      <span className="block h-full bg-trajectory-600" style={{ width: `${(100 * q.scored) / Math.max(1, q.criteria)}%` }} />
                    </span>
                  </td>
                  <td className="px-3 py-2">
                    {q.decidedAt ? (
                      <span className="rounded-chip bg-ink-100 px-2 py-0.5 text-xs font-semibold text-ink-700">
                        closed: decided {formatDateTime(q.decidedAt)}
                        {q.status === "submitted" ? "" : `, review ${q.status}`}
                      </span>
                    ) : (
                      <span className={`rounded-chip px-2 py-0.5 text-xs font-semibold ${statusStyle[q.status]}`}>{q.status}</span>
                    )}
                  </td>
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
