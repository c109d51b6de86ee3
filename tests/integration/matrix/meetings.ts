// Panel meetings and calibrated scores: the chair runs the meeting and sees the calibration;
// the board's reviewers follow the meeting and mark themselves present; proposers are not on the panel.
import { db } from "@/db/client";
import { calls } from "@/db/schema";
import { startMeeting } from "@/lib/dal/meetings";
import { saveCallRubric } from "@/lib/dal/rubrics";
import { asSessionUser, unique } from "../../support/factories";
import { createProposalWithVersion, rubricInput } from "../review-fixtures";
import type { MatrixCast, MatrixRole, RouteCase } from "./types";

const board = (cast: MatrixCast) => `/api/v1/boards/${cast.board.id}`;

type Expect = Record<MatrixRole, number | number[]>;
const chairsOnly: Expect = { anonymous: 401, outsider: 404, proposer: 403, reviewer: 403, chair: 200, admin: 200 };
const panel: Expect = { anonymous: 401, outsider: 404, proposer: 403, reviewer: 200, chair: 200, admin: 200 };

/** A call with the standard rubric (scale 1..5) and one proposal in review. */
async function meetingCall(cast: MatrixCast) {
  const [call] = await db()
    .insert(calls)
    .values({ boardId: cast.board.id, title: unique("Call"), opensAt: new Date(Date.now() - 86_400_000), closesAt: new Date(Date.now() + 86_400_000 * 20) })
    .returning();
  await saveCallRubric(asSessionUser(cast.chair), cast.board.id, call!.id, rubricInput);
  const { proposal } = await createProposalWithVersion({ boardId: cast.board.id, callId: call!.id, ownerId: cast.proposer.id, status: "in_review" });
  return { call: call!, proposal, path: `${board(cast)}/calls/${call!.id}` };
}

/** The same, with the meeting started by the chair. */
async function runningMeeting(cast: MatrixCast) {
  const m = await meetingCall(cast);
  await startMeeting(asSessionUser(cast.chair), cast.board.id, m.call.id, { order: [m.proposal.id] });
  return m;
}

export const meetingRouteCases: RouteCase[] = [
  { operationId: "getCallCalibration", prepare: async (cast) => ({ path: `${(await meetingCall(cast)).path}/calibration` }), expect: chairsOnly },
  {
    operationId: "setCallRankBy",
    prepare: async (cast) => ({ path: `${(await meetingCall(cast)).path}/rank-by`, body: { rankBy: "calibrated" } }),
    expect: chairsOnly,
  },
  { operationId: "getMeeting", prepare: async (cast) => ({ path: `${(await runningMeeting(cast)).path}/meeting` }), expect: panel },
  {
    operationId: "startMeeting",
    prepare: async (cast) => {
      const m = await meetingCall(cast);
      return { path: `${m.path}/meeting`, body: { order: [m.proposal.id] } };
    },
    expect: chairsOnly,
  },
  {
    operationId: "moveMeeting",
    prepare: async (cast) => {
      const m = await runningMeeting(cast);
      return { path: `${m.path}/meeting/current`, body: { proposalId: m.proposal.id } };
    },
    expect: chairsOnly,
  },
  {
    operationId: "recordMeetingOutcome",
    prepare: async (cast) => {
      const m = await runningMeeting(cast);
      return {
        path: `${m.path}/meeting/records/${m.proposal.id}`,
        body: { consensusScore: 3.5, recommendation: "recommend with changes", notes: "Margins agreed." },
      };
    },
    expect: chairsOnly,
  },
  {
    operationId: "setMeetingAttendance",
    prepare: async (cast) => ({ path: `${(await runningMeeting(cast)).path}/meeting/attendance`, body: { present: true } }),
    expect: panel,
  },
  { operationId: "closeMeeting", prepare: async (cast) => ({ path: `${(await runningMeeting(cast)).path}/meeting/close` }), expect: chairsOnly },
  {
    operationId: "followMeeting",
    prepare: async (cast) => ({ path: `${(await runningMeeting(cast)).path}/meeting/events`, query: { once: "1" } }),
    expect: panel,
  },
  { operationId: "getMeetingMinutes", prepare: async (cast) => ({ path: `${(await runningMeeting(cast)).path}/meeting/minutes` }), expect: chairsOnly },
];
