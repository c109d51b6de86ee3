import type { Metadata } from "next";
import { NotAllowed, PageTitle } from "@/components/ui/panel";
import { ConflictDeclarations } from "@/components/review/conflict-declarations";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { getBoard } from "@/lib/dal/boards";
import { listConflictCandidates, listConflicts } from "@/lib/dal/conflicts";

export const metadata: Metadata = { title: "Conflicts of interest" };

export default async function ConflictsPage({ params }: { params: Promise<{ boardId: string }> }) {
  const { boardId } = await params;
  const user = await pageUser(`/boards/${boardId}/conflicts`);
  const board = await orNotFound(getBoard(user, boardId));
  if (!can(user, "conflict.declare", { role: board.myRole })) return <NotAllowed what="Reviewers declare their conflicts of interest here." />;
  const [conflicts, candidates] = await Promise.all([listConflicts(user, boardId), listConflictCandidates(user, boardId)]);
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={board.name} title="Conflicts of interest">
        <p>
          Declare a conflict with a proposal, or with an organisation (it then covers every proposal with an author from it). You cannot be assigned to, or open, a proposal you
          are conflicted with. The board also flags likely conflicts (same organisation or e-mail domain as an author) for the chair.
        </p>
      </PageTitle>
      <ConflictDeclarations boardId={boardId} conflicts={conflicts.filter((c) => c.reviewerId === user.id)} candidates={candidates} />
    </div>
  );
}
