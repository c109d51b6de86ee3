import "server-only";
import { sql } from "drizzle-orm";
import { db } from "@/db/client";

/** One round trip to PostgreSQL (the health check's probe). */
export async function pingDatabase(): Promise<void> {
  await db().execute(sql`select 1`);
}
