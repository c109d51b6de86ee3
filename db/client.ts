import "server-only";
import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import { env } from "@/lib/env";
import * as schema from "./schema";

export type Database = NodePgDatabase<typeof schema>;
export type Transaction = Parameters<Parameters<Database["transaction"]>[0]>[0];

const globalForDb = globalThis as unknown as { visvivaPool?: Pool; visvivaDb?: Database };

export function pool(): Pool {
  if (!globalForDb.visvivaPool) {
    globalForDb.visvivaPool = new Pool({ connectionString: env().DATABASE_URL, max: 10 });
    // An idle connection dropped by the server (a database restart) is an 'error' event on
    // the pool; unhandled it would end the process. The pool discards it and reconnects.
    globalForDb.visvivaPool.on("error", (error) => console.error("[db] idle connection lost:", error.message));
  }
  return globalForDb.visvivaPool;
}

/** The one Drizzle handle of this process (cached on globalThis so dev reloads reuse the pool). */
export function db(): Database {
  globalForDb.visvivaDb ??= drizzle(pool(), { schema, casing: "snake_case" });
  return globalForDb.visvivaDb;
}
