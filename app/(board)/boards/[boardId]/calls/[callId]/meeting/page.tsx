import type { Metadata } from "next";
import Link from "next/link";
import { MeetingRoom } from "@/components/meeting/meeting-room";
import { NotAllowed, PageTitle } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { getBoard } from "@/lib/dal/boards";
import { getMeeting } from "@/lib/dal/meetings";

export const metadata: Metadata = { title: "Panel meeting" };

export default async function MeetingPage({ params }: { params: Promise<{ boardId: string; callId: string }> }) {
  const { boardId, callId } = await params;
  const user = await pageUser(`/boards/${boardId}/calls/${callId}/meeting`);
  const board = await orNotFound(getBoard(user, boardId));
  if (!can(user, "meeting.view", { role: board.myRole })) return <NotAllowed what="Only the board's chair and reviewers take part in the panel meeting." />;
  const meeting = await orNotFound(getMeeting(user, boardId, callId));
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={`${board.name} · ${meeting.call.title}`} title="Panel meeting">
        <p>
          The chair steps through the proposals; this page follows without reloading.{" "}
          <Link href={`/boards/${boardId}/calls/${callId}`} className="text-trajectory-700 underline">
            Back to the call
          </Link>
          {meeting.me.isChair ? (
            <>
              {" · "}
              <Link href={`/boards/${boardId}/calls/${callId}/overview`} className="text-trajectory-700 underline">
                Review overview
              </Link>
            </>
          ) : null}
        </p>
      </PageTitle>
      <MeetingRoom boardId={boardId} callId={callId} initial={meeting} />
    </div>
  );
}
