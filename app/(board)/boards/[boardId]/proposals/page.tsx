import type { Metadata } from "next";
import { Suspense } from "react";
import { NewProposalForm } from "@/components/dossier/new-proposal-form";
import { ProposalsTable } from "@/components/dossier/proposals-table";
import { QueryProvider } from "@/components/dossier/query-provider";
import { PageTitle, Panel } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { getBoard } from "@/lib/dal/boards";
import { listCalls } from "@/lib/dal/calls";

export const metadata: Metadata = { title: "Proposals" };

export default async function ProposalsPage({ params }: { params: Promise<{ boardId: string }> }) {
  const { boardId } = await params;
  const user = await pageUser(`/boards/${boardId}/proposals`);
  const board = await orNotFound(getBoard(user, boardId));
  const mayCreate = can(user, "proposal.create", { role: board.myRole });
  const calls = mayCreate ? await listCalls(user, boardId) : [];
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={board.name} title={board.myRole === "chair" ? "Proposals" : "Your proposals"} />
      <Panel title="Proposals">
        <QueryProvider>
          <Suspense fallback={<p className="text-ink-500">Loading proposals…</p>}>
            <ProposalsTable boardId={boardId} />
          </Suspense>
        </QueryProvider>
      </Panel>
      {mayCreate ? (
        <Panel id="new-proposal" title="Start a proposal">
          <NewProposalForm boardId={boardId} calls={calls.filter((c) => c.state === "open").map((c) => ({ id: c.id, title: c.title }))} />
        </Panel>
      ) : null}
    </div>
  );
}
