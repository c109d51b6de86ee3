// The authorization matrix: every /api/v1 operation and every server action, called as each
// role (anonymous, a chair of another board, proposer, reviewer, chair, site admin), must
// answer what the matrix entries in ./matrix/ say. The structural checks fail as soon as a
// route or action is added without an entry, or an action is not built with the wrapper
// that checks the session on the server.
import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { apiOperations } from "@/lib/openapi";
import { isAppError } from "@/lib/errors";
import { appUrl } from "../support/app";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { assignments, boards, proposalCoauthors, proposals, proposalVersions, users } from "@/db/schema";
import { addMember, asSessionUser, createBoardWithCast, createUser, unique } from "../support/factories";
import { HttpClient } from "../support/http";
import { actionCases, routeCases } from "./matrix";
import { matrixRoles, type MatrixCast, type MatrixRole } from "./matrix/types";

const root = path.resolve(__dirname, "../..");

function filesNamed(dir: string, name: string): string[] {
  const out: string[] = [];
  const visit = (d: string) => {
    for (const entry of fs.readdirSync(d, { withFileTypes: true })) {
      const full = path.join(d, entry.name);
      if (entry.isDirectory()) visit(full);
      else if (entry.name === name) out.push(full);
    }
  };
  if (fs.existsSync(dir)) visit(dir);
  return out.sort();
}

const rel = (file: string) => path.relative(root, file).split(path.sep).join("/");

interface ActionExport {
  key: string;
  wrapped: boolean;
  how: string;
}

/** Every export of every app/**\/actions.ts, and whether it is built with action(...) or publicAction(...). */
function scanActions(): ActionExport[] {
  const found: ActionExport[] = [];
  for (const file of filesNamed(path.join(root, "app"), "actions.ts")) {
    const source = fs.readFileSync(file, "utf8");
    const key = (name: string) => `${rel(file)}#${name}`;
    for (const m of source.matchAll(/^export\s+const\s+(\w+)\s*(?::[^=]+)?=\s*([\w.]+)\s*(<[^>]*>)?\s*\(/gm)) {
      found.push({ key: key(m[1]!), wrapped: m[2] === "action" || m[2] === "publicAction", how: `${m[2]}(...)` });
    }
    for (const m of source.matchAll(/^export\s+const\s+(\w+)\s*(?::[^=]+)?=(?!\s*[\w.]+\s*(?:<[^>]*>)?\s*\()/gm)) {
      found.push({ key: key(m[1]!), wrapped: false, how: "a value that is not a call of action()/publicAction()" });
    }
    for (const m of source.matchAll(/^export\s+(?:async\s+)?function\s*\*?\s*(\w+)/gm)) {
      found.push({ key: key(m[1]!), wrapped: false, how: "a plain exported function" });
    }
    for (const m of source.matchAll(/^export\s*\{([^}]*)\}/gm)) {
      for (const name of m[1]!
        .split(",")
        .map((s) =>
          s
            .trim()
            .split(/\s+as\s+/)
            .pop()!
            .trim(),
        )
        .filter(Boolean)) {
        found.push({ key: key(name), wrapped: false, how: "a re-export the check cannot follow" });
      }
    }
    if (/^export\s+default\b/m.test(source)) found.push({ key: key("default"), wrapped: false, how: "a default export" });
  }
  return found;
}

const HTTP_METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE", "HEAD", "OPTIONS"];

/** Every method exported by every app/api/v1/**\/route.ts, as "method /api/v1/path/{}". */
function scanRoutes(): { file: string; method: string; path: string }[] {
  const out: { file: string; method: string; path: string }[] = [];
  for (const file of filesNamed(path.join(root, "app/api/v1"), "route.ts")) {
    const segments = rel(file)
      .replace(/^app\//, "")
      .replace(/\/route\.ts$/, "")
      .split("/")
      .filter((s) => !/^\(.*\)$/.test(s))
      .map((s) => (/^\[+\.{0,3}(\w+)\]+$/.test(s) ? "{}" : s));
    const routePath = `/${segments.join("/")}`;
    const source = fs.readFileSync(file, "utf8");
    const methods = new Set<string>();
    for (const m of source.matchAll(/^export\s+(?:const|let|var|async\s+function|function)\s+(\w+)/gm)) if (HTTP_METHODS.includes(m[1]!)) methods.add(m[1]!);
    for (const m of source.matchAll(/^export\s*\{([^}]*)\}/gm)) {
      for (const name of m[1]!.split(",").map((s) =>
        s
          .trim()
          .split(/\s+as\s+/)
          .pop()!
          .trim(),
      ))
        if (HTTP_METHODS.includes(name)) methods.add(name);
    }
    for (const method of methods) out.push({ file: rel(file), method: method.toLowerCase(), path: routePath });
  }
  return out;
}

const normalise = (p: string) => p.replace(/\{[^}]+\}/g, "{}");

describe("authorization matrix: coverage", () => {
  it("has a route case for every operation in the OpenAPI document", () => {
    const covered = new Set(routeCases.map((c) => c.operationId));
    const missing = apiOperations.filter((op) => !covered.has(op.operationId)).map((op) => `${op.operationId} (${op.method.toUpperCase()} ${op.path})`);
    expect(missing, `operations without a RouteCase in tests/integration/matrix/:\n  ${missing.join("\n  ")}`).toEqual([]);
  });

  it("has no route case for an operation that no longer exists, and no duplicates", () => {
    const known = new Set(apiOperations.map((op) => op.operationId));
    expect(routeCases.filter((c) => !known.has(c.operationId)).map((c) => c.operationId)).toEqual([]);
    const ids = routeCases.map((c) => c.operationId);
    expect(ids.filter((id, i) => ids.indexOf(id) !== i)).toEqual([]);
    const opIds = apiOperations.map((op) => op.operationId);
    expect(
      opIds.filter((id, i) => opIds.indexOf(id) !== i),
      "operationIds must be unique",
    ).toEqual([]);
  });

  it("describes every route handler under app/api/v1 in the OpenAPI document", () => {
    const described = new Set(apiOperations.map((op) => `${op.method} ${normalise(op.path)}`));
    const undocumented = scanRoutes()
      .filter((r) => !described.has(`${r.method} ${r.path}`))
      .map((r) => `${r.method.toUpperCase()} ${r.path} (${r.file})`);
    expect(undocumented, `route handlers missing from lib/openapi:\n  ${undocumented.join("\n  ")}`).toEqual([]);
  });

  it("builds every exported server action with action() or publicAction()", () => {
    const scanned = scanActions();
    expect(scanned.length).toBeGreaterThan(0);
    const unwrapped = scanned.filter((a) => !a.wrapped).map((a) => `${a.key}: ${a.how}`);
    expect(unwrapped, `server actions must be \`export const xAction = action(schema, handler)\` (or publicAction):\n  ${unwrapped.join("\n  ")}`).toEqual([]);
  });

  it("has an action case for every exported server action, and none for actions that do not exist", () => {
    const scanned = new Set(scanActions().map((a) => a.key));
    const covered = new Set(actionCases.map((c) => c.action));
    const missing = [...scanned].filter((k) => !covered.has(k));
    expect(missing, `server actions without an ActionCase in tests/integration/matrix/:\n  ${missing.join("\n  ")}`).toEqual([]);
    expect([...covered].filter((k) => !scanned.has(k))).toEqual([]);
  });
});

// One signed-in client per user, signed in through next-auth's real credentials flow.
const clients = new Map<string, HttpClient>();

async function clientFor(cast: MatrixCast, role: MatrixRole): Promise<HttpClient> {
  if (role === "anonymous") return new HttpClient();
  const user = cast[role];
  let client = clients.get(user.id);
  if (!client) {
    client = await new HttpClient().signInAs(user.email);
    clients.set(user.id, client);
  }
  return client;
}

const statusList = (expected: number | number[]) => (Array.isArray(expected) ? expected : [expected]);

describe("authorization matrix: routes over HTTP", () => {
  beforeAll(async () => {
    await appUrl();
  });

  const operations = new Map(apiOperations.map((op) => [op.operationId, op]));
  for (const routeCase of routeCases) {
    it(`${routeCase.operationId}`, async () => {
      const operation = operations.get(routeCase.operationId);
      expect(operation, `unknown operationId ${routeCase.operationId}`).toBeDefined();
      const cast = await createBoardWithCast();
      const mismatches: string[] = [];
      for (const role of matrixRoles) {
        const request = await routeCase.prepare(cast, role);
        const client = await clientFor(cast, role);
        const qs = request.query ? `?${new URLSearchParams(request.query)}` : "";
        const method = operation!.method.toUpperCase();
        const response = await client.request(`${request.path}${qs}`, {
          method,
          ...(request.body !== undefined ? { json: request.body } : method === "GET" || method === "DELETE" ? {} : { json: {} }),
        });
        const expected = statusList(routeCase.expect[role]);
        const body = await response.text();
        if (!expected.includes(response.status)) {
          mismatches.push(`${role}: expected ${expected.join(" or ")}, got ${response.status} ${body.slice(0, 200)}`);
        } else if (response.status >= 400 && response.status !== 404 && operation!.access !== "public") {
          // Refusals are JSON {error} with a message, never an HTML page or a stack trace.
          const parsed = JSON.parse(body) as { error?: unknown };
          if (typeof parsed.error !== "string") mismatches.push(`${role}: ${response.status} without a JSON {error}`);
        }
      }
      expect(mismatches, `${operation!.method.toUpperCase()} ${operation!.path}:\n  ${mismatches.join("\n  ")}`).toEqual([]);
    });
  }
});

// The blind-mode column: with the board hiding proposers' names, every read a reviewer may
// make (each GET the matrix lets a reviewer through) answers without the owner's or a
// co-author's name or address (issue 17, finding 5).
describe("authorization matrix: blind-mode column (reviewer reads with proposer names hidden)", () => {
  beforeAll(async () => {
    await appUrl();
  });

  const operations = new Map(apiOperations.map((op) => [op.operationId, op]));
  // Every GET a reviewer may make, plus the proposal reads (made readable below by assigning
  // the reviewer to every submitted version on the board).
  // (Decisions, and today's rules on a version, are for chairs (and authors) only: reviewers get 404 there, blind or not.)
  const chairOnly = new Set([
    "/api/v1/boards/{boardId}/proposals/{proposalId}/decision",
    "/api/v1/boards/{boardId}/proposals/{proposalId}/versions/{number}/todays-rules",
  ]);
  const proposalRead = (path: string) => path.startsWith("/api/v1/boards/{boardId}/proposals/{proposalId}") && !chairOnly.has(path);
  const readable = routeCases.filter((c) => {
    const op = operations.get(c.operationId);
    return op?.method === "get" && (statusList(c.expect.reviewer).some((s) => s < 300) || proposalRead(op.path));
  });
  it("covers at least the proposal reads", () => {
    expect(readable.map((c) => operations.get(c.operationId)!.path)).toContain("/api/v1/boards/{boardId}/proposals/{proposalId}");
  });
  for (const routeCase of readable) {
    it(`${routeCase.operationId} (blind)`, async () => {
      const cast = await createBoardWithCast();
      const ownerName = `Owner ${unique("blind")}`;
      const coauthor = await createUser({ name: `Coauthor ${unique("blind")}` });
      await addMember(cast.board.id, coauthor.id, "proposer");
      await db().update(users).set({ name: ownerName }).where(eq(users.id, cast.proposer.id));
      await db().update(boards).set({ hideProposerNames: true }).where(eq(boards.id, cast.board.id));
      const request = await routeCase.prepare(cast, "reviewer");
      const onBoard = await db().select({ id: proposals.id }).from(proposals).where(eq(proposals.boardId, cast.board.id));
      if (onBoard.length)
        await db()
          .insert(proposalCoauthors)
          .values(onBoard.map((p) => ({ proposalId: p.id, userId: coauthor.id })))
          .onConflictDoNothing();
      const versions = await db()
        .select({ id: proposalVersions.id, proposalId: proposalVersions.proposalId })
        .from(proposalVersions)
        .where(eq(proposalVersions.boardId, cast.board.id));
      if (versions.length)
        await db()
          .insert(assignments)
          .values(
            versions.map((v) => ({
              boardId: cast.board.id,
              proposalId: v.proposalId,
              versionId: v.id,
              reviewerId: cast.reviewer.id,
              dueAt: new Date(Date.now() + 86_400_000),
            })),
          )
          .onConflictDoNothing();
      const client = await clientFor(cast, "reviewer");
      const qs = request.query ? `?${new URLSearchParams(request.query)}` : "";
      const response = await client.request(`${request.path}${qs}`);
      const body = await response.text();
      const path = operations.get(routeCase.operationId)!.path;
      // A proposal that was never submitted cannot be assigned, so it stays hidden (404); every
      // other read, and every read of a submitted proposal, must answer.
      const proposalId = /\/proposals\/([0-9a-f-]{36})/.exec(request.path)?.[1];
      if (!proposalRead(path) || versions.some((v) => v.proposalId === proposalId)) expect(response.status, body.slice(0, 200)).toBeLessThan(300);
      for (const secret of [ownerName, cast.proposer.email, coauthor.name, coauthor.email]) expect(body).not.toContain(secret);
    });
  }
});

describe("authorization matrix: server actions", () => {
  for (const actionCase of actionCases) {
    it(actionCase.action, async () => {
      const cast = await createBoardWithCast();
      const mismatches: string[] = [];
      for (const role of matrixRoles) {
        const user = role === "anonymous" ? null : asSessionUser(cast[role]);
        let outcome: "allow" | number;
        try {
          await actionCase.run(user, cast, role);
          outcome = "allow";
        } catch (error) {
          if (!isAppError(error)) throw error;
          outcome = error.status;
        }
        if (outcome !== actionCase.expect[role]) mismatches.push(`${role}: expected ${actionCase.expect[role]}, got ${outcome}`);
      }
      expect(mismatches, `${actionCase.action}:\n  ${mismatches.join("\n  ")}`).toEqual([]);
    });
  }
});
