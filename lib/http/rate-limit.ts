import { clientAddressFrom } from "./client-address";

/**
 * A tiny in-memory token-bucket rate limiter, keyed by any string (usually the client
 * address). Per process only: it protects one server from a noisy client, it is not a
 * distributed quota. No framework imports so it can be unit tested directly.
 */

export interface RateLimiterOptions {
  /** Bucket size: the burst a fresh client may send at once. */
  capacity: number;
  /** Tokens added per second (capacity / 60 for "capacity per minute"). */
  refillPerSecond: number;
  /** Buckets kept at most; the least recently used are dropped beyond it. */
  maxKeys?: number;
  /** Clock in milliseconds, injectable for tests. */
  now?: () => number;
}

export interface RateLimitDecision {
  ok: boolean;
  /** Tokens left after this request. */
  remaining: number;
  /** Whole seconds until one token is available again (0 when ok). */
  retryAfterSeconds: number;
}

export interface RateLimiter {
  take(key: string): RateLimitDecision;
  reset(): void;
}

interface Bucket {
  tokens: number;
  updated: number;
}

export function createRateLimiter(options: RateLimiterOptions): RateLimiter {
  const { capacity, refillPerSecond } = options;
  if (!(capacity >= 1) || !(refillPerSecond > 0)) throw new Error("rate limiter needs capacity ≥ 1 and a positive refill rate");
  const maxKeys = options.maxKeys ?? 10_000;
  const now = options.now ?? (() => Date.now());
  // A Map iterates in insertion order; re-inserting on use makes the first key the least recently used.
  const buckets = new Map<string, Bucket>();

  return {
    take(key: string): RateLimitDecision {
      const t = now();
      const previous = buckets.get(key);
      let tokens = capacity;
      if (previous) {
        const elapsed = Math.max(0, t - previous.updated) / 1000;
        tokens = Math.min(capacity, previous.tokens + elapsed * refillPerSecond);
        buckets.delete(key);
      }
      const ok = tokens >= 1;
      if (ok) tokens -= 1;
      buckets.set(key, { tokens, updated: t });
      while (buckets.size > maxKeys) {
        const oldest = buckets.keys().next().value;
        if (oldest === undefined) break;
        buckets.delete(oldest);
      }
      return {
        ok,
        remaining: Math.floor(tokens),
        retryAfterSeconds: ok ? 0 : Math.max(1, Math.ceil((1 - tokens) / refillPerSecond)),
      };
    },
    reset() {
      buckets.clear();
    },
  };
}

/** The client address, trusting `trustedHops` proxies' X-Forwarded-For entries (see client-address.ts). */
export function clientKey(headers: Headers, trustedHops = 0): string {
  return clientAddressFrom(headers.get("x-forwarded-for"), trustedHops);
}
