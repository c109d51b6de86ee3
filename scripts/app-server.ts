// Builds (when sources changed) and serves the app for a profile, detached, with a pid file.
// Used by the test global setup; the demo runs `next start` in the foreground instead.
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { portAnswers } from "./services";
import { appEnvironment, serviceConfig, type Profile } from "./service-config";

const log = (message: string) => process.stderr.write(`[app] ${message}\n`);

const SOURCE_DIRS = ["app", "components", "lib", "db", "storage"];
const SOURCE_FILES = ["next.config.ts", "tailwind.config.ts", "postcss.config.mjs", "proxy.ts", "package.json", "tsconfig.json"];

function newestSourceTime(root: string): number {
  let newest = 0;
  const visit = (p: string) => {
    const stat = fs.statSync(p, { throwIfNoEntry: false });
    if (!stat) return;
    if (stat.isDirectory()) {
      for (const entry of fs.readdirSync(p)) if (entry !== "node_modules" && !entry.startsWith(".")) visit(path.join(p, entry));
    } else if (!/\.test\.tsx?$/.test(p)) newest = Math.max(newest, stat.mtimeMs);
  };
  for (const d of SOURCE_DIRS) visit(path.join(root, d));
  for (const f of SOURCE_FILES) visit(path.join(root, f));
  return newest;
}

/** The test profile builds into its own folder (overridable so engineers working side by side don't share one). */
export function distDirFor(profile: Profile): string {
  return profile === "test" ? (process.env.VISVIVA_TEST_DIST_DIR ?? ".next-test") : ".next";
}

function pidFileFor(profile: Profile): string {
  const config = serviceConfig(profile);
  return path.join(config.runDir, `app-${config.app.port}.pid`);
}

function pidAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

export function stopApp(profile: Profile): void {
  const config = serviceConfig(profile);
  const pidFile = pidFileFor(profile);
  const pid = Number(fs.existsSync(pidFile) ? fs.readFileSync(pidFile, "utf8") : 0);
  if (pid && pidAlive(pid)) {
    try {
      process.kill(-pid, "SIGTERM");
    } catch {
      process.kill(pid, "SIGTERM");
    }
    log(`app on port ${config.app.port} stopped`);
  }
  fs.rmSync(pidFile, { force: true });
}

/** Builds if needed, then starts the app unless an up-to-date one already answers. Returns its URL. */
export async function ensureApp(profile: Profile, extraEnv: Record<string, string> = {}): Promise<string> {
  const config = serviceConfig(profile);
  const root = config.root;
  const distDir = distDirFor(profile);
  const env = { ...process.env, ...appEnvironment(config), ...extraEnv, NEXT_DIST_DIR: distDir, NODE_ENV: "production" } as NodeJS.ProcessEnv;
  const buildId = path.join(root, distDir, "BUILD_ID");
  const builtAt = fs.statSync(buildId, { throwIfNoEntry: false })?.mtimeMs ?? 0;
  const stale = builtAt < newestSourceTime(root);
  const pidFile = pidFileFor(profile);
  const url = `http://127.0.0.1:${config.app.port}`;

  if (!stale && (await portAnswers(config.app.port))) {
    const pid = Number(fs.existsSync(pidFile) ? fs.readFileSync(pidFile, "utf8") : 0);
    if (pid && pidAlive(pid)) return url;
    throw new Error(`port ${config.app.port} (app) is already in use by another program: set ${config.app.portVariable} to a free port.`);
  }
  stopApp(profile);
  if (stale) {
    log(`building into ${distDir} (takes a minute or two)...`);
    const build = spawnSync(process.execPath, [require.resolve("next/dist/bin/next"), "build"], {
      cwd: root,
      env,
      stdio: ["ignore", "pipe", "pipe"],
      encoding: "utf8",
    });
    if (build.status !== 0) throw new Error(`next build failed:\n${(build.stdout + build.stderr).slice(-4000)}`);
    log("build done");
  }
  if (await portAnswers(config.app.port)) {
    throw new Error(`port ${config.app.port} (app) is already in use by another program: set ${config.app.portVariable} to a free port.`);
  }
  fs.mkdirSync(config.logDir, { recursive: true });
  fs.mkdirSync(config.runDir, { recursive: true });
  const logFile = path.join(config.logDir, `app-${config.app.port}.log`);
  const out = fs.openSync(logFile, "a");
  const child = spawn(
    process.execPath,
    [
      "--require",
      path.join(root, "scripts", "peer-address.cjs"),
      require.resolve("next/dist/bin/next"),
      "start",
      "--hostname",
      "127.0.0.1",
      "--port",
      String(config.app.port),
    ],
    {
      cwd: root,
      env,
      detached: true,
      stdio: ["ignore", out, out],
    },
  );
  child.unref();
  fs.writeFileSync(pidFile, String(child.pid));
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline) {
    if (await portAnswers(config.app.port)) {
      log(`app on ${url} (log: ${logFile})`);
      return url;
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`the app did not start on ${url}; see its log: ${logFile}`);
}
