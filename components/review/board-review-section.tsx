// The review area's section of the board home: a reviewer's queue and conflicts, a chair's
// rubric, assignment and overview pages for each call.
import Link from "next/link";
import { Panel } from "@/components/ui/panel";
import { can } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import type { BoardCallSummary, BoardView } from "@/lib/dal/boards";
import { listReviewQueue } from "@/lib/dal/reviews";

const linkClass = "inline-block rounded-chip border border-ink-300 px-3 py-1.5 text-sm font-semibold hover:border-trajectory-500";

export async function BoardReviewSection({ user, board, calls }: { user: SessionUser; board: BoardView; calls: BoardCallSummary[] }) {
  const facts = { role: board.myRole };
  const isChair = can(user, "review.assign", facts);
  const isReviewer = board.myRole === "reviewer";
  if (!isChair && !isReviewer) return null;
  const queue = isReviewer ? await listReviewQueue(user, board.id) : [];
  const open = queue.filter((q) => q.status !== "submitted" && !q.conflicted && !q.decidedAt).length;
  return (
    <Panel
      id="reviews"
      title="Reviews"
      description={isChair ? "Rubrics, reviewer assignment and the scores of each call." : "Your assigned proposals and declared conflicts."}
    >
      {isReviewer ? (
        <ul className="flex flex-wrap gap-3">
          <li>
            <Link href={`/boards/${board.id}/reviews`} className={linkClass}>
              My reviews ({open} open)
            </Link>
          </li>
          <li>
            <Link href={`/boards/${board.id}/conflicts`} className={linkClass}>
              Conflicts of interest
            </Link>
          </li>
        </ul>
      ) : null}
      {isChair ? (
        <p className="mb-2 text-sm">
          <Link href={`/boards/${board.id}/conflicts`} className="text-trajectory-700 underline">
            Declared conflicts of interest
          </Link>
        </p>
      ) : null}
      {isChair ? (
        calls.length === 0 ? (
          <p className="text-ink-600">No calls yet.</p>
        ) : (
          <ul className="divide-y divide-ink-100">
            {calls.map((call) => (
              <li key={call.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                <span className="font-semibold">{call.title}</span>
                <span className="flex flex-wrap gap-2">
                  <Link href={`/boards/${board.id}/calls/${call.id}/rubric`} className={linkClass}>
                    Rubric
                  </Link>
                  <Link href={`/boards/${board.id}/calls/${call.id}/assignments`} className={linkClass}>
                    Assign reviewers
                  </Link>
                  <Link href={`/boards/${board.id}/calls/${call.id}/overview`} className={linkClass}>
                    Overview, reviews and decisions
                  </Link>
                </span>
              </li>
            ))}
          </ul>
        )
      ) : null}
    </Panel>
  );
}
