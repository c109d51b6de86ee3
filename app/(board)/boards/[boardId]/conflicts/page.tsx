import type { Metadata } from "next";
import Link from "next/link";
import { formatDate } from "@/lib/format/dates";
import { NotAllowed, PageTitle } from "@/components/ui/panel";
import { ConflictDeclarations } from "@/components/review/conflict-declarations";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { getBoard } from "@/lib/dal/boards";
import { listConflictCandidates, listConflicts, type ConflictView } from "@/lib/dal/conflicts";

export const metadata: Metadata = { title: "Conflicts of interest" };

export default async function ConflictsPage({ params }: { params: Promise<{ boardId: string }> }) {
  const { boardId } = await params;
  const user = await pageUser(`/boards/${boardId}/conflicts`);
  const board = await orNotFound(getBoard(user, boardId));
  if (can(user, "review.view-all", { role: board.myRole }) && board.myRole !== "reviewer")
    return <AllDeclarations boardId={boardId} boardName={board.name} conflicts={await listConflicts(user, boardId)} />;
  if (!can(user, "conflict.declare", { role: board.myRole })) return <NotAllowed what="Reviewers declare their conflicts of interest here." />;
  const [conflicts, candidates] = await Promise.all([listConflicts(user, boardId), listConflictCandidates(user, boardId)]);
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={board.name} title="Conflicts of interest">
        <p>
          Declare a conflict with a proposal, or with an organisation (it then covers every proposal with an author from it). You cannot be assigned to, or
          open, a proposal you are conflicted with. The board also flags likely conflicts (same organisation or e-mail domain as an author) for the chair.
        </p>
      </PageTitle>
      <ConflictDeclarations boardId={boardId} conflicts={conflicts.filter((c) => c.reviewerId === user.id)} candidates={candidates} />
    </div>
  );
}

/** The chair's view: every reviewer's declarations (the assignment table also flags likely conflicts). */
function AllDeclarations({ boardId, boardName, conflicts }: { boardId: string; boardName: string; conflicts: ConflictView[] }) {
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={boardName} title="Declared conflicts of interest">
        <p>
          What reviewers declared. Assignment refuses these pairs; see each call&apos;s assignment page for the conflicts the board finds on its own.{" "}
          <Link href={`/boards/${boardId}`} className="text-trajectory-700 underline">
            Back to the board
          </Link>
        </p>
      </PageTitle>
      <div className="overflow-x-auto rounded-panel border border-ink-200 bg-white">
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">Declared conflicts</caption>
          <thead className="bg-ink-50 text-ink-700">
            <tr>
              <th scope="col" className="px-3 py-2">
                Reviewer
              </th>
              <th scope="col" className="px-3 py-2">
                With
              </th>
              <th scope="col" className="px-3 py-2">
                Reason
              </th>
              <th scope="col" className="px-3 py-2">
                Declared (UTC)
              </th>
            </tr>
          </thead>
          <tbody>
            {conflicts.length === 0 ? (
              <tr>
                <td colSpan={4} className="px-3 py-6 text-center text-ink-500">
                  No declarations.
                </td>
              </tr>
            ) : (
              conflicts.map((c) => (
                <tr key={c.id} className="border-t border-ink-100">
                  <td className="px-3 py-2">{c.reviewerName}</td>
                  <td className="px-3 py-2">{c.proposalTitle ?? `Organisation: ${c.organisation}`}</td>
                  <td className="px-3 py-2">{c.reason}</td>
                  <td className="px-3 py-2">{formatDate(c.createdAt)}</td>
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
