// Runs every vitest project against the test profile's services and a production build of
// the app, then prints one closing line "N passed, N failed, N skipped" and stops what it
// started. Extra arguments go to vitest (e.g. a file path).
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { runMigrations } from "../db/migrate";
import { ensureApp, stopApp } from "./app-server";
import { appEnvironment, serviceConfig } from "./service-config";
import { startServices, stopServices } from "./services";

const log = (message: string) => process.stderr.write(`[test] ${message}\n`);

interface VitestJson {
  numPassedTests: number;
  numFailedTests: number;
  numPendingTests: number;
  numTodoTests: number;
  numTotalTests: number;
  success: boolean;
}

async function main(): Promise<number> {
  const config = serviceConfig("test");
  const started = Date.now();
  let code = 1;
  try {
    log("checking formatting (prettier --check)...");
    const format = spawnSync(
      process.execPath,
      [path.join(__dirname, "..", "node_modules", "prettier", "bin", "prettier.cjs"), "--check", "--log-level", "warn", "."],
      { encoding: "utf8" },
    );
    if (format.status !== 0) {
      process.stdout.write(format.stdout + format.stderr);
      throw new Error("files not formatted (above): run `npx prettier --write .`");
    }
    log("linting (eslint, any finding fails)...");
    const lint = spawnSync(process.execPath, [path.join(__dirname, "..", "node_modules", "eslint", "bin", "eslint.js"), "--max-warnings", "0", "."], {
      encoding: "utf8",
    });
    if (lint.status !== 0) {
      process.stdout.write(lint.stdout + lint.stderr);
      throw new Error("lint findings (above): fix them first");
    }
    log("type-checking the whole project (tsc --noEmit)...");
    const typecheck = spawnSync(process.execPath, [require.resolve("typescript/bin/tsc"), "--noEmit", "-p", "tsconfig.json"], { encoding: "utf8" });
    if (typecheck.status !== 0) {
      process.stdout.write(typecheck.stdout + typecheck.stderr);
      throw new Error("type errors (above): fix them first");
    }
    const environment = await startServices("test");
    await runMigrations(environment.DATABASE_URL!);
    log("migrations applied");
    const url = await ensureApp("test");
    const reportFile = path.join(config.dataDir, "vitest-report.json");
    fs.rmSync(reportFile, { force: true });
    code = await new Promise<number>((resolve) => {
      const child = spawn(
        process.execPath,
        [
          path.join(__dirname, "..", "node_modules", "vitest", "vitest.mjs"),
          "run",
          "--reporter=default",
          "--reporter=json",
          `--outputFile.json=${reportFile}`,
          ...process.argv.slice(2),
        ],
        { stdio: "inherit", env: { ...process.env, ...appEnvironment(config), VISVIVA_TEST_BASE_URL: url } },
      );
      child.on("exit", (status, signal) => resolve(status ?? (signal ? 1 : 0)));
    });
    if (fs.existsSync(reportFile)) {
      const report = JSON.parse(fs.readFileSync(reportFile, "utf8")) as VitestJson;
      const skipped = report.numPendingTests + report.numTodoTests;
      log(`finished in ${Math.round((Date.now() - started) / 1000)} s`);
      process.stdout.write(`\n${report.numPassedTests} passed, ${report.numFailedTests} failed${skipped ? `, ${skipped} skipped` : ""}\n`);
      if (report.numTotalTests === 0) code = 1;
    } else {
      log("vitest wrote no report");
      if (code === 0) code = 1;
    }
  } catch (error) {
    log(error instanceof Error ? error.message : String(error));
    code = 1;
  } finally {
    stopApp("test");
    stopServices("test");
  }
  return code;
}

main().then((code) => process.exit(code));
