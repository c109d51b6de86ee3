import type { Metadata } from "next";
import Link from "next/link";
import { NotAllowed, Panel, PageTitle } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { getBoard } from "@/lib/dal/boards";
import { listInvitations } from "@/lib/dal/invitations";
import { listMembers } from "@/lib/dal/members";
import { memberListQuerySchema } from "@/lib/validation/accounts";
import { InviteForm } from "./_components/invite-form";
import { InvitationsList } from "./_components/invitations-list";
import { MembersTable } from "./_components/members-table";

export const metadata: Metadata = { title: "Members" };

export default async function MembersPage({ params, searchParams }: { params: Promise<{ boardId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { boardId } = await params;
  const user = await pageUser(`/boards/${boardId}/members`);
  const board = await orNotFound(getBoard(user, boardId));
  if (!can(user, "members.view", { role: board.myRole })) return <NotAllowed what="Only the board's chairs and site administrators manage its members." />;
  const raw = Object.fromEntries(Object.entries(await searchParams).filter((e): e is [string, string] => typeof e[1] === "string"));
  // A hand-edited URL with a bad value falls back to the defaults rather than failing.
  const parsed = memberListQuerySchema.safeParse(raw);
  const query = parsed.success ? parsed.data : memberListQuerySchema.parse({});
  const [members, invitations] = await Promise.all([listMembers(user, boardId, query), listInvitations(user, boardId)]);
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={board.name} title="Members">
        <Link href={`/boards/${board.id}`} className="text-sm text-trajectory-700 underline">
          Back to the board
        </Link>
      </PageTitle>
      <Panel id="invite" title="Invite someone" description="They receive a link by e-mail that works once, for 7 days.">
        <InviteForm boardId={board.id} />
      </Panel>
      <Panel id="members" title="Members" description="A board always keeps at least one active chair. Nobody changes their own role.">
        <MembersTable
          boardId={board.id}
          myUserId={user.id}
          rows={members.members}
          total={members.total}
          page={members.page}
          pageSize={members.pageSize}
          sort={query.sort}
          dir={query.dir}
          search={query.q}
        />
      </Panel>
      <Panel id="invitations" title="Invitations">
        <InvitationsList boardId={board.id} invitations={invitations.slice(0, 50)} />
      </Panel>
    </div>
  );
}
