// Starts, stops and reports the local stand-ins (PostgreSQL, S3 store, mail catcher) for
// one profile. Idempotent: a running service is reused and no data folder is ever wiped.
//   tsx scripts/services.ts start|stop|status|env [demo|test]
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import crypto from "node:crypto";
import { Client } from "pg";
import { appEnvironment, serviceConfig, type Profile, type ServiceConfig } from "./service-config";

const log = (message: string) => process.stderr.write(`[services] ${message}\n`);

export class ServiceError extends Error {}

function isRoot(): boolean {
  return typeof process.getuid === "function" && process.getuid() === 0;
}

export function portAnswers(port: number, host = "127.0.0.1", timeoutMs = 500): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host });
    const done = (answer: boolean) => {
      socket.destroy();
      resolve(answer);
    };
    socket.setTimeout(timeoutMs, () => done(false));
    socket.once("connect", () => done(true));
    socket.once("error", () => done(false));
  });
}

async function waitForPort(port: number, timeoutMs: number): Promise<boolean> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (await portAnswers(port)) return true;
    await new Promise((r) => setTimeout(r, 200));
  }
  return false;
}

function pidAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

function readPid(file: string): number | null {
  try {
    const pid = Number(fs.readFileSync(file, "utf8").trim().split("\n")[0]);
    return Number.isInteger(pid) && pid > 0 ? pid : null;
  } catch {
    return null;
  }
}

function run(command: string, args: string[], options: { asUser?: string; env?: NodeJS.ProcessEnv } = {}) {
  const [cmd, argv] = options.asUser ? ["runuser", ["-u", options.asUser, "--", command, ...args]] : [command, args];
  const result = spawnSync(cmd, argv, { encoding: "utf8", env: options.env ?? process.env });
  return { ok: result.status === 0, output: `${result.stdout ?? ""}${result.stderr ?? ""}` };
}

// ---------------------------------------------------------------- PostgreSQL

const PG_SERVICE_USER = "visviva-pg";

function findPostgresBin(): string | null {
  const base = "/usr/lib/postgresql";
  if (!fs.existsSync(base)) return null;
  const versions = fs
    .readdirSync(base)
    .filter((v) => fs.existsSync(path.join(base, v, "bin", "initdb")))
    .sort((a, b) => Number(b) - Number(a));
  return versions[0] ? path.join(base, versions[0], "bin") : null;
}

function ensurePostgresInstalled(): string {
  let bin = findPostgresBin();
  if (bin) return bin;
  if (!isRoot()) {
    throw new ServiceError("PostgreSQL server binaries are missing: run `sudo apt-get install -y postgresql` and start again.");
  }
  log("installing PostgreSQL from Debian packages (apt-get install postgresql)...");
  run("apt-get", ["update", "-qq"]);
  const install = run("apt-get", ["install", "-y", "-qq", "postgresql"], {
    env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" },
  });
  bin = findPostgresBin();
  if (!install.ok || !bin) throw new ServiceError(`apt-get install postgresql failed:\n${install.output.slice(-2000)}`);
  return bin;
}

function ensureServiceUser(): void {
  if (run("id", ["-u", PG_SERVICE_USER]).ok) return;
  const made = run("useradd", ["--system", "--no-create-home", "--shell", "/usr/sbin/nologin", PG_SERVICE_USER]);
  if (!made.ok) throw new ServiceError(`could not create the unprivileged user ${PG_SERVICE_USER}: ${made.output}`);
}

/** Where the cluster lives: under the project, unless the unprivileged user cannot reach it. */
function postgresHome(config: ServiceConfig): string {
  const inProject = path.join(config.dataDir, "pg");
  if (!isRoot()) return inProject;
  fs.mkdirSync(inProject, { recursive: true });
  if (run("test", ["-x", inProject], { asUser: PG_SERVICE_USER }).ok) return inProject;
  const hash = crypto.createHash("sha1").update(config.root).digest("hex").slice(0, 10);
  const fallback = path.join("/var/tmp", `visviva-${config.profile}-${hash}`, "pg");
  log(`${inProject} is not reachable by ${PG_SERVICE_USER}; keeping the cluster in ${fallback}`);
  return fallback;
}

async function startPostgres(config: ServiceConfig): Promise<void> {
  const { port, portVariable, database, user, password } = config.postgres;
  const bin = ensurePostgresInstalled();
  if (isRoot()) ensureServiceUser();
  const home = postgresHome(config);
  const dataDir = path.join(home, "data");
  const logFile = path.join(home, "server.log");
  const superPasswordFile = path.join(home, "superuser-password");
  fs.mkdirSync(home, { recursive: true });
  const asUser = isRoot() ? PG_SERVICE_USER : undefined;
  if (asUser) run("chown", ["-R", `${PG_SERVICE_USER}:`, home]);

  if (!fs.existsSync(path.join(dataDir, "PG_VERSION"))) {
    const superPassword = crypto.randomBytes(18).toString("hex");
    fs.writeFileSync(superPasswordFile, superPassword, { mode: 0o600 });
    if (asUser) run("chown", [`${PG_SERVICE_USER}:`, superPasswordFile]);
    log(`initdb into ${dataDir}`);
    const init = run(
      path.join(bin, "initdb"),
      [
        "-D",
        dataDir,
        "-U",
        "postgres",
        "--auth-local=scram-sha-256",
        "--auth-host=scram-sha-256",
        `--pwfile=${superPasswordFile}`,
        "-E",
        "UTF8",
        "--locale=C.UTF-8",
      ],
      { asUser },
    );
    if (!init.ok) throw new ServiceError(`initdb failed:\n${init.output.slice(-2000)}`);
  }

  const running = run(path.join(bin, "pg_ctl"), ["-D", dataDir, "status"], { asUser }).ok;
  if (running && (await portAnswers(port))) {
    log(`PostgreSQL already running on 127.0.0.1:${port}`);
  } else {
    if (await portAnswers(port)) {
      throw new ServiceError(`port ${port} (PostgreSQL) is already in use by another program: set ${portVariable} to a free port.`);
    }
    const started = run(
      path.join(bin, "pg_ctl"),
      ["-D", dataDir, "-l", logFile, "-w", "-t", "60", "-o", `-c listen_addresses=127.0.0.1 -p ${port} -c unix_socket_directories=''`, "start"],
      { asUser },
    );
    if (!started.ok || !(await waitForPort(port, 30_000))) {
      throw new ServiceError(`PostgreSQL did not start on port ${port}; see its log: ${logFile}\n${started.output.slice(-1000)}`);
    }
    log(`PostgreSQL started on 127.0.0.1:${port} (log: ${logFile})`);
  }

  const superPassword = fs.readFileSync(superPasswordFile, "utf8").trim();
  const admin = new Client({ host: "127.0.0.1", port, user: "postgres", password: superPassword, database: "postgres" });
  await admin.connect();
  try {
    const role = await admin.query("select 1 from pg_roles where rolname = $1", [user]);
    if (role.rowCount === 0) {
      await admin.query(`create role "${user}" login password '${password}'`);
    }
    const db = await admin.query("select 1 from pg_database where datname = $1", [database]);
    if (db.rowCount === 0) {
      await admin.query(`create database "${database}" owner "${user}"`);
      log(`database ${database} created`);
    }
  } finally {
    await admin.end();
  }
}

function stopPostgres(config: ServiceConfig): void {
  const bin = findPostgresBin();
  if (!bin) return;
  for (const home of [path.join(config.dataDir, "pg"), ...fallbackHomes(config)]) {
    const dataDir = path.join(home, "data");
    if (!fs.existsSync(path.join(dataDir, "postmaster.pid"))) continue;
    const asUser = isRoot() ? PG_SERVICE_USER : undefined;
    const stopped = run(path.join(bin, "pg_ctl"), ["-D", dataDir, "-m", "fast", "-w", "stop"], { asUser });
    log(stopped.ok ? "PostgreSQL stopped" : `PostgreSQL stop: ${stopped.output.trim()}`);
  }
}

function fallbackHomes(config: ServiceConfig): string[] {
  const hash = crypto.createHash("sha1").update(config.root).digest("hex").slice(0, 10);
  return [path.join("/var/tmp", `visviva-${config.profile}-${hash}`, "pg")];
}

// ------------------------------------------------- Node-based stand-ins (S3, mail)

interface NodeService {
  name: string;
  script: string;
  ports: { port: number; variable: string }[];
  env: Record<string, string>;
}

function nodeServices(config: ServiceConfig): NodeService[] {
  return [
    {
      name: "s3",
      script: path.join(config.root, "storage", "local-s3.ts"),
      ports: [{ port: config.s3.port, variable: config.s3.portVariable }],
      env: {
        LOCAL_S3_PORT: String(config.s3.port),
        LOCAL_S3_DIR: path.join(config.dataDir, "s3"),
        LOCAL_S3_BUCKET: config.s3.bucket,
      },
    },
    {
      name: "mail",
      script: path.join(config.root, "scripts", "mail-catcher.ts"),
      ports: [
        { port: config.smtp.port, variable: config.smtp.portVariable },
        { port: config.mailApi.port, variable: config.mailApi.portVariable },
      ],
      env: {
        MAIL_CATCHER_SMTP_PORT: String(config.smtp.port),
        MAIL_CATCHER_API_PORT: String(config.mailApi.port),
        MAIL_CATCHER_DIR: path.join(config.dataDir, "mail"),
      },
    },
  ];
}

async function startNodeService(config: ServiceConfig, service: NodeService): Promise<void> {
  const pidFile = path.join(config.runDir, `${service.name}.pid`);
  const logFile = path.join(config.logDir, `${service.name}.log`);
  const pid = readPid(pidFile);
  if (pid && pidAlive(pid)) {
    const answering = await Promise.all(service.ports.map((p) => portAnswers(p.port)));
    if (answering.every(Boolean)) {
      log(`${service.name} already running (pid ${pid})`);
      return;
    }
  }
  for (const { port, variable } of service.ports) {
    if (await portAnswers(port)) {
      throw new ServiceError(`port ${port} (${service.name}) is already in use by another program: set ${variable} to a free port.`);
    }
  }
  fs.mkdirSync(config.runDir, { recursive: true });
  fs.mkdirSync(config.logDir, { recursive: true });
  const out = fs.openSync(logFile, "a");
  const tsxCli = require.resolve("tsx/cli");
  const child = spawn(process.execPath, [tsxCli, service.script], {
    detached: true,
    stdio: ["ignore", out, out],
    env: { ...process.env, ...service.env },
    cwd: config.root,
  });
  child.unref();
  fs.writeFileSync(pidFile, String(child.pid));
  for (const { port } of service.ports) {
    if (!(await waitForPort(port, 30_000))) {
      throw new ServiceError(`${service.name} did not start on port ${port}; see its log: ${logFile}`);
    }
  }
  log(`${service.name} started (pid ${child.pid}, log: ${logFile})`);
}

function sleepSync(ms: number): void {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

/** Stops a stand-in and returns only once its process is gone, so its ports are free again. */
function stopNodeService(config: ServiceConfig, service: NodeService): void {
  const pidFile = path.join(config.runDir, `${service.name}.pid`);
  const pid = readPid(pidFile);
  if (pid && pidAlive(pid)) {
    const signal = (name: NodeJS.Signals) => {
      try {
        process.kill(-pid, name);
      } catch {
        try {
          process.kill(pid, name);
        } catch {
          // already gone
        }
      }
    };
    signal("SIGTERM");
    const deadline = Date.now() + 5_000;
    while (pidAlive(pid) && Date.now() < deadline) sleepSync(50);
    if (pidAlive(pid)) signal("SIGKILL");
    while (pidAlive(pid) && Date.now() < deadline + 2_000) sleepSync(50);
    log(`${service.name} stopped`);
  }
  fs.rmSync(pidFile, { force: true });
}

/** Drops and recreates a scratch database owned by the app's role (the web bench's own copy). */
export async function recreateDatabase(profile: Profile, name: string): Promise<void> {
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new ServiceError(`not a plain database name: ${name}`);
  const config = serviceConfig(profile);
  const superPassword = fs.readFileSync(path.join(postgresHome(config), "superuser-password"), "utf8").trim();
  const admin = new Client({ host: "127.0.0.1", port: config.postgres.port, user: "postgres", password: superPassword, database: "postgres" });
  await admin.connect();
  try {
    await admin.query(`drop database if exists "${name}" with (force)`);
    await admin.query(`create database "${name}" owner "${config.postgres.user}"`);
  } finally {
    await admin.end();
  }
}

// ------------------------------------------------------------------ commands

export async function startServices(profile: Profile): Promise<Record<string, string>> {
  const config = serviceConfig(profile);
  fs.mkdirSync(config.dataDir, { recursive: true });
  await startPostgres(config);
  for (const service of nodeServices(config)) await startNodeService(config, service);
  return appEnvironment(config);
}

export function stopServices(profile: Profile, only?: string): void {
  const config = serviceConfig(profile);
  for (const service of nodeServices(config)) if (!only || only === service.name) stopNodeService(config, service);
  if (!only || only === "postgres") stopPostgres(config);
}

export async function startOneService(profile: Profile, name: string): Promise<void> {
  const config = serviceConfig(profile);
  if (name === "postgres") return startPostgres(config);
  const service = nodeServices(config).find((s) => s.name === name);
  if (!service) throw new ServiceError(`unknown service ${name}`);
  await startNodeService(config, service);
}

async function main() {
  const [command = "status", profileArg = "demo", only] = process.argv.slice(2);
  if (profileArg !== "demo" && profileArg !== "test") throw new ServiceError(`unknown profile ${profileArg} (demo or test)`);
  const profile: Profile = profileArg;
  if (command === "start") {
    if (only) await startOneService(profile, only);
    else await startServices(profile);
  } else if (command === "stop") {
    stopServices(profile, only);
  } else if (command === "env") {
    const env = appEnvironment(serviceConfig(profile));
    for (const [k, v] of Object.entries(env)) process.stdout.write(`${k}='${v.replace(/'/g, "'\\''")}'\n`);
  } else if (command === "status") {
    const config = serviceConfig(profile);
    const rows: [string, number][] = [
      ["postgres", config.postgres.port],
      ["s3", config.s3.port],
      ["smtp", config.smtp.port],
      ["mail api", config.mailApi.port],
    ];
    for (const [name, port] of rows) log(`${name} on 127.0.0.1:${port}: ${(await portAnswers(port)) ? "up" : "down"}`);
  } else {
    throw new ServiceError(`unknown command ${command} (start, stop, status, env)`);
  }
}

if (require.main === module) {
  main().catch((error) => {
    log(error instanceof ServiceError ? error.message : String(error?.stack ?? error));
    process.exit(1);
  });
}
