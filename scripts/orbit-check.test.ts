/**
 * The orbit-check command line, spawned as a separate process the way proposers run it:
 * stdout carries only the response JSON, and the exit code follows the contract.
 */
import { spawnSync } from "node:child_process";
import path from "node:path";
import { describe, expect, it } from "vitest";

const root = path.resolve(__dirname, "..");
const tsx = path.join(root, "node_modules", ".bin", "tsx");
const examples = path.join(root, "lib", "orbit", "examples");

function run(args: string[], input?: string) {
  const r = spawnSync(tsx, ["--tsconfig", "tsconfig.json", "scripts/orbit-check.ts", ...args], {
    cwd: root,
    input,
    encoding: "utf8",
    timeout: 60_000,
  });
  let json: { results: { id: string; status: string; checks: unknown[]; messages: string[] }[]; error?: string } | undefined;
  try {
    json = JSON.parse(r.stdout);
  } catch {
    json = undefined;
  }
  return { code: r.status, stdout: r.stdout, stderr: r.stderr, json };
}

const CONTRACT = JSON.stringify({
  tolerance: { relative: 0.01 },
  claims: [
    { id: "c1", kind: "orbit", body: "earth", given: { periapsisAltitude: 500, apoapsisAltitude: 800 }, claimed: { period: 5827, eccentricity: 0.0214 } },
  ],
});

describe("orbit-check command line", { timeout: 60_000 }, () => {
  it("checks the contract example from standard input: only JSON on stdout, exit 0", () => {
    const r = run([], CONTRACT);
    expect(r.code).toBe(0);
    expect(r.json).toBeDefined();
    expect(r.json!.results[0]).toMatchObject({ id: "c1", status: "consistent" });
    expect(r.json!.results[0]!.checks).toHaveLength(2);
  });

  it("reads a file given as argument", () => {
    const r = run([path.join(examples, "contract-example.json")]);
    expect(r.code).toBe(0);
    expect(r.json!.results[0]!.status).toBe("consistent");
  });

  it("a whole invented dossier passes", () => {
    const r = run([path.join(examples, "mission-dossier.json")]);
    expect(r.json!.results.map((x) => x.status)).toEqual(Array(r.json!.results.length).fill("consistent"));
    expect(r.code).toBe(0);
  });

  it("exits 1 when a claim is wrong", () => {
    const r = run([path.join(examples, "wrong-claim.json")]);
    expect(r.code).toBe(1);
    expect(r.json!.results[0]!.status).toBe("inconsistent");
  });

  it("exits 2 when a claim is invalid, and says why", () => {
    const r = run([path.join(examples, "invalid-claim.json")]);
    expect(r.code).toBe(2);
    const flyby = r.json!.results.find((x) => x.id === "kestrel-1-flyby")!;
    expect(flyby.status).toBe("invalid");
    expect(flyby.messages.join(" ")).toMatch(/closed orbits/);
  });

  it("exits 2 on malformed JSON with an error in the JSON", () => {
    const r = run([], "{ claims: [");
    expect(r.code).toBe(2);
    expect(r.json).toMatchObject({ error: "the request is not valid JSON", results: [] });
  });

  it("exits 2 when the request has no claims array", () => {
    const r = run([], JSON.stringify({ claim: {} }));
    expect(r.code).toBe(2);
    expect(r.json!.error).toMatch(/claims/);
  });

  it("exits 2 when the file does not exist", () => {
    const r = run([path.join(examples, "no-such-file.json")]);
    expect(r.code).toBe(2);
    expect(r.json!.error).toMatch(/cannot read the request file/);
  });

  it("prints the contract's notice on standard error and carries it in the JSON (contract version 2)", () => {
    const r = run([], CONTRACT);
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/two-body screening estimates, not flight-qualified analysis/i);
    expect(r.stderr).toMatch(/licensing authority's rules govern/);
    expect(JSON.parse(r.stdout)).toMatchObject({ contractVersion: 2, notice: expect.stringMatching(/screening estimates/) });
  });

  it("a claimed period in minutes fails with the unit hint; a bad claimed string is invalid (exit 2)", () => {
    const minutes = run([], JSON.stringify({ claims: [{ id: "m", kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: "94.6" } }] }));
    expect(minutes.code).toBe(1);
    const row = (minutes.json!.results[0]!.checks as { hint?: { code: string; factor: number } }[])[0]!;
    expect(row.hint).toMatchObject({ code: "unit-scale", factor: 60 });
    const bad = run([], JSON.stringify({ claims: [{ id: "b", kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: "94.6 min" } }] }));
    expect(bad.code).toBe(2);
    expect(bad.json!.results[0]!.messages[0]).toMatch(/^claimed\.period is not a plain decimal/);
  });

  it("exits 2 with the field named when the tolerance is refused", () => {
    const r = run([], JSON.stringify({ tolerance: { relative: 0.5 }, claims: [] }));
    expect(r.code).toBe(2);
    expect(r.json!.error).toMatch(/tolerance\.relative/);
    expect(r.stderr).toMatch(/screening estimates/);
  });

  it("works through the npm script as documented", () => {
    const r = spawnSync("npm", ["run", "--silent", "orbit-check"], { cwd: root, input: CONTRACT, encoding: "utf8", timeout: 60_000 });
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).results[0].status).toBe("consistent");
  });
});
