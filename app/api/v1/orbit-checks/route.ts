/**
 * POST /api/v1/orbit-checks — the public, sign-in-free door to the orbit-check engine
 * (contract: docs/contracts/orbit-checks.md). It reads and stores nothing, so the only
 * guards are a body-size cap and a per-client rate limit. The limit is counted in PostgreSQL
 * so it holds across app instances; if the database cannot answer, each instance falls back
 * to its own in-memory bucket rather than refusing a request that needs no database.
 */
import { NextResponse } from "next/server";
import { takeRateLimit } from "@/lib/dal/rate-limits";
import { env } from "@/lib/env";
import { createRateLimiter, clientKey } from "@/lib/http/rate-limit";
import { checkOrbitClaims, CONTRACT_VERSION, NOTICE } from "@/lib/orbit";

export const runtime = "nodejs";

const MAX_BODY_BYTES = 256 * 1024;
const PER_MINUTE = 60;
const fallback = createRateLimiter({ capacity: PER_MINUTE, refillPerSecond: PER_MINUTE / 60 });
let warnedFallback = false;

async function takeToken(client: string): Promise<{ ok: boolean; remaining: number; retryAfterSeconds: number }> {
  try {
    const decision = await takeRateLimit(`orbit-check:client:${client}`, PER_MINUTE, 60);
    warnedFallback = false;
    return decision;
  } catch (error) {
    if (!warnedFallback) console.warn("[orbit-checks] shared rate limit unavailable, limiting per instance:", error instanceof Error ? error.message : error);
    warnedFallback = true;
    return fallback.take(client);
  }
}

/** Every answer carries the contract's notice (contract version 2), errors included. */
const answer = (body: Record<string, unknown>, status: number, headers: Record<string, string> = {}) =>
  NextResponse.json({ contractVersion: CONTRACT_VERSION, ...body, notice: NOTICE }, { status, headers: { "cache-control": "no-store", ...headers } });

const tooLarge = () => answer({ error: `The request body is larger than ${MAX_BODY_BYTES / 1024} KB; split the claims over several requests.` }, 413);

/** Reads the body as text, stopping as soon as it exceeds the cap; null when it does. */
async function readCapped(request: Request): Promise<string | null> {
  if (!request.body) return "";
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > MAX_BODY_BYTES) {
      await reader.cancel().catch(() => undefined);
      return null;
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks).toString("utf8");
}

export async function POST(request: Request): Promise<Response> {
  try {
    // The rate limit's database round trip and the body's arrival overlap; nothing is parsed
    // or computed before the limit has answered.
    const limitAnswer = takeToken(clientKey(request.headers, env().TRUSTED_PROXY_HOPS));
    const declaredTooLarge = Number(request.headers.get("content-length") ?? "0") > MAX_BODY_BYTES;
    const bodyRead: Promise<{ text: string | null } | { failed: unknown }> = declaredTooLarge
      ? Promise.resolve({ text: null })
      : readCapped(request).then(
          (text) => ({ text }),
          (failed: unknown) => ({ failed }),
        );
    const limit = await limitAnswer;
    if (!limit.ok) {
      return answer({ error: `Too many orbit-check requests: at most ${PER_MINUTE} per minute. Retry after ${limit.retryAfterSeconds} s.` }, 429, {
        "retry-after": String(limit.retryAfterSeconds),
      });
    }
    const read = await bodyRead;
    if ("failed" in read) throw read.failed;
    const text = read.text;
    if (text === null) return tooLarge();
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch (error) {
      return answer({ error: "The request body is not valid JSON.", details: { parser: (error as Error).message } }, 400);
    }
    const response = checkOrbitClaims(body);
    if (response.error !== undefined) return answer({ error: response.error, details: response.details, results: [] }, 400);
    return answer(response, 200, { "x-ratelimit-remaining": String(limit.remaining) });
  } catch (error) {
    console.error("[orbit-checks] unexpected error", error);
    return answer({ error: "The orbit check failed on our side. Try again; if it persists, report the request." }, 500);
  }
}
