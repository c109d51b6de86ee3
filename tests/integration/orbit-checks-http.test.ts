/**
 * POST /api/v1/orbit-checks against the running app: the contract example, a wrong claim,
 * malformed and oversized bodies, a request without claims, and the rate limit.
 */
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { rateLimitBuckets } from "@/db/schema";
import { appUrl } from "../support/app";

let base = "";

beforeAll(async () => {
  base = await appUrl();
});

const CONTRACT = {
  tolerance: { relative: 0.01 },
  claims: [
    { id: "c1", kind: "orbit", body: "earth", given: { periapsisAltitude: 500, apoapsisAltitude: 800 }, claimed: { period: 5827, eccentricity: 0.0214 } },
  ],
};

// Each test speaks as its own client address so the per-client rate limit of one test never
// spills into another (the limiter keys on the first X-Forwarded-For entry).
function post(body: string, client: string, headers: Record<string, string> = {}) {
  return fetch(`${base}/api/v1/orbit-checks`, {
    method: "POST",
    headers: { "content-type": "application/json", "x-forwarded-for": client, ...headers },
    body,
  });
}

describe("POST /api/v1/orbit-checks", () => {
  it("answers the contract example with 200 and a consistent result, without sign-in", async () => {
    const res = await post(JSON.stringify(CONTRACT), "192.0.2.10");
    expect(res.status).toBe(200);
    const json = await res.json();
    expect(json.results[0]).toMatchObject({ id: "c1", kind: "orbit", status: "consistent" });
    expect(json.results[0].computed.semiMajorAxis).toBeCloseTo(7028.137, 3);
    expect(json.results[0].checks).toHaveLength(2);
  });

  it("answers 200 for inconsistent and invalid claims, with the reasons", async () => {
    const res = await post(
      JSON.stringify({
        claims: [
          { id: "w", kind: "orbit", body: "earth", given: { altitude: 550 }, claimed: { period: 5400 } },
          { id: "i", kind: "orbit", body: "earth", given: { periapsisAltitude: 400, eccentricity: 1.3 }, claimed: { period: 12000 } },
        ],
      }),
      "192.0.2.11",
    );
    expect(res.status).toBe(200);
    const json = await res.json();
    expect(json.results.map((r: { status: string }) => r.status)).toEqual(["inconsistent", "invalid"]);
    expect(json.results[1].messages.join(" ")).toMatch(/closed orbits/);
  });

  it("answers 400 with error and details for malformed JSON", async () => {
    const res = await post("{ claims: [", "192.0.2.12");
    expect(res.status).toBe(400);
    const json = await res.json();
    expect(json.error).toMatch(/not valid JSON/);
    expect(json.details).toBeDefined();
  });

  it("answers 400 with details when the request has no claims array", async () => {
    const res = await post(JSON.stringify({ claim: CONTRACT.claims[0] }), "192.0.2.13");
    expect(res.status).toBe(400);
    const json = await res.json();
    expect(json.error).toMatch(/claims/);
    expect(Array.isArray(json.details)).toBe(true);
  });

  it("answers 400 naming the field when the tolerance is refused, never 500 (contract version 2)", async () => {
    for (const [tolerance, field] of [
      [{ relative: 0.5 }, "tolerance.relative"],
      [{ relative: -0.01 }, "tolerance.relative"],
      [{ absolute: { km: -1 } }, "tolerance.absolute.km"],
    ] as const) {
      const res = await post(JSON.stringify({ tolerance, claims: CONTRACT.claims }), "192.0.2.15");
      expect(res.status).toBe(400);
      const json = await res.json();
      expect(json.error).toContain(field);
      expect(json.notice).toMatch(/screening estimates/);
    }
    // 1e400 is legal JSON that parses to Infinity.
    const inf = await post('{"tolerance":{"relative":1e400},"claims":[]}', "192.0.2.15");
    expect(inf.status).toBe(400);
    expect((await inf.json()).error).toMatch(/tolerance\.relative: the relative bound must be a finite number/);
  });

  it("carries the notice, allowance, basis and hints; claimed decimal strings keep their digits", async () => {
    const res = await post(
      JSON.stringify({
        claims: [
          { id: "geo", kind: "orbit", body: "earth", given: { semiMajorAxis: 42164, eccentricity: 0 }, claimed: { period: 86400 } },
          { id: "digits", kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: "5.7e3" } },
          { id: "unit", kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: "3.9 km/s" } },
        ],
      }),
      "192.0.2.16",
    );
    expect(res.status).toBe(200);
    const json = await res.json();
    expect(json.contractVersion).toBe(2);
    expect(json.notice).toMatch(/not flight-qualified analysis/);
    expect(json.results.map((r: { status: string }) => r.status)).toEqual(["inconsistent", "consistent", "invalid"]);
    expect(json.results[0].checks[0]).toMatchObject({ basis: "relative", ok: false, hint: { code: "solar-day" } });
    expect(json.results[1].checks[0]).toMatchObject({ claimed: "5.7e3", basis: "precision", allowance: 50, ok: true });
    expect(json.results[2].messages[0]).toMatch(/^claimed\.period is not a plain decimal/);
  });

  it("every answer carries the notice, errors included", async () => {
    const bad = await post("{ claims: [", "192.0.2.17");
    expect(bad.status).toBe(400);
    expect((await bad.json()).notice).toMatch(/screening estimates/);
  });

  it("answers 413 with a JSON message for a body above 256 KB", async () => {
    const big = JSON.stringify({ claims: [], padding: "x".repeat(300 * 1024) });
    const res = await post(big, "192.0.2.14");
    expect(res.status).toBe(413);
    expect((await res.json()).error).toMatch(/larger than 256 KB/);
  });

  it("rate limits a client at 60 requests a minute with 429 and Retry-After", async () => {
    const client = `198.51.100.${Math.floor(Math.random() * 200) + 20}`;
    let limited: Response | undefined;
    for (let i = 0; i < 70 && !limited; i++) {
      const res = await post(JSON.stringify({ claims: [] }), client);
      if (res.status === 429) limited = res;
      else expect(res.status).toBe(200);
    }
    expect(limited).toBeDefined();
    expect(Number(limited!.headers.get("retry-after"))).toBeGreaterThan(0);
    expect((await limited!.json()).error).toMatch(/Too many orbit-check requests/);
    // Another client is unaffected.
    expect((await post(JSON.stringify(CONTRACT), "192.0.2.15")).status).toBe(200);
  });

  it("counts the limit in PostgreSQL, so every app instance sees the same window", async () => {
    const client = `203.0.113.${Math.floor(Math.random() * 200) + 20}`;
    const key = `orbit-check:client:${client}`;
    await db().delete(rateLimitBuckets).where(eq(rateLimitBuckets.key, key));
    for (let i = 0; i < 60; i++) expect((await post(JSON.stringify({ claims: [] }), client)).status).toBe(200);
    expect((await post(JSON.stringify({ claims: [] }), client)).status).toBe(429);
    const [row] = await db().select({ count: rateLimitBuckets.count }).from(rateLimitBuckets).where(eq(rateLimitBuckets.key, key));
    expect(row?.count).toBe(61);
    // The decision is the database's: closing the window there lets the client in at once.
    await db()
      .update(rateLimitBuckets)
      .set({ windowStart: new Date(Date.now() - 120_000) })
      .where(eq(rateLimitBuckets.key, key));
    const again = await post(JSON.stringify(CONTRACT), client);
    expect(again.status).toBe(200);
    expect(again.headers.get("x-ratelimit-remaining")).toBe("59");
  });
});
