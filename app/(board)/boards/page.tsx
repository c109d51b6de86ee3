import type { Metadata } from "next";
import Link from "next/link";
import { Panel, PageTitle } from "@/components/ui/panel";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { listBoards } from "@/lib/dal/boards";
import { CreateBoardForm } from "./_components/create-board-form";

export const metadata: Metadata = { title: "Boards" };

const roleLabels = { proposer: "Proposer", reviewer: "Reviewer", chair: "Chair" } as const;

export default async function BoardsPage() {
  const user = await pageUser("/boards");
  const boards = await listBoards(user);
  return (
    <div className="space-y-6">
      <PageTitle eyebrow="Review boards" title={user.isAdmin ? "All boards" : "Your boards"} />
      {boards.length === 0 ? (
        <p className="rounded-panel border border-ink-200 bg-white p-5 text-ink-700">
          You are not on any board yet. When a chair invites you, the invitation arrives by e-mail.
        </p>
      ) : (
        <ul className="grid gap-4 md:grid-cols-2" aria-label="Boards">
          {boards.map((board) => (
            <li key={board.id} className="rounded-panel border border-ink-200 bg-white p-5 shadow-panel">
              <div className="flex items-start justify-between gap-3">
                <h2 className="text-lg font-semibold">
                  <Link href={`/boards/${board.id}`} className="text-ink-950 hover:text-trajectory-700">
                    {board.name}
                  </Link>
                </h2>
                <span className="shrink-0 rounded-chip bg-ink-100 px-2 py-0.5 text-sm text-ink-700">
                  {board.myRole ? roleLabels[board.myRole] : "Administrator"}
                </span>
              </div>
              {board.description ? <p className="mt-2 line-clamp-3 text-sm text-ink-700">{board.description}</p> : null}
            </li>
          ))}
        </ul>
      )}
      {can(user, "site.admin", { role: null }) ? (
        <Panel id="new-board" title="Create a board" description="Then invite its first chair from the members page.">
          <CreateBoardForm />
        </Panel>
      ) : null}
    </div>
  );
}
