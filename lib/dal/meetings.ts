import "server-only";
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import {
  assignments,
  boardMembers,
  callRankings,
  panelMeetingAttendance,
  panelMeetingRecords,
  panelMeetings,
  proposals,
  proposalVersions,
  reviewItems,
  reviews,
  users,
  type CriterionScore,
} from "@/db/schema";
import { authorize } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { conflict, notFound, unprocessable } from "@/lib/errors";
import { calibrateScores, rankChangeNote, type CalibrationResult, type RankBy } from "@/lib/review/calibration";
import { signalMeeting } from "@/lib/meetings/signal";
import { hasHardConflict } from "@/lib/review/conflicts";
import type { Recommendation } from "@/lib/validation/meetings";
import { recordAudit } from "./audit";
import { boardRole, isUuid } from "./boards";
import { loadCall } from "./calls";
import { conflictMatrix } from "./conflicts";
import { loadTemplate } from "./rubrics";

type Db = Database | Transaction;

/** Proposal states that have reviews worth discussing (the same as the call overview). */
const REVIEWED_STATES = ["submitted", "in_review", "decided"] as const;

export interface CallScoreRow {
  proposalId: string;
  versionId: string;
  reviewerId: string;
  reviewerName: string;
  total: number;
  scores: Record<string, CriterionScore>;
}

/**
 * The submitted reviews of the latest version of every reviewed proposal in a call, with
 * their weighted totals and per-criterion scores. No policy check: callers check first.
 */
export async function callScoreRows(boardId: string, callId: string, tx: Db = db()): Promise<CallScoreRow[]> {
  const rows = await tx
    .select({
      proposalId: reviews.proposalId,
      versionId: reviews.versionId,
      reviewerId: reviews.reviewerId,
      reviewerName: users.name,
      total: reviews.weightedTotal,
      scores: reviews.scores,
    })
    .from(reviews)
    .innerJoin(proposals, eq(proposals.id, reviews.proposalId))
    .innerJoin(proposalVersions, and(eq(proposalVersions.id, reviews.versionId), eq(proposalVersions.number, proposals.latestVersion)))
    .innerJoin(users, eq(users.id, reviews.reviewerId))
    .where(
      and(
        eq(reviews.boardId, boardId),
        eq(proposals.boardId, boardId),
        eq(proposals.callId, callId),
        inArray(proposals.status, [...REVIEWED_STATES]),
        eq(reviews.status, "submitted"),
      ),
    );
  return rows.filter((r) => r.total !== null).map((r) => ({ ...r, total: Number(r.total) }));
}

export interface CallCalibration {
  rankBy: RankBy;
  calibration: CalibrationResult;
}

/** The call's calibrated scores (weighted totals, default λ) and the chair's rank-by choice. No policy check. */
export async function callCalibration(boardId: string, callId: string, tx: Db = db()): Promise<CallCalibration> {
  const rows = await callScoreRows(boardId, callId, tx);
  const calibration = calibrateScores(rows.map((r) => ({ proposalId: r.proposalId, reviewerId: r.reviewerId, score: r.total })));
  const [ranking] = await tx
    .select({ rankBy: callRankings.rankBy })
    .from(callRankings)
    .where(and(eq(callRankings.boardId, boardId), eq(callRankings.callId, callId)));
  return { rankBy: ranking?.rankBy ?? "raw", calibration };
}

async function chairCall(user: SessionUser, boardId: string, callId: string, permission: "review.view-all" | "call.manage") {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId);
  authorize(user, permission, { role }, "That board");
  if (!isUuid(callId)) throw notFound("That call");
  const call = await loadCall(boardId, callId);
  if (!call) throw notFound("That call");
  return call;
}

export interface CalibrationView {
  callId: string;
  rankBy: RankBy;
  lambda: number;
  proposals: (CalibrationResult["proposals"][number] & { title: string; rankNote: string | null })[];
  reviewers: (CalibrationResult["reviewers"][number] & { name: string })[];
  outliers: (CalibrationResult["outliers"][number] & { reviewerName: string; title: string })[];
}

/** The chair's view of the call's calibration: raw and calibrated means, ranks, reviewer effects, outlying scores. */
export async function getCallCalibration(user: SessionUser, boardId: string, callId: string): Promise<CalibrationView> {
  await chairCall(user, boardId, callId, "review.view-all");
  const { rankBy, calibration } = await callCalibration(boardId, callId);
  const rows = await callScoreRows(boardId, callId);
  const names = new Map(rows.map((r) => [r.reviewerId, r.reviewerName]));
  const ids = calibration.proposals.map((p) => p.proposalId);
  const titles = new Map(
    ids.length
      ? (
          await db()
            .select({ id: proposals.id, title: proposals.title })
            .from(proposals)
            .where(and(eq(proposals.boardId, boardId), inArray(proposals.id, ids)))
        ).map((p) => [p.id, p.title])
      : [],
  );
  return {
    callId,
    rankBy,
    lambda: calibration.lambda,
    proposals: calibration.proposals.map((p) => ({ ...p, title: titles.get(p.proposalId) ?? "", rankNote: rankChangeNote(p) })),
    reviewers: calibration.reviewers.map((r) => ({ ...r, name: names.get(r.reviewerId) ?? "" })),
    outliers: calibration.outliers.map((o) => ({ ...o, reviewerName: names.get(o.reviewerId) ?? "", title: titles.get(o.proposalId) ?? "" })),
  };
}

/** The chair chooses whether the overview ranks by raw or calibrated means; both stay visible. */
export async function setCallRankBy(
  user: SessionUser,
  boardId: string,
  callId: string,
  input: { rankBy: RankBy },
): Promise<{ callId: string; rankBy: RankBy }> {
  await chairCall(user, boardId, callId, "call.manage");
  await db().transaction(async (tx) => {
    await tx
      .insert(callRankings)
      .values({ callId, boardId, rankBy: input.rankBy })
      .onConflictDoUpdate({ target: callRankings.callId, set: { rankBy: input.rankBy, updatedAt: new Date() } });
    await recordAudit({ action: "call.rank-by", actorId: user.id, actorEmail: user.email, boardId, target: callId, details: { rankBy: input.rankBy } }, tx);
  });
  return { callId, rankBy: input.rankBy };
}

// ---------------------------------------------------------------------------------------
// The panel meeting

export type MeetingStatus = "not started" | "running" | "closed";

export interface MeetingPanelMember {
  userId: string;
  name: string;
  role: "chair" | "reviewer";
  present: boolean;
  /** Conflicted with the proposal under discussion: steps out for it. */
  steppingOut: boolean;
}

export interface MeetingAgendaEntry {
  proposalId: string;
  position: number;
  /** Null when the viewer is conflicted with the proposal. */
  title: string | null;
  recorded: boolean;
}

export interface MeetingRecordView {
  consensusScore: number | null;
  recommendation: Recommendation | null;
  notes: string;
  updatedAt: string;
}

export interface MeetingCurrent {
  proposalId: string;
  position: number;
  /** True when the viewer is conflicted: no title, scores, names, items or record. */
  steppedOut: boolean;
  title: string | null;
  scores: {
    count: number;
    rawMean: number;
    calibratedMean: number;
    spread: number | null;
    rawRank: number;
    calibratedRank: number;
    rankNote: string | null;
    reviews: { label: string; total: number; outlier: boolean; deviations: number | null }[];
  } | null;
  openItems: { id: string; severity: "major" | "minor" | "comment"; title: string }[];
  record: MeetingRecordView | null;
}

export interface MeetingView {
  call: { id: string; title: string };
  scale: { min: number; max: number } | null;
  status: MeetingStatus;
  revision: number;
  rankBy: RankBy;
  me: { userId: string; isChair: boolean; present: boolean; steppingOut: boolean };
  agenda: MeetingAgendaEntry[];
  /** For the chair before the meeting starts (and to reorder): the call's reviewed proposals, ranked as the overview ranks them. */
  candidates: { proposalId: string; title: string; rawMean: number | null; calibratedMean: number | null }[];
  current: MeetingCurrent | null;
  panel: MeetingPanelMember[];
  startedAt: string | null;
  closedAt: string | null;
}

async function meetingAccess(user: SessionUser, boardId: string, callId: string, permission: "meeting.view" | "meeting.run", tx: Db = db()) {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId, tx);
  authorize(user, permission, { role }, "That board");
  if (!isUuid(callId)) throw notFound("That call");
  const call = await loadCall(boardId, callId, tx);
  if (!call) throw notFound("That call");
  return { role, call };
}

async function loadMeeting(boardId: string, callId: string, tx: Db = db()) {
  const [meeting] = await tx
    .select()
    .from(panelMeetings)
    .where(and(eq(panelMeetings.boardId, boardId), eq(panelMeetings.callId, callId)));
  return meeting ?? null;
}

/** The meeting's revision (null before it starts): the live stream compares it to decide when to send. Checks access. */
export async function meetingRevision(user: SessionUser, boardId: string, callId: string): Promise<number | null> {
  await meetingAccess(user, boardId, callId, "meeting.view");
  const [row] = await db()
    .select({ revision: panelMeetings.revision })
    .from(panelMeetings)
    .where(and(eq(panelMeetings.boardId, boardId), eq(panelMeetings.callId, callId)));
  return row?.revision ?? null;
}

async function reviewedProposals(boardId: string, callId: string, tx: Db) {
  return tx
    .select({ id: proposals.id, title: proposals.title, versionId: proposalVersions.id })
    .from(proposals)
    .innerJoin(proposalVersions, and(eq(proposalVersions.proposalId, proposals.id), eq(proposalVersions.number, proposals.latestVersion)))
    .where(and(eq(proposals.boardId, boardId), eq(proposals.callId, callId), inArray(proposals.status, [...REVIEWED_STATES])))
    .orderBy(asc(proposals.title));
}

async function panelOf(boardId: string, tx: Db) {
  return tx
    .select({ userId: users.id, name: users.name, role: boardMembers.role })
    .from(boardMembers)
    .innerJoin(users, eq(users.id, boardMembers.userId))
    .where(and(eq(boardMembers.boardId, boardId), eq(boardMembers.status, "active"), inArray(boardMembers.role, ["chair", "reviewer"])))
    .orderBy(asc(users.name));
}

async function scaleOf(boardId: string, rubricTemplateId: string | null, tx: Db) {
  const template = rubricTemplateId ? await loadTemplate(boardId, rubricTemplateId, tx) : null;
  const c = template?.criteria[0];
  return c ? { min: c.scaleMin, max: c.scaleMax } : null;
}

/** The meeting as this user may see it. Conflicted members get nothing of the proposal they step out for. */
export async function getMeeting(user: SessionUser, boardId: string, callId: string, tx: Db = db()): Promise<MeetingView> {
  const { role, call } = await meetingAccess(user, boardId, callId, "meeting.view", tx);
  const isChair = role === "chair" || (role === null && user.isAdmin);
  const meeting = await loadMeeting(boardId, callId, tx);
  const candidatesRows = await reviewedProposals(boardId, callId, tx);
  const titles = new Map(candidatesRows.map((p) => [p.id, p.title]));
  const { rankBy, calibration } = await callCalibration(boardId, callId, tx);
  const byProposal = new Map(calibration.proposals.map((p) => [p.proposalId, p]));
  const panelRows = await panelOf(boardId, tx);
  const order = meeting?.proposalOrder ?? [];
  const currentId = meeting?.currentProposalId ?? null;
  // Conflicts of every panel member (and the viewer) with every proposal on the agenda.
  const people = [...new Set([...panelRows.map((p) => p.userId), user.id])];
  const conflicts = await conflictMatrix(boardId, people, order, tx);
  const conflicted = (userId: string, proposalId: string) => hasHardConflict(conflicts.get(`${userId}:${proposalId}`) ?? []);

  const attendance = meeting
    ? await tx
        .select({ userId: panelMeetingAttendance.userId, present: panelMeetingAttendance.present })
        .from(panelMeetingAttendance)
        .where(eq(panelMeetingAttendance.meetingId, meeting.id))
    : [];
  const present = new Map(attendance.map((a) => [a.userId, a.present]));
  const records = meeting
    ? await tx
        .select({
          proposalId: panelMeetingRecords.proposalId,
          consensusScore: panelMeetingRecords.consensusScore,
          recommendation: panelMeetingRecords.recommendation,
          notes: panelMeetingRecords.notes,
          updatedAt: panelMeetingRecords.updatedAt,
        })
        .from(panelMeetingRecords)
        .where(eq(panelMeetingRecords.meetingId, meeting.id))
    : [];
  const recordOf = new Map(records.map((r) => [r.proposalId, r]));

  let current: MeetingCurrent | null = null;
  if (meeting && currentId && order.includes(currentId)) {
    const steppedOut = conflicted(user.id, currentId);
    const position = order.indexOf(currentId) + 1;
    if (steppedOut) current = { proposalId: currentId, position, steppedOut, title: null, scores: null, openItems: [], record: null };
    else {
      const cal = byProposal.get(currentId);
      const scoreRows = (await callScoreRows(boardId, callId, tx)).filter((r) => r.proposalId === currentId);
      const labels = new Map<string, string>();
      const ordinals = await tx
        .select({ reviewerId: assignments.reviewerId })
        .from(assignments)
        .where(and(eq(assignments.boardId, boardId), eq(assignments.proposalId, currentId)))
        .orderBy(asc(assignments.createdAt));
      for (const o of ordinals) if (!labels.has(o.reviewerId)) labels.set(o.reviewerId, `Reviewer ${labels.size + 1}`);
      const flagged = new Map(calibration.outliers.filter((o) => o.proposalId === currentId).map((o) => [o.reviewerId, o.deviations]));
      const version = candidatesRows.find((p) => p.id === currentId)?.versionId;
      const items = version
        ? await tx
            .select({ id: reviewItems.id, severity: reviewItems.severity, title: reviewItems.title })
            .from(reviewItems)
            .where(and(eq(reviewItems.boardId, boardId), eq(reviewItems.versionId, version), eq(reviewItems.status, "open")))
            .orderBy(asc(reviewItems.createdAt))
        : [];
      const record = recordOf.get(currentId);
      current = {
        proposalId: currentId,
        position,
        steppedOut,
        title: titles.get(currentId) ?? null,
        scores: cal
          ? {
              count: cal.count,
              rawMean: cal.rawMean,
              calibratedMean: cal.calibratedMean,
              spread: cal.spread,
              rawRank: cal.rawRank,
              calibratedRank: cal.calibratedRank,
              rankNote: rankChangeNote(cal),
              reviews: scoreRows
                .map((r) => ({
                  label: isChair ? r.reviewerName : (labels.get(r.reviewerId) ?? "Reviewer"),
                  total: r.total,
                  outlier: flagged.has(r.reviewerId),
                  deviations: flagged.get(r.reviewerId) ?? null,
                }))
                .sort((a, b) => a.label.localeCompare(b.label)),
            }
          : null,
        openItems: items,
        record: record
          ? {
              consensusScore: record.consensusScore,
              recommendation: record.recommendation as Recommendation | null,
              notes: record.notes,
              updatedAt: record.updatedAt.toISOString(),
            }
          : null,
      };
    }
  }

  const rankValue = (id: string) => {
    const c = byProposal.get(id);
    return c ? (rankBy === "calibrated" ? c.calibratedMean : c.rawMean) : Number.NEGATIVE_INFINITY;
  };
  return {
    call: { id: call.id, title: call.title },
    scale: await scaleOf(boardId, call.rubricTemplateId, tx),
    status: meeting ? meeting.status : "not started",
    revision: meeting?.revision ?? 0,
    rankBy,
    me: {
      userId: user.id,
      isChair,
      present: present.get(user.id) ?? false,
      steppingOut: currentId ? conflicted(user.id, currentId) : false,
    },
    agenda: order.map((proposalId, i) => ({
      proposalId,
      position: i + 1,
      title: conflicted(user.id, proposalId) ? null : (titles.get(proposalId) ?? null),
      recorded: recordOf.has(proposalId),
    })),
    candidates: isChair
      ? [...candidatesRows]
          .sort((a, b) => rankValue(b.id) - rankValue(a.id) || a.title.localeCompare(b.title))
          .map((p) => ({
            proposalId: p.id,
            title: p.title,
            rawMean: byProposal.get(p.id)?.rawMean ?? null,
            calibratedMean: byProposal.get(p.id)?.calibratedMean ?? null,
          }))
      : [],
    current,
    panel: panelRows.map((p) => ({
      userId: p.userId,
      name: p.name,
      role: p.role as "chair" | "reviewer",
      present: present.get(p.userId) ?? false,
      steppingOut: currentId ? conflicted(p.userId, currentId) : false,
    })),
    startedAt: meeting?.startedAt.toISOString() ?? null,
    closedAt: meeting?.closedAt?.toISOString() ?? null,
  };
}

async function runningMeeting(boardId: string, callId: string, tx: Db) {
  const meeting = await loadMeeting(boardId, callId, tx);
  if (!meeting) throw conflict("The meeting has not started yet. The chair starts it with an order of proposals.");
  if (meeting.status === "closed") throw conflict("The meeting is closed; its minutes are final.", { closed: true });
  return meeting;
}

async function bump(meetingId: string, tx: Db, set: Partial<typeof panelMeetings.$inferInsert> = {}) {
  await tx
    .update(panelMeetings)
    .set({ ...set, revision: sql`${panelMeetings.revision} + 1`, updatedAt: new Date() })
    .where(eq(panelMeetings.id, meetingId));
}

/**
 * The chair starts the meeting with an order of proposals, or changes the order of a running
 * one. Every proposal must be a reviewed proposal of this call, each at most once.
 */
export async function startMeeting(user: SessionUser, boardId: string, callId: string, input: { order: string[] }): Promise<MeetingView> {
  await meetingAccess(user, boardId, callId, "meeting.run");
  await db().transaction(async (tx) => {
    const reviewed = new Set((await reviewedProposals(boardId, callId, tx)).map((p) => p.id));
    if (new Set(input.order).size !== input.order.length) throw unprocessable("Each proposal can be in the order only once.");
    const stranger = input.order.find((id) => !reviewed.has(id));
    if (stranger) throw unprocessable("The order may only hold proposals of this call that have been submitted for review.", { proposalId: stranger });
    const meeting = await loadMeeting(boardId, callId, tx);
    if (meeting?.status === "closed") throw conflict("The meeting is closed; its minutes are final.", { closed: true });
    if (!meeting) {
      await tx.insert(panelMeetings).values({ boardId, callId, proposalOrder: input.order, currentProposalId: input.order[0]!, startedBy: user.id });
      await tx
        .insert(panelMeetingAttendance)
        .values({ meetingId: (await loadMeeting(boardId, callId, tx))!.id, userId: user.id, present: true })
        .onConflictDoNothing();
    } else {
      const current = meeting.currentProposalId && input.order.includes(meeting.currentProposalId) ? meeting.currentProposalId : input.order[0]!;
      await bump(meeting.id, tx, { proposalOrder: input.order, currentProposalId: current });
    }
    await recordAudit(
      {
        action: meeting ? "meeting.reorder" : "meeting.start",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: callId,
        details: { order: input.order },
      },
      tx,
    );
  });
  signalMeeting(callId);
  return getMeeting(user, boardId, callId);
}

/** The chair moves the meeting to a proposal of its order. */
export async function moveMeeting(user: SessionUser, boardId: string, callId: string, input: { proposalId: string }): Promise<MeetingView> {
  await meetingAccess(user, boardId, callId, "meeting.run");
  await db().transaction(async (tx) => {
    const meeting = await runningMeeting(boardId, callId, tx);
    if (!meeting.proposalOrder.includes(input.proposalId)) throw unprocessable("That proposal is not in the meeting's order.");
    await bump(meeting.id, tx, { currentProposalId: input.proposalId });
    await recordAudit(
      { action: "meeting.move", actorId: user.id, actorEmail: user.email, boardId, target: callId, details: { proposalId: input.proposalId } },
      tx,
    );
  });
  signalMeeting(callId);
  return getMeeting(user, boardId, callId);
}

function formatScale(scale: { min: number; max: number }) {
  return `${scale.min} to ${scale.max}`;
}

/** The chair records the panel's consensus score (within the rubric's scale), recommendation and notes for one proposal. */
export async function recordMeetingOutcome(
  user: SessionUser,
  boardId: string,
  callId: string,
  proposalId: string,
  input: { consensusScore: number | null; recommendation: Recommendation | null; notes: string },
): Promise<MeetingView> {
  const { call } = await meetingAccess(user, boardId, callId, "meeting.run");
  if (!isUuid(proposalId)) throw notFound("That proposal");
  await db().transaction(async (tx) => {
    const meeting = await runningMeeting(boardId, callId, tx);
    if (!meeting.proposalOrder.includes(proposalId)) throw unprocessable("That proposal is not in the meeting's order.");
    if (input.consensusScore !== null) {
      const scale = await scaleOf(boardId, call.rubricTemplateId, tx);
      if (!scale) throw unprocessable("The call has no rubric, so a consensus score has no scale. Leave the score empty or set up the rubric first.");
      if (input.consensusScore < scale.min || input.consensusScore > scale.max)
        throw unprocessable(`The consensus score must lie within the rubric's scale, ${formatScale(scale)}.`, {
          issues: [{ path: "consensusScore", message: `Enter a score from ${formatScale(scale)}.` }],
        });
      if (Math.abs(Math.round(input.consensusScore * 100) - input.consensusScore * 100) > 1e-6)
        throw unprocessable("The consensus score can have at most two decimals.", { issues: [{ path: "consensusScore", message: "Round to two decimals." }] });
    }
    await tx
      .insert(panelMeetingRecords)
      .values({ meetingId: meeting.id, proposalId, ...input, recordedBy: user.id })
      .onConflictDoUpdate({
        target: [panelMeetingRecords.meetingId, panelMeetingRecords.proposalId],
        set: { ...input, recordedBy: user.id, updatedAt: new Date() },
      });
    await bump(meeting.id, tx);
    await recordAudit(
      {
        action: "meeting.record",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: proposalId,
        details: { callId, consensusScore: input.consensusScore, recommendation: input.recommendation },
      },
      tx,
    );
  });
  signalMeeting(callId);
  return getMeeting(user, boardId, callId);
}

/** A panel member (chair or reviewer) marks themselves present or away. */
export async function setMeetingAttendance(user: SessionUser, boardId: string, callId: string, input: { present: boolean }): Promise<MeetingView> {
  await meetingAccess(user, boardId, callId, "meeting.view");
  await db().transaction(async (tx) => {
    const meeting = await runningMeeting(boardId, callId, tx);
    await tx
      .insert(panelMeetingAttendance)
      .values({ meetingId: meeting.id, userId: user.id, present: input.present })
      .onConflictDoUpdate({
        target: [panelMeetingAttendance.meetingId, panelMeetingAttendance.userId],
        set: { present: input.present, updatedAt: new Date() },
      });
    await bump(meeting.id, tx);
  });
  signalMeeting(callId);
  return getMeeting(user, boardId, callId);
}

/** The chair closes the meeting; its records are final and the minutes can be filed. */
export async function closeMeeting(user: SessionUser, boardId: string, callId: string): Promise<MeetingView> {
  await meetingAccess(user, boardId, callId, "meeting.run");
  await db().transaction(async (tx) => {
    const meeting = await runningMeeting(boardId, callId, tx);
    await bump(meeting.id, tx, { status: "closed", closedAt: new Date() });
    await recordAudit({ action: "meeting.close", actorId: user.id, actorEmail: user.email, boardId, target: callId }, tx);
  });
  signalMeeting(callId);
  return getMeeting(user, boardId, callId);
}

export interface MeetingMinutes {
  callTitle: string;
  status: MeetingStatus;
  startedAt: Date;
  closedAt: Date | null;
  scale: { min: number; max: number } | null;
  present: string[];
  absent: string[];
  entries: {
    position: number;
    title: string;
    rawMean: number | null;
    calibratedMean: number | null;
    spread: number | null;
    rankNote: string | null;
    outliers: number;
    steppedOut: string[];
    consensusScore: number | null;
    recommendation: string | null;
    notes: string;
  }[];
}

/** What the minutes say, for the chair's PDF. */
export async function getMeetingMinutes(user: SessionUser, boardId: string, callId: string): Promise<MeetingMinutes> {
  const { call } = await meetingAccess(user, boardId, callId, "meeting.run");
  const meeting = await loadMeeting(boardId, callId);
  if (!meeting) throw notFound("That meeting");
  const view = await getMeeting(user, boardId, callId);
  const { calibration } = await callCalibration(boardId, callId);
  const byProposal = new Map(calibration.proposals.map((p) => [p.proposalId, p]));
  const records = await db()
    .select({
      proposalId: panelMeetingRecords.proposalId,
      consensusScore: panelMeetingRecords.consensusScore,
      recommendation: panelMeetingRecords.recommendation,
      notes: panelMeetingRecords.notes,
    })
    .from(panelMeetingRecords)
    .where(eq(panelMeetingRecords.meetingId, meeting.id));
  const recordOf = new Map(records.map((r) => [r.proposalId, r]));
  const titles = new Map((await reviewedProposals(boardId, callId, db())).map((p) => [p.id, p.title]));
  const panelIds = view.panel.map((p) => p.userId);
  const conflicts = await conflictMatrix(boardId, panelIds, meeting.proposalOrder);
  return {
    callTitle: call.title,
    status: meeting.status,
    startedAt: meeting.startedAt,
    closedAt: meeting.closedAt,
    scale: view.scale,
    present: view.panel.filter((p) => p.present).map((p) => p.name),
    absent: view.panel.filter((p) => !p.present).map((p) => p.name),
    entries: meeting.proposalOrder.map((proposalId, i) => {
      const c = byProposal.get(proposalId);
      const r = recordOf.get(proposalId);
      return {
        position: i + 1,
        title: titles.get(proposalId) ?? "(proposal withdrawn)",
        rawMean: c?.rawMean ?? null,
        calibratedMean: c?.calibratedMean ?? null,
        spread: c?.spread ?? null,
        rankNote: c ? rankChangeNote(c) : null,
        outliers: calibration.outliers.filter((o) => o.proposalId === proposalId).length,
        steppedOut: view.panel.filter((p) => hasHardConflict(conflicts.get(`${p.userId}:${proposalId}`) ?? [])).map((p) => p.name),
        consensusScore: r?.consensusScore ?? null,
        recommendation: r?.recommendation ?? null,
        notes: r?.notes ?? "",
      };
    }),
  };
}
