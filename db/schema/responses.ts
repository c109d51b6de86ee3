import { index, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { users } from "./accounts";
import { boards } from "./boards";
import { calls, proposalVersions } from "./proposals";
import { reviewItems } from "./reviews";
import { DISPOSITION_CODES } from "../../lib/review/responses";

/**
 * The response round of a call: between `opensAt` and `closesAt` proposers see the review
 * items on their versions and answer each one. One window per call; the chair may move its
 * dates or close it early. The `*MailedAt` columns make the window's three e-mails
 * (opening, 2 days before the end, closing) go out once each.
 */
export const responseWindows = pgTable(
  "response_windows",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    callId: uuid("call_id")
      .notNull()
      .references(() => calls.id, { onDelete: "cascade" }),
    opensAt: timestamp("opens_at", { withTimezone: true }).notNull(),
    closesAt: timestamp("closes_at", { withTimezone: true }).notNull(),
    openedBy: uuid("opened_by").references(() => users.id, { onDelete: "set null" }),
    openingMailedAt: timestamp("opening_mailed_at", { withTimezone: true }),
    reminderMailedAt: timestamp("reminder_mailed_at", { withTimezone: true }),
    closingMailedAt: timestamp("closing_mailed_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("response_windows_call_key").on(t.callId), index("response_windows_board_idx").on(t.boardId)],
);

/**
 * A proposer's answer to one review item (one per item, editable while the window is open).
 * It may point at a section (a heading) of a newer version of the same dossier.
 */
export const reviewItemAnswers = pgTable(
  "review_item_answers",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    reviewItemId: uuid("review_item_id")
      .notNull()
      .references(() => reviewItems.id, { onDelete: "cascade" }),
    windowId: uuid("window_id")
      .notNull()
      .references(() => responseWindows.id, { onDelete: "cascade" }),
    authorId: uuid("author_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    body: text("body").notNull(),
    /** A newer version of the dossier the answer points at (null: none). */
    sectionVersionId: uuid("section_version_id").references(() => proposalVersions.id, { onDelete: "set null" }),
    /** The heading text of the section in that version. */
    sectionHeading: text("section_heading"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("review_item_answers_item_key").on(t.reviewItemId), index("review_item_answers_board_idx").on(t.boardId)],
);

/** What became of a review item; labels in lib/review/responses.ts. */
export const dispositionCodes = DISPOSITION_CODES;
export type DispositionCode = (typeof dispositionCodes)[number];

/**
 * What became of a review item, append-only: the latest row is the item's disposition, the
 * earlier ones its history (who, when, why). Set by the item's reviewer or the chair.
 */
export const reviewItemDispositions = pgTable(
  "review_item_dispositions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    reviewItemId: uuid("review_item_id")
      .notNull()
      .references(() => reviewItems.id, { onDelete: "cascade" }),
    disposition: text("disposition", { enum: dispositionCodes }).notNull(),
    /** Why; required for "not-accepted". */
    reason: text("reason").notNull().default(""),
    actorId: uuid("actor_id").references(() => users.id, { onDelete: "set null" }),
    /** In which capacity the actor set it. */
    actorRole: text("actor_role", { enum: ["reviewer", "chair"] }).notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("review_item_dispositions_item_idx").on(t.reviewItemId, t.createdAt)],
);
