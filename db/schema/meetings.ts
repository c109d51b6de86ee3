import { boolean, integer, jsonb, numeric, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { users } from "./accounts";
import { boards } from "./boards";
import { calls, proposals } from "./proposals";

/** What the call overview ranks by: the chair's choice, raw or calibrated means (both stay visible). */
export const callRankings = pgTable("call_rankings", {
  callId: uuid("call_id")
    .primaryKey()
    .references(() => calls.id, { onDelete: "cascade" }),
  boardId: uuid("board_id")
    .notNull()
    .references(() => boards.id, { onDelete: "cascade" }),
  rankBy: text("rank_by", { enum: ["raw", "calibrated"] })
    .notNull()
    .default("raw"),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
});

/**
 * The panel meeting of a call (one per call): the chair's order of proposals and the one
 * under discussion. `revision` grows with every change, so open meeting pages know to refresh.
 */
export const panelMeetings = pgTable(
  "panel_meetings",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    callId: uuid("call_id")
      .notNull()
      .references(() => calls.id, { onDelete: "cascade" }),
    proposalOrder: jsonb("proposal_order").$type<string[]>().notNull().default([]),
    currentProposalId: uuid("current_proposal_id").references(() => proposals.id, { onDelete: "set null" }),
    status: text("status", { enum: ["running", "closed"] })
      .notNull()
      .default("running"),
    revision: integer("revision").notNull().default(1),
    startedBy: uuid("started_by").references(() => users.id, { onDelete: "set null" }),
    startedAt: timestamp("started_at", { withTimezone: true }).notNull().defaultNow(),
    closedAt: timestamp("closed_at", { withTimezone: true }),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("panel_meetings_call_key").on(t.callId)],
);

/** The panel's settled view of one proposal, recorded by the chair during the meeting. */
export const panelMeetingRecords = pgTable(
  "panel_meeting_records",
  {
    meetingId: uuid("meeting_id")
      .notNull()
      .references(() => panelMeetings.id, { onDelete: "cascade" }),
    proposalId: uuid("proposal_id")
      .notNull()
      .references(() => proposals.id, { onDelete: "cascade" }),
    consensusScore: numeric("consensus_score", { precision: 8, scale: 2, mode: "number" }),
    recommendation: text("recommendation"),
    notes: text("notes").notNull().default(""),
    recordedBy: uuid("recorded_by").references(() => users.id, { onDelete: "set null" }),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.meetingId, t.proposalId] })],
);

/** Panel members who marked themselves present. */
export const panelMeetingAttendance = pgTable(
  "panel_meeting_attendance",
  {
    meetingId: uuid("meeting_id")
      .notNull()
      .references(() => panelMeetings.id, { onDelete: "cascade" }),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    present: boolean("present").notNull().default(true),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.meetingId, t.userId] })],
);
