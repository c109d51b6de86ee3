import { index, integer, jsonb, numeric, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { users } from "./accounts";
import { boards } from "./boards";
import { calls, checkResults, proposals, proposalVersions } from "./proposals";
import { REVIEWER_LEVELS } from "../../lib/review/responses";

export interface RubricCriterion {
  id: string;
  title: string;
  description: string;
  /** Percent; the weights of a template sum to 100. */
  weight: number;
  scaleMin: number;
  scaleMax: number;
  /** One descriptor per level, from scaleMin to scaleMax. */
  levels: string[];
  /** A comment is required for scores strictly below this value (null: never). */
  commentRequiredBelow: number | null;
}

/** A rubric template version. Frozen once the first review of its call starts. */
export const rubricTemplates = pgTable(
  "rubric_templates",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    callId: uuid("call_id")
      .notNull()
      .references(() => calls.id, { onDelete: "cascade" }),
    version: integer("version").notNull(),
    name: text("name").notNull(),
    criteria: jsonb("criteria").$type<RubricCriterion[]>().notNull(),
    frozenAt: timestamp("frozen_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("rubric_templates_call_version_key").on(t.callId, t.version)],
);

/** A reviewer's declared conflict: with one proposal, or with an organisation. */
export const conflicts = pgTable(
  "conflicts",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    reviewerId: uuid("reviewer_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    proposalId: uuid("proposal_id").references(() => proposals.id, { onDelete: "cascade" }),
    organisation: text("organisation"),
    reason: text("reason").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("conflicts_board_reviewer_idx").on(t.boardId, t.reviewerId)],
);

export const assignments = pgTable(
  "assignments",
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
    reviewerId: uuid("reviewer_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    dueAt: timestamp("due_at", { withTimezone: true }).notNull(),
    assignedBy: uuid("assigned_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("assignments_version_reviewer_key").on(t.versionId, t.reviewerId), index("assignments_reviewer_idx").on(t.reviewerId)],
);

/** Three levels for a reviewer's confidence and expertise; labels in lib/review/confidence.ts. */
export const reviewerLevels = REVIEWER_LEVELS;
export type ReviewerLevel = (typeof reviewerLevels)[number];

export interface CriterionScore {
  score: number | null;
  comment: string;
}

export const reviews = pgTable(
  "reviews",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    assignmentId: uuid("assignment_id")
      .notNull()
      .references(() => assignments.id, { onDelete: "cascade" }),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    proposalId: uuid("proposal_id")
      .notNull()
      .references(() => proposals.id, { onDelete: "cascade" }),
    versionId: uuid("version_id")
      .notNull()
      .references(() => proposalVersions.id, { onDelete: "cascade" }),
    reviewerId: uuid("reviewer_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    rubricTemplateId: uuid("rubric_template_id")
      .notNull()
      .references(() => rubricTemplates.id),
    scores: jsonb("scores").$type<Record<string, CriterionScore>>().notNull().default({}),
    summary: text("summary").notNull().default(""),
    weightedTotal: numeric("weighted_total", { precision: 8, scale: 4, mode: "number" }),
    revision: integer("revision").notNull().default(1),
    status: text("status", { enum: ["draft", "submitted"] })
      .notNull()
      .default("draft"),
    submittedAt: timestamp("submitted_at", { withTimezone: true }),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
    /** The reviewer's confidence in their own judgement (null: not stated yet). Weights nothing. */
    confidence: text("confidence", { enum: reviewerLevels }),
    /** The reviewer's expertise in the proposal's subject (null: not stated yet). Weights nothing. */
    expertise: text("expertise", { enum: reviewerLevels }),
  },
  (t) => [uniqueIndex("reviews_assignment_key").on(t.assignmentId), index("reviews_proposal_idx").on(t.proposalId)],
);

/** A reviewer's note on the server's verdict for one claim ("explained in section 4"). */
export const checkNotes = pgTable(
  "check_notes",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    reviewId: uuid("review_id")
      .notNull()
      .references(() => reviews.id, { onDelete: "cascade" }),
    checkResultId: uuid("check_result_id")
      .notNull()
      .references(() => checkResults.id, { onDelete: "cascade" }),
    note: text("note").notNull(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("check_notes_review_check_key").on(t.reviewId, t.checkResultId)],
);

/** Where a review item points in the dossier text: character offsets plus the quoted text around it. */
export interface ReviewItemAnchor {
  from: number;
  to: number;
  quote: string;
  prefix: string;
  suffix: string;
}

export const reviewItems = pgTable(
  "review_items",
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
    authorId: uuid("author_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    severity: text("severity", { enum: ["major", "minor", "comment"] }).notNull(),
    title: text("title").notNull(),
    body: text("body").notNull(),
    anchor: jsonb("anchor").$type<ReviewItemAnchor>().notNull(),
    status: text("status", { enum: ["open", "resolved"] })
      .notNull()
      .default("open"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("review_items_version_idx").on(t.versionId), index("review_items_version_status_idx").on(t.versionId, t.status, t.severity)],
);

export const reviewItemReplies = pgTable(
  "review_item_replies",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    reviewItemId: uuid("review_item_id")
      .notNull()
      .references(() => reviewItems.id, { onDelete: "cascade" }),
    authorId: uuid("author_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    body: text("body").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("review_item_replies_item_idx").on(t.reviewItemId)],
);
