import type { Metadata } from "next";
import { PageTitle } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { getBoard, listBoardCalls } from "@/lib/dal/boards";
import { listProposals } from "@/lib/dal/proposals";
import { proposalListQuerySchema } from "@/lib/validation/dossier";
import { BoardCallsSection, BoardDossiersSection, BoardStewardshipSection } from "./_components/board-sections";
import { BoardReviewSection } from "@/components/review/board-review-section";

export const metadata: Metadata = { title: "Board" };

const roleLabels = { proposer: "proposer", reviewer: "reviewer", chair: "chair" } as const;

export default async function BoardHomePage({ params }: { params: Promise<{ boardId: string }> }) {
  const { boardId } = await params;
  const user = await pageUser(`/boards/${boardId}`);
  const board = await orNotFound(getBoard(user, boardId));
  const calls = await listBoardCalls(user, boardId);
  const facts = { role: board.myRole };
  const mine = board.myRole === "proposer" ? await listProposals(user, boardId, proposalListQuerySchema.parse({ pageSize: 5 })) : null;
  return (
    <div className="space-y-6">
      <PageTitle eyebrow="Review board" title={board.name}>
        <p>{board.myRole ? `You are a ${roleLabels[board.myRole]} on this board.` : "You see this board as a site administrator."}</p>
        {board.description ? <p className="mt-2">{board.description}</p> : null}
      </PageTitle>
      {/* One section per area; each decides from the policy whether it shows. */}
      <BoardCallsSection board={board} calls={calls} />
      {mine ? <BoardDossiersSection board={board} proposals={mine.rows} hasMore={mine.hasMore} /> : null}
      <BoardReviewSection user={user} board={board} calls={calls} />
      {can(user, "members.manage", facts) ? <BoardStewardshipSection board={board} /> : null}
    </div>
  );
}
