import type { Metadata } from "next";
import Link from "next/link";
import { NotAllowed, Panel, PageTitle } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { getBoard } from "@/lib/dal/boards";
import { listInvitations } from "@/lib/dal/invitations";
import { listMembers } from "@/lib/dal/members";
import { invitationListQuerySchema, memberListQuerySchema } from "@/lib/validation/accounts";
import { InviteForm } from "./_components/invite-form";
import { InvitationsList } from "./_components/invitations-list";
import { MembersTable } from "./_components/members-table";

export const metadata: Metadata = { title: "Members" };

export default async function MembersPage({
  params,
  searchParams,
}: {
  params: Promise<{ boardId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { boardId } = await params;
  const user = await pageUser(`/boards/${boardId}/members`);
  const board = await orNotFound(getBoard(user, boardId));
  if (!can(user, "members.view", { role: board.myRole })) return <NotAllowed what="Only the board's chairs and site administrators manage its members." />;
  const raw = Object.fromEntries(Object.entries(await searchParams).filter((e): e is [string, string] => typeof e[1] === "string"));
  // A hand-edited URL with a bad value falls back to the defaults rather than failing.
  const parsed = memberListQuerySchema.safeParse(raw);
  const query = parsed.success ? parsed.data : memberListQuerySchema.parse({});
  // The invitations list pages on its own parameters so it keeps the members table's state.
  const invitationQuery = invitationListQuerySchema.safeParse({ show: raw.invitations, page: raw.invitationsPage, pageSize: 20 });
  const invQuery = invitationQuery.success ? invitationQuery.data : invitationListQuerySchema.parse({ pageSize: 20 });
  const [members, invitations] = await Promise.all([listMembers(user, boardId, query), listInvitations(user, boardId, invQuery)]);
  const invitationsHref = (change: { invitations?: string; invitationsPage?: number }) => {
    const next = new URLSearchParams(raw);
    if (change.invitations !== undefined) next.set("invitations", change.invitations);
    if (change.invitationsPage !== undefined) next.set("invitationsPage", String(change.invitationsPage));
    if (next.get("invitations") === "pending") next.delete("invitations");
    if (next.get("invitationsPage") === "1") next.delete("invitationsPage");
    const text = next.toString();
    return `/boards/${board.id}/members${text ? `?${text}` : ""}#invitations`;
  };
  const pages = Math.max(1, Math.ceil(invitations.total / invitations.pageSize));
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
          hasMore={members.hasMore}
          page={members.page}
          pageSize={members.pageSize}
          sort={query.sort}
          dir={query.dir}
          search={query.q}
        />
      </Panel>
      <Panel
        id="invitations"
        title="Invitations"
        description={
          invQuery.show === "pending"
            ? invitations.pendingTotal === 0
              ? "None pending"
              : `${invitations.pendingTotal} pending, newest first`
            : `${invitations.total} in all, newest first`
        }
      >
        <nav aria-label="Which invitations" className="mb-3 flex gap-3 text-sm">
          <Link
            href={invitationsHref({ invitations: "pending", invitationsPage: 1 })}
            aria-current={invQuery.show === "pending" ? "page" : undefined}
            className="text-trajectory-700 underline aria-[current=page]:font-semibold aria-[current=page]:no-underline"
          >
            Pending ({invitations.pendingTotal})
          </Link>
          <Link
            href={invitationsHref({ invitations: "all", invitationsPage: 1 })}
            aria-current={invQuery.show === "all" ? "page" : undefined}
            className="text-trajectory-700 underline aria-[current=page]:font-semibold aria-[current=page]:no-underline"
          >
            All, with accepted, withdrawn and expired
          </Link>
        </nav>
        <InvitationsList
          boardId={board.id}
          invitations={invitations.invitations}
          empty={invQuery.show === "pending" ? "No pending invitations." : "No invitations yet."}
        />
        {pages > 1 || invQuery.page > 1 ? (
          <nav aria-label="Invitation pages" className="mt-3 flex items-center gap-3 text-sm">
            {invQuery.page > 1 ? (
              <Link href={invitationsHref({ invitationsPage: Math.min(invQuery.page - 1, pages) })} className="text-trajectory-700 underline">
                Newer
              </Link>
            ) : null}
            <span className="text-ink-600">
              Page {invQuery.page} of {pages}
            </span>
            {invQuery.page < pages ? (
              <Link href={invitationsHref({ invitationsPage: invQuery.page + 1 })} className="text-trajectory-700 underline">
                Older
              </Link>
            ) : null}
          </nav>
        ) : null}
      </Panel>
    </div>
  );
}
