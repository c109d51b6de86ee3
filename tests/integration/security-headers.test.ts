// Every page carries a Content-Security-Policy with a fresh nonce, and every script the page
// itself brings carries that nonce; route handlers answer JSON without one.
import { beforeAll, describe, expect, it } from "vitest";
import { appUrl } from "../support/app";
import { createBoardWithCast } from "../support/factories";
import { signedIn } from "../support/http";

let base = "";

beforeAll(async () => {
  base = await appUrl();
});

function nonceOf(policy: string | null): string {
  const m = /'nonce-([^']+)'/.exec(policy ?? "");
  if (!m) throw new Error(`no nonce in the policy: ${policy}`);
  return m[1]!;
}

function scriptNonces(html: string): (string | null)[] {
  return [...html.matchAll(/<script\b[^>]*>/g)].map((m) => /\snonce="([^"]*)"/.exec(m[0])?.[1] ?? null);
}

describe("the pages' Content-Security-Policy", () => {
  it("puts a fresh nonce on every public page and on each of its scripts", async () => {
    const seen = new Set<string>();
    for (const path of ["/", "/sign-in", "/tools/orbit-check", "/sign-in"]) {
      const res = await fetch(`${base}${path}`);
      expect(res.status).toBe(200);
      const policy = res.headers.get("content-security-policy");
      expect(policy).toContain("default-src 'self'");
      expect(policy).toContain("'strict-dynamic'");
      expect(policy).toContain("object-src 'none'");
      expect(policy).toContain("frame-ancestors 'none'");
      expect(policy).not.toContain("unsafe-eval");
      // Presigned uploads and downloads reach the object store from the browser.
      expect(policy).toMatch(/connect-src 'self' http:\/\/127\.0\.0\.1:\d+/);
      const nonce = nonceOf(policy);
      expect(seen.has(nonce)).toBe(false);
      seen.add(nonce);
      const nonces = scriptNonces(await res.text());
      expect(nonces.length).toBeGreaterThan(0);
      expect(nonces.every((n) => n === nonce)).toBe(true);
    }
  });

  it("covers signed-in pages too, and leaves JSON routes alone", async () => {
    const cast = await createBoardWithCast();
    const chair = await signedIn(cast.chair.email);
    const res = await chair.get(`/boards/${cast.board.id}`);
    expect(res.status).toBe(200);
    const nonce = nonceOf(res.headers.get("content-security-policy"));
    expect(scriptNonces(await res.text()).every((n) => n === nonce)).toBe(true);
    const api = await fetch(`${base}/api/health`);
    expect(api.headers.get("content-security-policy")).toBeNull();
  });
});
