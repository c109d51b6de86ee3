// The demo: local services, migrations, the invented demo board, a production build, and
// the app in the foreground at http://127.0.0.1:3000. Re-running reuses running services
// and never wipes data; the demo seed is idempotent.
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { runMigrations } from "../db/migrate";
import { appEnvironment, serviceConfig } from "./service-config";
import { portAnswers, ServiceError, startServices } from "./services";

const log = (message: string) => process.stderr.write(`[demo] ${message}\n`);

async function main() {
  const config = serviceConfig("demo");
  if (await portAnswers(config.app.port)) {
    throw new ServiceError(`port ${config.app.port} (the app) is already in use: stop what runs there, or set ${config.app.portVariable} to a free port.`);
  }
  const environment = await startServices("demo");
  await runMigrations(environment.DATABASE_URL!);
  log("migrations applied");
  const env = { ...process.env, ...appEnvironment(config) } as NodeJS.ProcessEnv;

  const seed = spawnSync(process.execPath, [require.resolve("tsx/cli"), path.join(config.root, "db", "seed", "index.ts")], {
    cwd: config.root,
    env,
    stdio: "inherit",
  });
  if (seed.status !== 0) throw new ServiceError("loading the demo data failed (see above)");

  log("building the app (a minute or two on first start)...");
  const nextBin = require.resolve("next/dist/bin/next");
  const build = spawnSync(process.execPath, [nextBin, "build"], {
    cwd: config.root,
    env: { ...env, NEXT_DIST_DIR: ".next" },
    stdio: ["ignore", "inherit", "inherit"],
  });
  if (build.status !== 0) throw new ServiceError("next build failed (see above)");

  const logFile = path.join(config.logDir, "app.log");
  fs.mkdirSync(config.logDir, { recursive: true });
  log(`serving http://127.0.0.1:${config.app.port} — demo accounts are listed in README.md; Ctrl-C stops the app`);
  const app = spawn(
    process.execPath,
    ["--require", path.join(config.root, "scripts", "peer-address.cjs"), nextBin, "start", "--hostname", "127.0.0.1", "--port", String(config.app.port)],
    {
      cwd: config.root,
      env: { ...env, NEXT_DIST_DIR: ".next", NODE_ENV: "production" },
      stdio: "inherit",
    },
  );
  for (const signal of ["SIGINT", "SIGTERM"] as const) process.on(signal, () => app.kill(signal));
  app.on("exit", (code) => {
    log(`app stopped; services keep running (stop them with: npm run demo:stop). App log: ${logFile}`);
    process.exit(code ?? 0);
  });
}

main().catch((error) => {
  log(error instanceof ServiceError ? error.message : String(error?.stack ?? error));
  process.exit(1);
});
