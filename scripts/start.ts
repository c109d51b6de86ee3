// Production start: refuses to start with required variables missing (and lists them),
// applies migrations, then serves the built app. No demo data is ever loaded here.
import { spawn } from "node:child_process";
import path from "node:path";
import { runMigrations } from "../db/migrate";
import { EnvironmentError, parseEnv } from "../lib/env";

async function main() {
  const env = parseEnv(process.env);
  if (env.VISVIVA_MODE !== "production") process.stderr.write(`[start] note: VISVIVA_MODE=${env.VISVIVA_MODE}\n`);
  await runMigrations(env.DATABASE_URL);
  const port = process.env.PORT ?? "3000";
  const host = process.env.HOSTNAME ?? "0.0.0.0";
  const app = spawn(
    process.execPath,
    ["--require", path.join(__dirname, "peer-address.cjs"), require.resolve("next/dist/bin/next"), "start", "--hostname", host, "--port", port],
    {
      stdio: "inherit",
      env: { ...process.env, NODE_ENV: "production" },
    },
  );
  for (const signal of ["SIGINT", "SIGTERM"] as const) process.on(signal, () => app.kill(signal));
  app.on("exit", (code) => process.exit(code ?? 0));
}

main().catch((error) => {
  process.stderr.write(`${error instanceof EnvironmentError ? error.message : String(error?.stack ?? error)}\n`);
  process.exit(1);
});
