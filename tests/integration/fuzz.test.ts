// A standing fuzz test (issue 17, finding 7): for every operation in the OpenAPI document,
// about 30 hostile requests generated from its zod schemas (wrong types, NUL, lone
// surrogates, 100k strings, deep nesting, prototype keys, wrong content types, hostile path
// and query parameters), sent as a site admin against real rows so that validation and the
// data layer are reached. None may answer 5xx. Deterministic: the cases are the same each run.
import crypto from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { z } from "zod";
import { assignReviewers } from "@/lib/dal/assignments";
import { apiOperations } from "@/lib/openapi";
import type { ApiOperation } from "@/lib/openapi/registry";
import { appUrl } from "../support/app";
import { asSessionUser } from "../support/factories";
import { HttpClient, signedIn } from "../support/http";
import { createReviewRound, inFuture } from "./review-fixtures";

const CASES_PER_OPERATION = 30;
const CONCURRENCY = 6;

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
type JsonSchema = {
  type?: string | string[];
  properties?: Record<string, JsonSchema>;
  required?: string[];
  enum?: Json[];
  format?: string;
  minimum?: number;
  items?: JsonSchema;
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  const?: Json;
  default?: Json;
};

const deep = (depth: number): Json => {
  let v: Json = "bottom";
  for (let i = 0; i < depth; i++) v = i % 2 ? [v] : { a: v };
  return v;
};

/** Values no field expects; each is sent in place of each field in turn. */
const HOSTILE: Json[] = [
  123456789,
  -1e308,
  true,
  null,
  [],
  {},
  "nul\u0000in the middle",
  "lone \ud800 surrogate",
  "\udfff",
  "x".repeat(100_000),
  deep(500),
  JSON.parse('{"__proto__":{"isAdmin":true,"polluted":"yes"}}') as Json,
  { constructor: { prototype: { polluted: "yes" } } },
  "'; drop table users; --",
  "<img src=x onerror=alert(1)>",
  "../../../../etc/passwd",
  "1e309",
  [1, "two", { three: [null] }],
];

function valueFor(schema: JsonSchema | undefined, depth = 0): Json {
  if (!schema || depth > 6) return "fuzz";
  if (schema.const !== undefined) return schema.const;
  if (schema.default !== undefined) return schema.default;
  if (schema.enum?.length) return schema.enum[0]!;
  const alternative = schema.anyOf ?? schema.oneOf;
  if (alternative?.length) return valueFor(alternative[0], depth + 1);
  const type = Array.isArray(schema.type) ? schema.type[0] : schema.type;
  switch (type) {
    case "string":
      if (schema.format === "uuid") return crypto.randomUUID();
      if (schema.format === "email") return "fuzz@example.org";
      if (schema.format === "date-time") return new Date(Date.now() + 86_400_000).toISOString();
      return "fuzz text";
    case "number":
    case "integer":
      return schema.minimum ?? 1;
    case "boolean":
      return true;
    case "array":
      return [];
    case "null":
      return null;
    case "object": {
      const out: Record<string, Json> = {};
      for (const key of schema.required ?? []) out[key] = valueFor(schema.properties?.[key], depth + 1);
      return out;
    }
    default:
      return "fuzz";
  }
}

function jsonSchemaOf(schema: z.ZodType | undefined): JsonSchema | undefined {
  if (!schema) return undefined;
  try {
    return z.toJSONSchema(schema, { io: "input", unrepresentable: "any" }) as JsonSchema;
  } catch {
    return undefined;
  }
}

interface FuzzCase {
  label: string;
  path: string;
  body?: string;
  contentType?: string;
}

const HOSTILE_PARAMS = ["%00", "%ED%A0%80", "x".repeat(2000), "..%2F..%2Fadmin", "%25", "-1", "1e309", "__proto__", "constructor", "%F0%9F%9A%80"];
const HOSTILE_QUERY = ["%00", "%ED%A0%80", "x".repeat(20_000), "-1", "99999999999999999999", "__proto__", "%7B%22a%22%3A1%7D", "%5B%5D", "true", "NaN"];

function casesFor(op: ApiOperation, ids: Record<string, string>): FuzzCase[] {
  const names = [...op.path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]!);
  const fill = (overrides: Record<string, string> = {}) =>
    op.path.replace(/\{(\w+)\}/g, (_, name: string) => overrides[name] ?? encodeURIComponent(ids[name] ?? crypto.randomUUID()));
  const cases: FuzzCase[] = [];
  const bodySchema = jsonSchemaOf(op.body);
  const base = bodySchema ? valueFor(bodySchema) : undefined;
  const takesBody = op.method !== "get" && op.method !== "delete";
  const json = (value: unknown) => JSON.stringify(value);

  if (takesBody) {
    const baseObject = base && typeof base === "object" && !Array.isArray(base) ? (base as Record<string, Json>) : {};
    const keys = Object.keys(bodySchema?.properties ?? {});
    cases.push({ label: "base body", path: fill(), body: json(base ?? {}) });
    // Each field in turn gets a hostile value (cycling through the list).
    for (let i = 0; i < Math.max(keys.length, 1) * HOSTILE.length && cases.length < 14; i += HOSTILE.length + 1) {
      const key = keys.length ? keys[i % keys.length]! : "unexpected";
      const value = HOSTILE[i % HOSTILE.length]!;
      cases.push({ label: `field ${key} ← ${JSON.stringify(value).slice(0, 30)}`, path: fill(), body: json({ ...baseObject, [key]: value }) });
    }
    cases.push(
      { label: "body null", path: fill(), body: "null" },
      { label: "body array", path: fill(), body: "[]" },
      { label: "body string", path: fill(), body: '"just text"' },
      { label: "body deep arrays", path: fill(), body: `${"[".repeat(20_000)}${"]".repeat(20_000)}` },
      { label: "body deep objects", path: fill(), body: `${'{"a":'.repeat(5000)}1${"}".repeat(5000)}` },
      { label: "body __proto__", path: fill(), body: `{"__proto__":{"isAdmin":true},${json(baseObject).slice(1)}` },
      { label: "body NUL key", path: fill(), body: json({ ...baseObject, "k\u0000": "v" }) },
      { label: "body lone surrogate", path: fill(), body: `{"title":"\\ud800","name":"\\udc00x","email":"\\ud83d@x.org"}` },
      { label: "body 100k key", path: fill(), body: json({ ...baseObject, ["k".repeat(100_000)]: 1 }) },
      { label: "text/plain", path: fill(), body: json(base ?? {}), contentType: "text/plain;charset=UTF-8" },
      { label: "form", path: fill(), body: "title=x&email=a%40b.org", contentType: "application/x-www-form-urlencoded" },
      {
        label: "multipart",
        path: fill(),
        body: '--b\r\nContent-Disposition: form-data; name="x"\r\n\r\n1\r\n--b--\r\n',
        contentType: "multipart/form-data; boundary=b",
      },
      { label: "no content type", path: fill(), body: json(base ?? {}), contentType: "" },
      { label: "utf-16 json", path: fill(), body: json(base ?? {}), contentType: "application/json; charset=utf-16" },
    );
  }
  // Hostile path parameters, then hostile query values, until the case count is reached.
  const queryKeys = op.query ? Object.keys(op.query.shape) : [];
  let p = 0;
  let q = 0;
  while (cases.length < CASES_PER_OPERATION) {
    const useQuery = queryKeys.length > 0 && (names.length === 0 || cases.length % 2 === 0);
    if (useQuery) {
      const key = queryKeys[q % queryKeys.length]!;
      const value = HOSTILE_QUERY[q % HOSTILE_QUERY.length]!;
      cases.push({ label: `query ${key}=${value.slice(0, 20)}`, path: `${fill()}?${key}=${value}`, body: takesBody ? json(base ?? {}) : undefined });
      q++;
    } else if (names.length > 0) {
      const name = names[p % names.length]!;
      const value = HOSTILE_PARAMS[p % HOSTILE_PARAMS.length]!;
      cases.push({ label: `param ${name}=${value.slice(0, 20)}`, path: fill({ [name]: value }), body: takesBody ? json(base ?? {}) : undefined });
      p++;
    } else {
      const value = HOSTILE_QUERY[q % HOSTILE_QUERY.length]!;
      cases.push({
        label: `stray query ${value.slice(0, 20)}`,
        path: `${fill()}?__proto__[isAdmin]=1&constructor=${value}&x=${value}&x=2`,
        body: takesBody ? json(base ?? {}) : undefined,
      });
      q++;
    }
  }
  return cases.slice(0, CASES_PER_OPERATION);
}

describe("fuzzing every /api/v1 operation", () => {
  let admin: HttpClient;
  const ids: Record<string, string> = {};

  beforeAll(async () => {
    await appUrl();
    const round = await createReviewRound();
    const { created } = await assignReviewers(asSessionUser(round.chair), round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer.id],
      dueAt: inFuture(),
      confirmLikelyConflicts: true,
    });
    Object.assign(ids, {
      boardId: round.board.id,
      proposalId: round.proposal.id,
      callId: round.call.id,
      number: "1",
      assignmentId: created[0]?.assignmentId ?? crypto.randomUUID(),
      checkResultId: round.checks.inconsistent.id,
    });
    admin = await signedIn(round.admin.email);
  });

  it(`answers ${CASES_PER_OPERATION} hostile requests per operation without a 5xx`, { timeout: 300_000 }, async () => {
    const all = apiOperations.flatMap((op) => casesFor(op, ids).map((c) => ({ op, c })));
    expect(all.length).toBeGreaterThanOrEqual(apiOperations.length * CASES_PER_OPERATION);
    const failures: string[] = [];
    let next = 0;
    const worker = async () => {
      while (next < all.length) {
        const { op, c } = all[next++]!;
        const headers: Record<string, string> = { "x-forwarded-for": `10.250.${crypto.randomInt(255)}.${crypto.randomInt(1, 255)}` };
        if (c.body !== undefined && c.contentType !== "") headers["content-type"] = c.contentType ?? "application/json";
        let status = 0;
        let text = "";
        try {
          const response = await admin.request(c.path, { method: op.method.toUpperCase(), headers, body: c.body });
          status = response.status;
          text = await response.text();
        } catch (error) {
          failures.push(`${op.method.toUpperCase()} ${op.path} [${c.label}] → no answer: ${(error as Error).message}`);
          continue;
        }
        if (status >= 500) failures.push(`${op.method.toUpperCase()} ${op.path} [${c.label}] → ${status}: ${text.slice(0, 160)}`);
      }
    };
    await Promise.all(Array.from({ length: CONCURRENCY }, worker));
    const byKind = new Map<string, number>();
    for (const f of failures) byKind.set(f.replace(/^\S+ (\S+) \[([^\]=←]*).*$/, "$2"), (byKind.get(f.replace(/^\S+ (\S+) \[([^\]=←]*).*$/, "$2")) ?? 0) + 1);
    expect(failures, `${[...byKind].map(([k, n]) => `${n}× ${k}`).join("; ")}\n${failures.slice(0, 60).join("\n")}`).toEqual([]);
    // And the app still answers afterwards.
    expect((await admin.get("/api/v1/me")).status).toBe(200);
  });
});
