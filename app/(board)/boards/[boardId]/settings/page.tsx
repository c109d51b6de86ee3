import type { Metadata } from "next";
import Link from "next/link";
import { NotAllowed, Panel, PageTitle } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { getBoard } from "@/lib/dal/boards";
import { SettingsForm } from "./_components/settings-form";

export const metadata: Metadata = { title: "Board settings" };

export default async function BoardSettingsPage({ params }: { params: Promise<{ boardId: string }> }) {
  const { boardId } = await params;
  const user = await pageUser(`/boards/${boardId}/settings`);
  const board = await orNotFound(getBoard(user, boardId));
  if (!can(user, "board.manage", { role: board.myRole })) return <NotAllowed what="Only the board's chairs and site administrators change its settings." />;
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={board.name} title="Settings">
        <Link href={`/boards/${board.id}`} className="text-sm text-trajectory-700 underline">
          Back to the board
        </Link>
      </PageTitle>
      <Panel id="settings" title="Board settings">
        <SettingsForm board={board} />
      </Panel>
    </div>
  );
}
