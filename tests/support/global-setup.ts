// Starts the test profile's real services (PostgreSQL, S3 store, mail catcher) and applies
// the migrations. Idempotent: what already runs is reused, so one file can be run alone
// (`npx vitest run path/to.test.ts`). Tests that speak HTTP to the app call `await appUrl()`
// (tests/support/app.ts) in beforeAll, which builds and serves it when needed. `npm test`
// stops everything at the end (or `npx tsx scripts/services.ts stop test`).
import fs from "node:fs";
import path from "node:path";
import { runMigrations } from "../../db/migrate";
import { appEnvironment, serviceConfig } from "../../scripts/service-config";
import { startServices } from "../../scripts/services";

export async function withLock<T>(file: string, work: () => Promise<T>): Promise<T> {
  const deadline = Date.now() + 15 * 60_000;
  for (;;) {
    try {
      fs.mkdirSync(file);
      break;
    } catch {
      // A lock left by a run that was killed is taken over after ten minutes.
      const age = Date.now() - (fs.statSync(file, { throwIfNoEntry: false })?.mtimeMs ?? Date.now());
      if (age > 10 * 60_000) fs.rmSync(file, { recursive: true, force: true });
      if (Date.now() > deadline) throw new Error(`timed out waiting for ${file}`);
      await new Promise((r) => setTimeout(r, 500));
    }
  }
  try {
    return await work();
  } finally {
    fs.rmSync(file, { recursive: true, force: true });
  }
}

export default async function setup(): Promise<void> {
  const config = serviceConfig("test");
  fs.mkdirSync(config.runDir, { recursive: true });
  const env = await withLock(path.join(config.runDir, "setup.lock"), async () => {
    const environment = await startServices("test");
    await runMigrations(environment.DATABASE_URL!);
    return environment;
  });
  Object.assign(process.env, env, appEnvironment(config));
}
