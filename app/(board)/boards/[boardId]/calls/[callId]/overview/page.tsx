import type { Metadata } from "next";
import Link from "next/link";
import { NotAllowed, PageTitle } from "@/components/ui/panel";
import { OverviewTable } from "@/components/review/overview-table";
import { CalibrationNotes } from "@/components/meeting/calibration-notes";
import { RankByChoice } from "@/components/meeting/rank-by-choice";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { getBoard } from "@/lib/dal/boards";
import { getCallCalibration } from "@/lib/dal/meetings";
import { getCallOverview } from "@/lib/dal/reviews";

export const metadata: Metadata = { title: "Call overview" };

export default async function OverviewPage({ params }: { params: Promise<{ boardId: string; callId: string }> }) {
  const { boardId, callId } = await params;
  const user = await pageUser(`/boards/${boardId}/calls/${callId}/overview`);
  const board = await orNotFound(getBoard(user, boardId));
  if (!can(user, "review.view-all", { role: board.myRole })) return <NotAllowed what="Only the board's chair sees the scores of every review." />;
  const overview = await orNotFound(getCallOverview(user, boardId, callId));
  const calibration = await getCallCalibration(user, boardId, callId);
  const byProposal = Object.fromEntries(calibration.proposals.map((p) => [p.proposalId, { calibratedMean: p.calibratedMean, rankNote: p.rankNote }]));
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={`${board.name} · ${overview.call.title}`} title="Review overview">
        <p>
          Scores on the rubric&apos;s scale{overview.scale ? ` (${overview.scale.min}–${overview.scale.max})` : ""}.{" "}
          <Link href={`/boards/${boardId}/calls/${callId}/assignments`} className="text-trajectory-700 underline">
            Assign reviewers
          </Link>
          {" · "}
          <Link href={`/boards/${boardId}/calls/${callId}/meeting`} className="text-trajectory-700 underline">
            Panel meeting
          </Link>
        </p>
      </PageTitle>
      <RankByChoice boardId={boardId} callId={callId} rankBy={calibration.rankBy} />
      <OverviewTable key={calibration.rankBy} boardId={boardId} overview={overview} calibration={{ rankBy: calibration.rankBy, byProposal }} />
      <CalibrationNotes calibration={calibration} />
    </div>
  );
}
