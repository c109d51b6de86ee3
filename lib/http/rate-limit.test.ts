import { describe, expect, it } from "vitest";
import { clientKey, createRateLimiter } from "./rate-limit";

describe("token-bucket rate limiter", () => {
  it("allows a burst up to the capacity, then refuses with a Retry-After", () => {
    let t = 0;
    const limiter = createRateLimiter({ capacity: 3, refillPerSecond: 1 / 20, now: () => t });
    expect([1, 2, 3].map(() => limiter.take("a").ok)).toEqual([true, true, true]);
    const refused = limiter.take("a");
    expect(refused.ok).toBe(false);
    expect(refused.retryAfterSeconds).toBe(20);
    t += 20_000;
    expect(limiter.take("a").ok).toBe(true);
    expect(limiter.take("a").ok).toBe(false);
  });

  it("keeps clients apart", () => {
    const limiter = createRateLimiter({ capacity: 1, refillPerSecond: 1, now: () => 0 });
    expect(limiter.take("a").ok).toBe(true);
    expect(limiter.take("a").ok).toBe(false);
    expect(limiter.take("b").ok).toBe(true);
  });

  it("forgets the least recently used clients beyond maxKeys (a fresh bucket is full)", () => {
    const limiter = createRateLimiter({ capacity: 1, refillPerSecond: 0.001, maxKeys: 2, now: () => 0 });
    limiter.take("a");
    limiter.take("b");
    limiter.take("c");
    expect(limiter.take("a").ok).toBe(true);
  });

  it("reads the client address from X-Forwarded-For only as far as the trusted proxy hops reach", () => {
    // The app server appends the peer (10.0.0.1, a proxy here); the client wrote 203.0.113.7.
    expect(clientKey(new Headers({ "x-forwarded-for": "203.0.113.7, 10.0.0.1" }))).toBe("10.0.0.1");
    expect(clientKey(new Headers({ "x-forwarded-for": "203.0.113.7, 10.0.0.1" }), 1)).toBe("203.0.113.7");
    expect(clientKey(new Headers({ "x-real-ip": "198.51.100.2" }))).toBe("local");
    expect(clientKey(new Headers())).toBe("local");
  });
});
