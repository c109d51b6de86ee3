import "server-only";
import { lt, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { rateLimitBuckets } from "@/db/schema";
import { tooManyRequests } from "@/lib/errors";
import { formatWait } from "@/lib/format/dates";

// Fixed-window rate limits in PostgreSQL: one row per key, so a limit holds across every app
// instance behind the load balancer. A window opens with the first request after the last
// one closed; a request in an open window adds one to its count.

export interface WindowDecision {
  ok: boolean;
  /** Requests left in this window after this one. */
  remaining: number;
  /** Whole seconds until the window closes (0 when ok). */
  retryAfterSeconds: number;
}

/**
 * Counts one request against `key` and says whether it is within `max` per `windowSeconds`.
 * One statement, one round trip. It commits without waiting for the write-ahead log to reach
 * the disk (synchronous_commit off for this transaction only, set inside the statement): a
 * counter lost in a database crash only forgets a few requests, and the request no longer
 * waits for a disk flush, which on a busy machine was most of the orbit-check API's time.
 */
export async function takeRateLimit(key: string, max: number, windowSeconds: number): Promise<WindowDecision> {
  const result = await db().execute<{ count: number; window_start: Date }>(sql`
    insert into ${rateLimitBuckets} (key, window_start, count)
    select ${key}, now(), 1 from (select set_config('synchronous_commit', 'off', true)) as no_flush_wait
    on conflict (key) do update set
      count = case when ${rateLimitBuckets.windowStart} <= now() - make_interval(secs => ${windowSeconds}) then 1 else ${rateLimitBuckets.count} + 1 end,
      window_start = case when ${rateLimitBuckets.windowStart} <= now() - make_interval(secs => ${windowSeconds}) then now() else ${rateLimitBuckets.windowStart} end
    returning count, window_start`);
  const row = result.rows[0];
  const count = Number(row?.count ?? 1);
  if (count <= max) return { ok: true, remaining: max - count, retryAfterSeconds: 0 };
  const closes = new Date(row!.window_start).getTime() + windowSeconds * 1000;
  return { ok: false, remaining: 0, retryAfterSeconds: Math.max(1, Math.ceil((closes - Date.now()) / 1000)) };
}

/** As takeRateLimit, but throws 429 with the message and a retry-after when over the limit. */
export async function consumeRateLimit(key: string, max: number, windowSeconds: number, message: string): Promise<void> {
  const decision = await takeRateLimit(key, max, windowSeconds);
  if (!decision.ok) {
    const retryAfter = decision.retryAfterSeconds;
    throw tooManyRequests(`${message} Try again ${formatWait(retryAfter)}.`, retryAfter);
  }
}

export interface RateLimitStep {
  key: string;
  max: number;
  windowSeconds: number;
  /** The sentence a refused request gets ("Too many sign-in links..."); the wait is added. */
  message: string;
}

/**
 * Several limits in one round trip, in order, as consecutive consumeRateLimit calls would
 * count them: each step counts only when every earlier step was within its limit (a client
 * refused by its per-network limit does not use up the address's allowance), and the first
 * step over its limit answers 429. One statement: a chain of upserts, each guarded by the
 * count its predecessor returned.
 */
export async function consumeRateLimits(steps: readonly RateLimitStep[]): Promise<void> {
  if (steps.length === 0) return;
  const upsert = (step: RateLimitStep, index: number) => {
    const guard =
      index === 0
        ? sql`from (select set_config('synchronous_commit', 'off', true)) as no_flush_wait`
        : sql`where (select count from ${sql.raw(`s${index - 1}`)}) <= ${steps[index - 1]!.max}`;
    return sql`${sql.raw(`s${index}`)} as (
      insert into ${rateLimitBuckets} (key, window_start, count)
      select ${step.key}, now(), 1 ${guard}
      on conflict (key) do update set
        count = case when ${rateLimitBuckets.windowStart} <= now() - make_interval(secs => ${step.windowSeconds}) then 1 else ${rateLimitBuckets.count} + 1 end,
        window_start = case when ${rateLimitBuckets.windowStart} <= now() - make_interval(secs => ${step.windowSeconds}) then now() else ${rateLimitBuckets.windowStart} end
      returning count, window_start)`;
  };
  const ctes = sql.join(
    steps.map((step, i) => upsert(step, i)),
    sql`, `,
  );
  const selects = sql.join(
    steps.map((_, i) => sql`select ${i}::int as step, count, window_start from ${sql.raw(`s${i}`)}`),
    sql` union all `,
  );
  const result = await db().execute<{ step: number; count: number; window_start: Date }>(sql`with ${ctes} ${selects}`);
  const counted = [...result.rows].sort((a, b) => Number(a.step) - Number(b.step));
  for (const row of counted) {
    const step = steps[Number(row.step)]!;
    if (Number(row.count) <= step.max) continue;
    const closes = new Date(row.window_start).getTime() + step.windowSeconds * 1000;
    const retryAfter = Math.max(1, Math.ceil((closes - Date.now()) / 1000));
    throw tooManyRequests(`${step.message} Try again ${formatWait(retryAfter)}.`, retryAfter);
  }
}

/** Deletes windows that closed more than a day ago (none of the limits spans longer). */
export async function pruneRateLimits(): Promise<number> {
  const deleted = await db()
    .delete(rateLimitBuckets)
    .where(lt(rateLimitBuckets.windowStart, sql`now() - interval '1 day'`));
  return deleted.rowCount ?? 0;
}
