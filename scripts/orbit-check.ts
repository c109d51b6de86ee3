/**
 * Command line of the orbit-check engine (contract: docs/contracts/orbit-checks.md).
 *
 *   npm run --silent orbit-check < request.json
 *   npm run --silent orbit-check -- request.json
 *
 * Standard output carries only the response JSON; anything else goes to standard error,
 * including the contract's notice (two-body screening estimates, not flight-qualified analysis).
 * Exit code: 0 all claims consistent, 1 at least one inconsistent, 2 at least one invalid
 * or the request itself is malformed (the JSON still says why).
 */
import { readFile } from "node:fs/promises";
import { checkOrbitClaims, CONTRACT_VERSION, exitCodeFor, NOTICE, type OrbitCheckResponse } from "../lib/orbit";

const MAX_INPUT_BYTES = 16 * 1024 * 1024;

async function readStdin(): Promise<string> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of process.stdin) {
    const b = typeof chunk === "string" ? Buffer.from(chunk) : (chunk as Buffer);
    size += b.length;
    if (size > MAX_INPUT_BYTES) throw new Error(`standard input is larger than ${MAX_INPUT_BYTES} bytes`);
    chunks.push(b);
  }
  return Buffer.concat(chunks).toString("utf8");
}

/** Prints the response (with the contract's notice) on standard output, and the notice on standard error. */
function finish(response: Omit<OrbitCheckResponse, "notice"> & { notice?: string }, code: number): void {
  const full: OrbitCheckResponse = { contractVersion: CONTRACT_VERSION, ...response, notice: NOTICE };
  process.stderr.write(`orbit-check: ${NOTICE}\n`);
  process.stdout.write(JSON.stringify(full, null, 2) + "\n");
  process.exitCode = code;
}

async function main(): Promise<void> {
  const args = process.argv.slice(2).filter((a) => a !== "--");
  if (args.includes("--help") || args.includes("-h")) {
    process.stderr.write("usage: npm run --silent orbit-check [-- request.json]  (reads standard input when no file is given)\n");
    finish({ error: "help requested; no request was checked", results: [] }, 2);
    return;
  }
  if (args.length > 1) {
    finish({ error: `give at most one request file (got ${args.length} arguments)`, results: [] }, 2);
    return;
  }
  let text: string;
  const file = args[0];
  try {
    if (file !== undefined) text = await readFile(file, "utf8");
    else if (process.stdin.isTTY) {
      process.stderr.write("reading the request from standard input (end with Ctrl-D)\n");
      text = await readStdin();
    } else text = await readStdin();
  } catch (e) {
    const why = e instanceof Error ? e.message : String(e);
    process.stderr.write(`orbit-check: ${why}\n`);
    finish({ error: file !== undefined ? `cannot read the request file ${file}` : "cannot read standard input", details: why, results: [] }, 2);
    return;
  }
  let request: unknown;
  try {
    request = JSON.parse(text);
  } catch (e) {
    finish({ error: "the request is not valid JSON", details: e instanceof Error ? e.message : String(e), results: [] }, 2);
    return;
  }
  const response = checkOrbitClaims(request);
  const code = exitCodeFor(response);
  const counts = response.results.reduce<Record<string, number>>((m, r) => ({ ...m, [r.status]: (m[r.status] ?? 0) + 1 }), {});
  process.stderr.write(`orbit-check: ${response.results.length} claim(s) ${JSON.stringify(counts)}\n`);
  finish(response, code);
}

main().catch((e: unknown) => {
  process.stderr.write(`orbit-check: ${e instanceof Error ? e.message : String(e)}\n`);
  finish({ error: "the command line failed unexpectedly", results: [] }, 2);
});
