// Bad input anywhere gets a clear 4xx, never a 500: every /api/v1 operation in the OpenAPI
// list is called as a site admin (so authorization passes wherever it can) with malformed
// path parameters and, where it takes a body, with broken and mis-shaped JSON.
import crypto from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { apiOperations } from "@/lib/openapi";
import { appUrl } from "../support/app";
import { createBoardWithCast, createUser } from "../support/factories";
import { HttpClient } from "../support/http";

const badParams = ["not-a-uuid", crypto.randomUUID(), "%00", "0"];
const badBodies: (string | undefined)[] = ["{not json", "null", "[]", '{"unexpected":[1,2,3],"title":{"deep":true}}', '"just a string"', ""];

function fill(path: string, value: string): string {
  return path.replace(/\{(\w+)\}/g, () => encodeURIComponent(value));
}

async function sendAll(client: HttpClient, requests: { method: string; path: string }[], failures: string[]) {
  for (const { method, path } of requests) {
    const bodies = method === "get" || method === "delete" ? [undefined] : badBodies;
    for (const body of bodies) {
      const response = await client.request(path, {
        method: method.toUpperCase(),
        headers:
          body === undefined ? {} : { "content-type": "application/json", "x-forwarded-for": `10.99.${crypto.randomInt(255)}.${crypto.randomInt(1, 255)}` },
        body,
      });
      const text = await response.text();
      const where = `${method.toUpperCase()} ${path} body=${JSON.stringify(body)}`;
      if (response.status >= 500) failures.push(`${where} → ${response.status}: ${text.slice(0, 200)}`);
      else if (response.status >= 400 && response.headers.get("content-type")?.includes("application/json")) {
        const parsed = JSON.parse(text) as { error?: unknown };
        if (typeof parsed.error !== "string" || parsed.error.length === 0) failures.push(`${where} → ${response.status} without an error message`);
        if (/at \S+ \(|node_modules|stack/i.test(text)) failures.push(`${where} → ${response.status} leaks internals: ${text.slice(0, 200)}`);
      }
    }
  }
}

describe("bad input never causes a server error", () => {
  let admin: HttpClient;

  beforeAll(async () => {
    await appUrl();
    const user = await createUser({ isAdmin: true });
    admin = await new HttpClient().signInAs(user.email);
  });

  it("answers malformed identifiers and bodies on every operation with a 4xx and a JSON message", async () => {
    const failures: string[] = [];
    const requests = apiOperations.flatMap((op) =>
      (op.path.includes("{") ? badParams.map((p) => fill(op.path, p)) : [op.path]).map((path) => ({ method: op.method, path })),
    );
    await sendAll(admin, requests, failures);
    expect(failures).toEqual([]);
  }, 300_000);

  it("answers broken bodies on a real board's operations with a 4xx, for its chair", async () => {
    const cast = await createBoardWithCast();
    const chair = await new HttpClient().signInAs(cast.chair.email);
    const failures: string[] = [];
    const requests = apiOperations
      .filter((op) => op.method !== "get" && op.method !== "delete" && /^\/api\/v1\/boards\/\{boardId\}(\/[a-z-]+)*$/.test(op.path))
      .map((op) => ({ method: op.method, path: op.path.replace("{boardId}", cast.board.id) }));
    expect(requests.length).toBeGreaterThan(3);
    await sendAll(chair, requests, failures);
    expect(failures).toEqual([]);
  }, 300_000);

  it("answers paths that are no API route with a JSON 404, and wrong methods with a JSON 405", async () => {
    const anonymous = new HttpClient();
    for (const [method, path] of [
      ["GET", "/api/v1/nope"],
      ["POST", "/api/v1/boards/not-a-board/nothing-here"],
      ["DELETE", "/api/v2/anything"],
      ["GET", "/api"],
    ] as const) {
      const res = await anonymous.request(path, { method });
      expect(res.status, `${method} ${path}`).toBe(404);
      expect(res.headers.get("content-type")).toContain("application/json");
      expect((await res.json()).error).toBe(`There is no API route ${method} ${path}. The routes are listed at /api/v1/openapi.json.`);
    }
    // A method the route does not answer: a JSON 405 with the methods it does answer.
    for (const [method, path, allow] of [
      ["PATCH", "/api/v1/me", "GET, HEAD, OPTIONS"],
      ["GET", "/api/v1/orbit-checks", "OPTIONS, POST"],
      ["PUT", `/api/v1/boards/${crypto.randomUUID()}/members`, "GET, HEAD, OPTIONS"],
    ] as const) {
      const res = await anonymous.request(path, { method });
      expect(res.status, `${method} ${path}`).toBe(405);
      expect(res.headers.get("allow")).toBe(allow);
      expect((await res.json()).error).toMatch(new RegExp(`^${method} is not allowed on .*; this route answers`));
    }
    // The real routes still answer.
    expect((await anonymous.request("/api/health")).status).toBe(200);
    expect((await anonymous.request("/api/v1/openapi.json")).status).toBe(200);
    expect((await anonymous.request("/api/auth/providers")).status).toBe(200);
  });
});
