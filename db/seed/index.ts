// The demo seed: invented data for the demo profile only. Run by `npm run demo` (through
// scripts/demo.ts) or `npm run db:seed`. It refuses to run unless VISVIVA_MODE is "demo",
// so it can never create the publicly documented demo accounts in production.
// Parts: accounts.ts (the board and one account per role), people.ts (the rest of the
// cast), scenario.ts (calls, dossiers, reviews and decisions through the data-access layer).
import type { Database } from "@/db/client";
import { DEMO_ACCOUNTS, DEMO_BOARD, seedDemoAccounts, type SeedBoard, type SeededAccounts } from "./accounts";
import type { ScenarioResult } from "./scenario";

export interface DemoSeed {
  accounts: SeededAccounts;
  scenario: ScenarioResult;
}

export interface DemoSeedOptions {
  /** The profile the seed runs in; the process's VISVIVA_MODE unless given (tests pass "demo"). */
  mode?: string;
  /** Another board than the documented one (tests seed a fresh board each run). */
  board?: SeedBoard;
  log?: (message: string) => void;
}

export function assertDemoMode(mode: string | undefined): void {
  if (mode !== "demo") {
    throw new Error(`The demo seed only runs with VISVIVA_MODE=demo (here: ${mode ?? "unset"}); it never runs in production.`);
  }
}

export async function seedDemo(database: Database, options: DemoSeedOptions = {}): Promise<DemoSeed> {
  assertDemoMode("mode" in options ? options.mode : process.env.VISVIVA_MODE);
  const board = options.board ?? DEMO_BOARD;
  const accounts = await seedDemoAccounts(database, board);
  // Loaded here, not at the top: the scenario reaches the data-access layer (which marks
  // itself server-only), and the guard above must run before any of it is loaded.
  const { seedScenario } = await import("./scenario");
  const scenario = await seedScenario(database, { board, log: options.log });
  return { accounts, scenario };
}

async function main() {
  assertDemoMode(process.env.VISVIVA_MODE);
  if (!process.env.DATABASE_URL) throw new Error("The demo seed needs DATABASE_URL.");
  // Outside Next.js the "server-only" marker throws on import; map it to an empty module.
  // eslint-disable-next-line @typescript-eslint/no-require-imports
  require("./server-only-shim.cjs");
  const { db, pool } = await import("@/db/client");
  try {
    const result = await seedDemo(db(), { log: (m) => process.stderr.write(`[seed] ${m}\n`) });
    process.stderr.write(
      result.scenario.skipped
        ? "[seed] demo board already seeded; nothing to do\n"
        : `[seed] demo board ready: ${Object.keys(result.scenario.proposals).length} proposals, ${result.scenario.reviewItems} review items, ${Object.keys(result.scenario.decisions).length} decisions\n`,
    );
    process.stderr.write(`[seed] accounts: ${DEMO_ACCOUNTS.map((a) => a.email).join(", ")} (see README.md for the whole cast)\n`);
  } finally {
    await pool().end();
  }
}

if (require.main === module) {
  main().catch((error) => {
    process.stderr.write(`[seed] ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
    process.exit(1);
  });
}
