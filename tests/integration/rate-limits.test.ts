// Rate-limit windows in PostgreSQL (lib/dal/rate-limits.ts): one upsert per request, and a
// chain of limits in one statement that counts like consecutive calls.
import crypto from "node:crypto";
import { inArray } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { rateLimitBuckets } from "@/db/schema";
import { consumeRateLimits, takeRateLimit } from "@/lib/dal/rate-limits";
import { isAppError } from "@/lib/errors";

const key = (what: string) => `test:${what}:${crypto.randomUUID()}`;

async function counts(keys: string[]): Promise<Record<string, number>> {
  const rows = await db()
    .select({ key: rateLimitBuckets.key, count: rateLimitBuckets.count })
    .from(rateLimitBuckets)
    .where(inArray(rateLimitBuckets.key, keys));
  return Object.fromEntries(rows.map((r) => [r.key, r.count]));
}

async function refusal(run: () => Promise<unknown>): Promise<{ status: number; message: string; retryAfter: string | undefined }> {
  const caught = await run().then(
    () => null,
    (error: unknown) => error,
  );
  if (!isAppError(caught)) throw new Error(`expected a 429, got ${String(caught)}`);
  return { status: caught.status, message: caught.message, retryAfter: (caught.headers as Record<string, string> | undefined)?.["Retry-After"] };
}

describe("rate limits in PostgreSQL", () => {
  it("takeRateLimit counts each request in the window and refuses the one over the limit", async () => {
    const k = key("single");
    const answers = [];
    for (let i = 0; i < 4; i++) answers.push(await takeRateLimit(k, 3, 60));
    expect(answers.map((a) => a.ok)).toEqual([true, true, true, false]);
    expect(answers.map((a) => a.remaining)).toEqual([2, 1, 0, 0]);
    expect(answers[3]!.retryAfterSeconds).toBeGreaterThan(0);
    expect(answers[3]!.retryAfterSeconds).toBeLessThanOrEqual(60);
    expect(await counts([k])).toEqual({ [k]: 4 });
  });

  it("consumeRateLimits counts every step in one statement while all are within their limits", async () => {
    const client = key("client");
    const address = key("address");
    const steps = [
      { key: client, max: 5, windowSeconds: 60, message: "Too many from this network." },
      { key: address, max: 2, windowSeconds: 60, message: "Too many for this address." },
    ];
    await consumeRateLimits(steps);
    await consumeRateLimits(steps);
    expect(await counts([client, address])).toEqual({ [client]: 2, [address]: 2 });
    // The third request is over the address's limit: 429 with that step's sentence and a wait.
    const refused = await refusal(() => consumeRateLimits(steps));
    expect(refused.status).toBe(429);
    expect(refused.message).toMatch(/^Too many for this address\. Try again /);
    expect(Number(refused.retryAfter)).toBeGreaterThan(0);
    expect(await counts([client, address])).toEqual({ [client]: 3, [address]: 3 });
  });

  it("a request refused by an earlier step does not use up the later steps' allowance", async () => {
    const client = key("client");
    const address = key("address");
    const steps = [
      { key: client, max: 1, windowSeconds: 60, message: "Too many from this network." },
      { key: address, max: 10, windowSeconds: 60, message: "Too many for this address." },
    ];
    await consumeRateLimits(steps);
    for (let i = 0; i < 3; i++) {
      const refused = await refusal(() => consumeRateLimits(steps));
      expect(refused.message).toMatch(/^Too many from this network\. /);
    }
    // As with consecutive calls: the network's count went on, the address's stayed at 1.
    expect(await counts([client, address])).toEqual({ [client]: 4, [address]: 1 });
  });
});
