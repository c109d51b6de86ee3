import { index, integer, jsonb, numeric, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { users } from "./accounts";
import { boards } from "./boards";
import { decisionOutcomes, outboxStatuses } from "../vocabulary";
import { proposals, proposalVersions } from "./proposals";

export { decisionOutcomes, outboxStatuses, type DecisionOutcome, type OutboxStatus } from "../vocabulary";

/** One decision per submitted version; the unique key is what forbids deciding twice. */
export const decisions = pgTable(
  "decisions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    proposalId: uuid("proposal_id")
      .notNull()
      .references(() => proposals.id, { onDelete: "cascade" }),
    versionId: uuid("version_id")
      .notNull()
      .references(() => proposalVersions.id, { onDelete: "cascade" }),
    outcome: text("outcome", { enum: decisionOutcomes }).notNull(),
    letter: jsonb("letter").$type<Record<string, unknown>>().notNull(),
    letterHtml: text("letter_html").notNull(),
    letterText: text("letter_text").notNull(),
    pdfKey: text("pdf_key"),
    /** The review report PDF attached to the letter e-mail, when the chair chose to (stored like the letter). */
    reportPdfKey: text("report_pdf_key"),
    weightedScore: numeric("weighted_score", { precision: 8, scale: 4, mode: "number" }),
    /** Why the chair decided without the required number of reviews (null when not overridden). */
    overrideReason: text("override_reason"),
    decidedBy: uuid("decided_by").references(() => users.id, { onDelete: "set null" }),
    decidedAt: timestamp("decided_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("decisions_version_key").on(t.versionId), index("decisions_proposal_idx").on(t.proposalId)],
);

/** Every e-mail the product sends goes through this table; `dedupeKey` makes a send happen once. */
export const outboxMessages = pgTable(
  "outbox_messages",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id").references(() => boards.id, { onDelete: "set null" }),
    kind: text("kind").notNull(),
    dedupeKey: text("dedupe_key").notNull(),
    toAddresses: jsonb("to_addresses").$type<string[]>().notNull(),
    subject: text("subject").notNull(),
    html: text("html").notNull(),
    text: text("text").notNull(),
    /** Object-store keys of attachments, read when the message is sent. */
    attachments: jsonb("attachments").$type<{ filename: string; objectKey: string; contentType: string }[]>().notNull().default([]),
    status: text("status", { enum: outboxStatuses }).notNull().default("queued"),
    attempts: integer("attempts").notNull().default(0),
    lastError: text("last_error"),
    providerMessageId: text("provider_message_id"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp("sent_at", { withTimezone: true }),
    nextAttemptAt: timestamp("next_attempt_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("outbox_messages_dedupe_key").on(t.dedupeKey),
    index("outbox_messages_status_idx").on(t.status, t.nextAttemptAt),
    // The admin's list, newest first, unfiltered and by status: an index range, not a scan and sort.
    index("outbox_messages_created_idx").on(t.createdAt, t.id),
    index("outbox_messages_status_created_idx").on(t.status, t.createdAt, t.id),
  ],
);
