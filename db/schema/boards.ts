import { sql } from "drizzle-orm";
import { boolean, index, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { boardRoles } from "../vocabulary";
import { users } from "./accounts";

export { boardRoles, type BoardRole } from "../vocabulary";

export const boards = pgTable(
  "boards",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    slug: text("slug").notNull(),
    name: text("name").notNull(),
    description: text("description").notNull().default(""),
    /** Proposers may register themselves on this board. */
    openRegistration: boolean("open_registration").notNull().default(false),
    /** Hide proposers' names from reviewers (reviewers are always hidden from proposers). */
    hideProposerNames: boolean("hide_proposer_names").notNull().default(false),
    /** Reviewers may read every submitted version of a proposal they review, not only the versions assigned to them. */
    reviewersSeeAllVersions: boolean("reviewers_see_all_versions").notNull().default(false),
    /** Reviewers of one proposal see each other's review items once they submitted their own. */
    shareReviewItemsAfterSubmit: boolean("share_review_items_after_submit").notNull().default(true),
    /** Tiptap JSON of the decision letter template, with merge fields. */
    letterTemplate: jsonb("letter_template").$type<Record<string, unknown> | null>(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("boards_slug_key").on(t.slug)],
);

export const boardMembers = pgTable(
  "board_members",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    role: text("role", { enum: boardRoles }).notNull(),
    status: text("status", { enum: ["active", "deactivated"] })
      .notNull()
      .default("active"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("board_members_board_user_key").on(t.boardId, t.userId), index("board_members_user_idx").on(t.userId)],
);

export const invitations = pgTable(
  "invitations",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    name: text("name"),
    role: text("role", { enum: boardRoles }).notNull(),
    tokenHash: text("token_hash").notNull(),
    invitedBy: uuid("invited_by").references(() => users.id, { onDelete: "set null" }),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    acceptedAt: timestamp("accepted_at", { withTimezone: true }),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("invitations_token_key").on(t.tokenHash), index("invitations_board_email_idx").on(t.boardId, sql`lower(${t.email})`)],
);
