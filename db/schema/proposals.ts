import { bigint, index, integer, jsonb, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { users } from "./accounts";
import { boards } from "./boards";
import type { RequirementOutcome } from "../../lib/requirements/types";
import { checkStatuses, proposalStatuses } from "../vocabulary";

/** The tolerance a call applies when the server recomputes orbit claims (contract units). */
export interface TolerancePolicy {
  relative: number;
  absolute?: Partial<Record<"km" | "km/s" | "deg" | "s" | "kg" | "deg/day", number>>;
}

/** Absolute bounds per unit for file-against-text comparisons (lib/orbit-files/tolerance.ts). */
export interface FileTolerancePolicy {
  km: number;
  deg: number;
  "1": number;
  s: number;
}

/** A review round of a board. */
export const calls = pgTable(
  "calls",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    title: text("title").notNull(),
    description: text("description").notNull().default(""),
    opensAt: timestamp("opens_at", { withTimezone: true }).notNull(),
    closesAt: timestamp("closes_at", { withTimezone: true }).notNull(),
    tolerance: jsonb("tolerance").$type<TolerancePolicy>().notNull().default({ relative: 0.01 }),
    /**
     * Per-unit bounds for comparing attached orbit files with the text (km, deg, "1" for
     * eccentricity, s); null means the product's defaults (DEFAULT_FILE_TOLERANCE). Its own
     * column: calls.tolerance is parsed strictly by the engine.
     */
    fileTolerance: jsonb("file_tolerance").$type<FileTolerancePolicy>(),
    /** Headings (level 2) a dossier must contain before it can be submitted. */
    requiredSections: jsonb("required_sections").$type<string[]>().notNull().default([]),
    reviewersPerProposal: integer("reviewers_per_proposal").notNull().default(2),
    /** The rubric template version reviews of this call use (see rubric_templates). */
    rubricTemplateId: uuid("rubric_template_id"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("calls_board_idx").on(t.boardId)],
);

export { checkStatuses, proposalStatuses, type CheckStatus, type ProposalStatus } from "../vocabulary";

export const proposals = pgTable(
  "proposals",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    callId: uuid("call_id")
      .notNull()
      .references(() => calls.id, { onDelete: "cascade" }),
    ownerId: uuid("owner_id")
      .notNull()
      .references(() => users.id),
    title: text("title").notNull(),
    missionType: text("mission_type").notNull().default(""),
    status: text("status", { enum: proposalStatuses }).notNull().default("draft"),
    /** Number of the latest submitted version; 0 while never submitted. */
    latestVersion: integer("latest_version").notNull().default(0),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("proposals_board_idx").on(t.boardId),
    index("proposals_call_idx").on(t.callId),
    index("proposals_owner_idx").on(t.ownerId),
    // One per sort the list offers (with the id tie-break), so a page is an index range, not a scan and sort.
    index("proposals_board_updated_idx").on(t.boardId, t.updatedAt, t.id),
    index("proposals_board_created_idx").on(t.boardId, t.createdAt, t.id),
    index("proposals_board_title_idx").on(t.boardId, t.title, t.id),
    index("proposals_board_status_idx").on(t.boardId, t.status, t.id),
    index("proposals_board_version_idx").on(t.boardId, t.latestVersion, t.id),
    index("proposals_board_call_updated_idx").on(t.boardId, t.callId, t.updatedAt, t.id),
  ],
);

export const proposalCoauthors = pgTable(
  "proposal_coauthors",
  {
    proposalId: uuid("proposal_id")
      .notNull()
      .references(() => proposals.id, { onDelete: "cascade" }),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
  },
  (t) => [primaryKey({ columns: [t.proposalId, t.userId] })],
);

/** The working draft: one per proposal, saved with optimistic concurrency on `revision`. */
export const proposalDrafts = pgTable("proposal_drafts", {
  proposalId: uuid("proposal_id")
    .primaryKey()
    .references(() => proposals.id, { onDelete: "cascade" }),
  document: jsonb("document").$type<Record<string, unknown>>().notNull(),
  revision: integer("revision").notNull().default(1),
  /** The submitted version this draft continues from (0 for a first draft). */
  basedOnVersion: integer("based_on_version").notNull().default(0),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  updatedBy: uuid("updated_by").references(() => users.id, { onDelete: "set null" }),
});

export interface VersionAttachment {
  attachmentId: string;
  filename: string;
  contentType: string;
  size: number;
  sha256: string;
}

/** An immutable snapshot made at submission. */
export const proposalVersions = pgTable(
  "proposal_versions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    proposalId: uuid("proposal_id")
      .notNull()
      .references(() => proposals.id, { onDelete: "cascade" }),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    number: integer("number").notNull(),
    title: text("title").notNull(),
    document: jsonb("document").$type<Record<string, unknown>>().notNull(),
    documentKey: text("document_key").notNull(),
    htmlKey: text("html_key").notNull(),
    attachments: jsonb("attachments").$type<VersionAttachment[]>().notNull().default([]),
    submittedBy: uuid("submitted_by").references(() => users.id, { onDelete: "set null" }),
    submittedAt: timestamp("submitted_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("proposal_versions_number_key").on(t.proposalId, t.number), index("proposal_versions_board_idx").on(t.boardId)],
);

/** The server's own recomputation of one orbit-check block of a submitted version. */
export const checkResults = pgTable(
  "check_results",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    versionId: uuid("version_id")
      .notNull()
      .references(() => proposalVersions.id, { onDelete: "cascade" }),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    blockId: text("block_id").notNull(),
    label: text("label").notNull().default(""),
    kind: text("kind").notNull(),
    status: text("status", { enum: checkStatuses }).notNull(),
    claim: jsonb("claim").$type<Record<string, unknown>>().notNull(),
    result: jsonb("result").$type<Record<string, unknown>>().notNull(),
    /** The call's requirements judged on this claim at submission (met / not met / not evaluated). */
    requirements: jsonb("requirements").$type<RequirementOutcome[]>().notNull().default([]),
    /** The orbit-check contract version whose rules produced this result (1 for results stored before version 2). */
    contractVersion: integer("contract_version").notNull().default(1),
    /** The call's tolerance policy applied at submission (null for results stored before it was recorded). */
    tolerance: jsonb("tolerance").$type<TolerancePolicy>(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("check_results_version_block_key").on(t.versionId, t.blockId), index("check_results_version_status_idx").on(t.versionId, t.status)],
);

export const attachments = pgTable(
  "attachments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    proposalId: uuid("proposal_id")
      .notNull()
      .references(() => proposals.id, { onDelete: "cascade" }),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    objectKey: text("object_key").notNull(),
    filename: text("filename").notNull(),
    declaredType: text("declared_type").notNull(),
    detectedType: text("detected_type"),
    declaredSize: bigint("declared_size", { mode: "number" }).notNull(),
    size: bigint("size", { mode: "number" }),
    sha256: text("sha256"),
    status: text("status", { enum: ["pending", "confirmed", "removed"] })
      .notNull()
      .default("pending"),
    uploadedBy: uuid("uploaded_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    confirmedAt: timestamp("confirmed_at", { withTimezone: true }),
  },
  (t) => [uniqueIndex("attachments_object_key").on(t.objectKey), index("attachments_proposal_idx").on(t.proposalId)],
);

/**
 * A requirement a call sets on every dossier (lib/requirements: the type names its
 * parameters and how claims are judged). Parameters are stored as validated at creation.
 */
export const callRequirements = pgTable(
  "call_requirements",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    callId: uuid("call_id")
      .notNull()
      .references(() => calls.id, { onDelete: "cascade" }),
    type: text("type").notNull(),
    params: jsonb("params").$type<Record<string, unknown>>().notNull(),
    rationale: text("rationale").notNull().default(""),
    createdBy: uuid("created_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("call_requirements_call_idx").on(t.callId)],
);
