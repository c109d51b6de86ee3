import { z } from "zod";
import { defineOperations } from "../registry";
import {
  attendanceSchema,
  meetingEventsQuerySchema,
  meetingRecordSchema,
  moveMeetingSchema,
  rankBySchema,
  startMeetingSchema,
} from "@/lib/validation/meetings";

const call = "/api/v1/boards/{boardId}/calls/{callId}";

/** The meeting as one panel member may see it (conflicted members get nothing of the proposal they step out for). */
const meetingView = z.object({
  call: z.object({ id: z.string(), title: z.string() }),
  scale: z.object({ min: z.number(), max: z.number() }).nullable(),
  status: z.enum(["not started", "running", "closed"]),
  revision: z.number(),
  rankBy: z.enum(["raw", "calibrated"]),
  me: z.object({ userId: z.string(), isChair: z.boolean(), present: z.boolean(), steppingOut: z.boolean() }),
  agenda: z.array(z.object({ proposalId: z.string(), position: z.number(), title: z.string().nullable(), recorded: z.boolean() })),
  candidates: z.array(z.object({ proposalId: z.string(), title: z.string(), rawMean: z.number().nullable(), calibratedMean: z.number().nullable() })),
  current: z
    .object({
      proposalId: z.string(),
      position: z.number(),
      steppedOut: z.boolean(),
      title: z.string().nullable(),
      scores: z
        .object({
          count: z.number(),
          rawMean: z.number(),
          calibratedMean: z.number(),
          spread: z.number().nullable(),
          rawRank: z.number(),
          calibratedRank: z.number(),
          rankNote: z.string().nullable(),
          reviews: z.array(z.object({ label: z.string(), total: z.number(), outlier: z.boolean(), deviations: z.number().nullable() })),
        })
        .nullable(),
      openItems: z.array(z.object({ id: z.string(), severity: z.enum(["major", "minor", "comment"]), title: z.string() })),
      record: z.object({ consensusScore: z.number().nullable(), recommendation: z.string().nullable(), notes: z.string(), updatedAt: z.string() }).nullable(),
    })
    .nullable(),
  panel: z.array(z.object({ userId: z.string(), name: z.string(), role: z.enum(["chair", "reviewer"]), present: z.boolean(), steppingOut: z.boolean() })),
  startedAt: z.string().nullable(),
  closedAt: z.string().nullable(),
});

const calibrationView = z.object({
  callId: z.string(),
  rankBy: z.enum(["raw", "calibrated"]),
  lambda: z.number(),
  proposals: z.array(
    z.object({
      proposalId: z.string(),
      title: z.string(),
      count: z.number(),
      rawMean: z.number(),
      calibratedMean: z.number(),
      spread: z.number().nullable(),
      calibratedSpread: z.number().nullable(),
      rawRank: z.number(),
      calibratedRank: z.number(),
      rankChange: z.number(),
      rankNote: z.string().nullable(),
    }),
  ),
  reviewers: z.array(z.object({ reviewerId: z.string(), name: z.string(), effect: z.number(), count: z.number() })),
  outliers: z.array(
    z.object({
      proposalId: z.string(),
      title: z.string(),
      reviewerId: z.string(),
      reviewerName: z.string(),
      score: z.number(),
      othersMean: z.number(),
      othersSpread: z.number(),
      deviations: z.number(),
    }),
  ),
});

export const meetingOperations = defineOperations([
  {
    method: "get",
    path: `${call}/calibration`,
    operationId: "getCallCalibration",
    summary:
      "Raw and calibrated means of the call's proposals (reviewer leniency fitted with ridge shrinkage, docs/calibration.md), rank changes, reviewer effects and outlying scores (chairs)",
    tag: "meetings",
    access: "signed-in",
    response: calibrationView,
  },
  {
    method: "put",
    path: `${call}/rank-by`,
    operationId: "setCallRankBy",
    summary: "Choose whether the call overview ranks by raw or calibrated means (chairs); both stay visible",
    tag: "meetings",
    access: "signed-in",
    body: rankBySchema,
    response: z.object({ callId: z.string(), rankBy: z.enum(["raw", "calibrated"]) }),
  },
  {
    method: "get",
    path: `${call}/meeting`,
    operationId: "getMeeting",
    summary: "The call's panel meeting as the caller may see it (chair and reviewers)",
    tag: "meetings",
    access: "signed-in",
    response: meetingView,
  },
  {
    method: "post",
    path: `${call}/meeting`,
    operationId: "startMeeting",
    summary: "Start the panel meeting with an order of proposals, or change the order of a running one (chairs)",
    tag: "meetings",
    access: "signed-in",
    body: startMeetingSchema,
    response: meetingView,
    errors: { 409: "The meeting is closed." },
  },
  {
    method: "put",
    path: `${call}/meeting/current`,
    operationId: "moveMeeting",
    summary: "Move the meeting to a proposal of its order (chairs); every open meeting page follows",
    tag: "meetings",
    access: "signed-in",
    body: moveMeetingSchema,
    response: meetingView,
    errors: { 409: "The meeting has not started or is closed." },
  },
  {
    method: "put",
    path: `${call}/meeting/records/{proposalId}`,
    operationId: "recordMeetingOutcome",
    summary: "Record the panel's consensus score (within the rubric's scale), recommendation and notes for one proposal (chairs)",
    tag: "meetings",
    access: "signed-in",
    body: meetingRecordSchema,
    response: meetingView,
    errors: { 409: "The meeting has not started or is closed.", 422: "The score is outside the rubric's scale." },
  },
  {
    method: "put",
    path: `${call}/meeting/attendance`,
    operationId: "setMeetingAttendance",
    summary: "Mark yourself present at (or away from) the panel meeting (chair and reviewers)",
    tag: "meetings",
    access: "signed-in",
    body: attendanceSchema,
    response: meetingView,
    errors: { 409: "The meeting has not started or is closed." },
  },
  {
    method: "post",
    path: `${call}/meeting/close`,
    operationId: "closeMeeting",
    summary: "Close the panel meeting; its records become final (chairs)",
    tag: "meetings",
    access: "signed-in",
    response: meetingView,
    errors: { 409: "The meeting has not started or is closed." },
  },
  {
    method: "get",
    path: `${call}/meeting/events`,
    operationId: "followMeeting",
    summary:
      "The meeting as server-sent events (text/event-stream): `meeting` events carry the caller's view after every change; `closed` ends the stream; ?once=1 sends one view and closes",
    tag: "meetings",
    access: "signed-in",
    query: meetingEventsQuerySchema,
    response: meetingView,
  },
  {
    method: "get",
    path: `${call}/meeting/minutes`,
    operationId: "getMeetingMinutes",
    summary:
      "The meeting's minutes as PDF (application/pdf): attendance, scores raw and calibrated, who stepped out, consensus, recommendation, notes (chairs)",
    tag: "meetings",
    access: "signed-in",
  },
]);
