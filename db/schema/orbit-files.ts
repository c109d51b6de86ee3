import { index, integer, jsonb, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { boards } from "./boards";
import { attachments } from "./proposals";

/**
 * What the server read from a text attachment that is an orbit file (two-line element sets,
 * CCSDS OPM/OMM/OEM), parsed when the upload is confirmed. `unparsed` keeps the first
 * problem with its line; the attachment itself stays either way.
 */
export const attachmentOrbitFiles = pgTable(
  "attachment_orbit_files",
  {
    attachmentId: uuid("attachment_id")
      .primaryKey()
      .references(() => attachments.id, { onDelete: "cascade" }),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    /** The SHA-256 of the bytes that were parsed (the attachment's). */
    sha256: text("sha256").notNull(),
    status: text("status", { enum: ["parsed", "unparsed"] }).notNull(),
    /** tle | opm | omm | oem, when recognised. */
    format: text("format"),
    /** The parsed file (lib/orbit-files OrbitFile) when parsed. */
    parsed: jsonb("parsed").$type<Record<string, unknown>>(),
    /** Derived summaries (lib/orbit-files OrbitSummary[]) when parsed. */
    summaries: jsonb("summaries").$type<Record<string, unknown>[]>(),
    errorLine: integer("error_line"),
    error: text("error"),
    parsedAt: timestamp("parsed_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("attachment_orbit_files_board_idx").on(t.boardId)],
);
