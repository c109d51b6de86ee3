import type { Metadata } from "next";
import Link from "next/link";
import { NotAllowed, PageTitle } from "@/components/ui/panel";
import { AssignmentTable } from "@/components/review/assignment-table";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { getAssignmentBoard } from "@/lib/dal/assignments";
import { getBoard } from "@/lib/dal/boards";

export const metadata: Metadata = { title: "Assign reviewers" };

export default async function AssignmentsPage({ params }: { params: Promise<{ boardId: string; callId: string }> }) {
  const { boardId, callId } = await params;
  const user = await pageUser(`/boards/${boardId}/calls/${callId}/assignments`);
  const board = await orNotFound(getBoard(user, boardId));
  if (!can(user, "review.assign", { role: board.myRole })) return <NotAllowed what="Only the board's chair assigns reviewers." />;
  const data = await orNotFound(getAssignmentBoard(user, boardId, callId));
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={`${board.name} · ${data.call.title}`} title="Assign reviewers">
        <p>
          Select proposals, pick reviewers and a due date. Declared conflicts and the same organisation as an author block an assignment; the same e-mail domain
          asks you to confirm. See the{" "}
          <Link href={`/boards/${boardId}/calls/${callId}/overview`} className="text-trajectory-700 underline">
            overview
          </Link>{" "}
          or the{" "}
          <Link href={`/boards/${boardId}/calls/${callId}/rubric`} className="text-trajectory-700 underline">
            rubric
          </Link>
          .
        </p>
      </PageTitle>
      <AssignmentTable boardId={boardId} data={data} />
    </div>
  );
}
