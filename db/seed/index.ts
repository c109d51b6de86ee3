// The demo seed: invented data for the demo profile only. Run by `npm run demo` (through
// scripts/demo.ts) or `npm run db:seed`. It refuses to run unless VISVIVA_MODE is "demo",
// so it can never create the publicly documented demo accounts in production.
// Each part exports its own seeding function and the ids it made, so later parts (calls,
// dossiers, reviews) can build on them.
import { drizzle } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import * as schema from "@/db/schema";
import type { Database } from "@/db/client";
import { DEMO_ACCOUNTS, seedDemoAccounts, type SeededAccounts } from "./accounts";

export interface DemoSeed {
  accounts: SeededAccounts;
}

export async function seedDemo(db: Database): Promise<DemoSeed> {
  const accounts = await seedDemoAccounts(db);
  return { accounts };
}

export function assertDemoMode(mode: string | undefined): void {
  if (mode !== "demo") {
    throw new Error(`The demo seed only runs with VISVIVA_MODE=demo (here: ${mode ?? "unset"}); it never runs in production.`);
  }
}

async function main() {
  assertDemoMode(process.env.VISVIVA_MODE);
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("The demo seed needs DATABASE_URL.");
  const pool = new Pool({ connectionString: url, max: 2 });
  try {
    const db = drizzle(pool, { schema, casing: "snake_case" }) as unknown as Database;
    await seedDemo(db);
    process.stderr.write(`[seed] demo board and accounts ready: ${DEMO_ACCOUNTS.map((a) => a.email).join(", ")}\n`);
  } finally {
    await pool.end();
  }
}

if (require.main === module) {
  main().catch((error) => {
    process.stderr.write(`[seed] ${error instanceof Error ? error.message : String(error)}\n`);
    process.exit(1);
  });
}
