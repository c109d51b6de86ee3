import { spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";

const root = path.resolve(__dirname, "../..");
const tsx = path.join(root, "node_modules/tsx/dist/cli.mjs");

function freePort(): Promise<{ port: number; server: net.Server }> {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.listen(0, "127.0.0.1", () => resolve({ port: (server.address() as net.AddressInfo).port, server }));
  });
}

describe("start-up faults give actionable messages", () => {
  it("names the busy port and the variable that changes it", async () => {
    const busy = await freePort();
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), "visviva-ports-"));
    fs.chmodSync(dataDir, 0o755);
    try {
      // The busy port is the PostgreSQL one, so nothing else is started before the check.
      const result = spawnSync(process.execPath, [tsx, "scripts/services.ts", "start", "demo", "postgres"], {
        cwd: root,
        encoding: "utf8",
        env: { ...process.env, VISVIVA_DEMO_PG_PORT: String(busy.port), VISVIVA_DEMO_DATA_DIR: dataDir },
      });
      expect(result.status).toBe(1);
      expect(result.stderr).toContain(`port ${busy.port} (PostgreSQL) is already in use`);
      expect(result.stderr).toContain("set VISVIVA_DEMO_PG_PORT to a free port");
    } finally {
      busy.server.close();
      spawnSync(process.execPath, [tsx, "scripts/services.ts", "stop", "demo"], {
        cwd: root,
        env: { ...process.env, VISVIVA_DEMO_DATA_DIR: dataDir },
      });
      fs.rmSync(dataDir, { recursive: true, force: true });
    }
  }, 120_000);

  it("refuses a production start with required variables missing, and lists them", () => {
    const env = { PATH: process.env.PATH ?? "", HOME: process.env.HOME ?? "/tmp" } as unknown as NodeJS.ProcessEnv;
    const result = spawnSync(process.execPath, [tsx, "scripts/start.ts"], { cwd: root, encoding: "utf8", env });
    expect(result.status).toBe(1);
    expect(result.stderr).toContain(
      "missing environment variables: DATABASE_URL, S3_ENDPOINT, S3_ACCESS_KEY, S3_SECRET_KEY, S3_BUCKET, SMTP_URL, APP_URL, NEXTAUTH_SECRET",
    );
  });
});
