import type { Metadata } from "next";
import Link from "next/link";
import { Panel, PageTitle } from "@/components/ui/panel";
import { pageUser } from "@/lib/auth/page-guard";
import { getMe } from "@/lib/dal/accounts";
import { ChangePasswordForm } from "./_components/change-password-form";
import { SignOutOthers } from "./_components/sign-out-others";

export const metadata: Metadata = { title: "Your account" };

const roleLabels = { proposer: "Proposer", reviewer: "Reviewer", chair: "Chair" } as const;

export default async function AccountPage() {
  const user = await pageUser("/account");
  const me = await getMe(user);
  return (
    <div className="space-y-6">
      <PageTitle eyebrow="Account" title={me.name}>
        {me.email}
        {me.organisation ? ` · ${me.organisation}` : ""}
        {me.isAdmin ? " · site administrator" : ""}
      </PageTitle>
      <Panel id="my-boards" title="Your boards and roles">
        {me.boards.length === 0 ? (
          <p className="text-ink-600">You are not a member of any board yet. A chair can invite you.</p>
        ) : (
          <ul className="divide-y divide-ink-100">
            {me.boards.map((board) => (
              <li key={board.boardId} className="flex items-center justify-between py-2">
                <Link href={`/boards/${board.boardId}`} className="font-semibold text-trajectory-700 hover:underline">
                  {board.name}
                </Link>
                <span className="rounded-chip bg-ink-100 px-2 py-0.5 text-sm text-ink-700">{roleLabels[board.role]}</span>
              </li>
            ))}
          </ul>
        )}
      </Panel>
      <Panel id="password" title="Password">
        <ChangePasswordForm />
      </Panel>
      <Panel id="sessions" title="Signed-in browsers">
        <SignOutOthers otherSessions={me.otherActiveSessions} />
      </Panel>
    </div>
  );
}
