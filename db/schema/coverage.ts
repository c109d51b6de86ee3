import { doublePrecision, index, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { boards } from "./boards";

/** Ground stations a board's chair keeps; contact checks in dossiers pick from them. */
export const groundStations = pgTable(
  "ground_stations",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    boardId: uuid("board_id")
      .notNull()
      .references(() => boards.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    /** deg, north positive. */
    latitude: doublePrecision("latitude").notNull(),
    /** deg, east positive. */
    longitude: doublePrecision("longitude").notNull(),
    /** km above the reference sphere. */
    altitude: doublePrecision("altitude").notNull().default(0),
    /** deg above the horizon. */
    minimumElevation: doublePrecision("minimum_elevation").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("ground_stations_board_name_key").on(t.boardId, t.name), index("ground_stations_board_idx").on(t.boardId)],
);
