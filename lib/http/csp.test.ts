import { describe, expect, it } from "vitest";
import { contentSecurityPolicy } from "./csp";

describe("contentSecurityPolicy", () => {
  it("allows scripts by nonce only, and the object store for uploads and images", () => {
    const policy = contentSecurityPolicy("abc123", { objectStore: "https://store.example.org" });
    const directives = Object.fromEntries(policy.split("; ").map((d) => [d.split(" ")[0], d.split(" ").slice(1)]));
    expect(directives["script-src"]).toEqual(["'self'", "'nonce-abc123'", "'strict-dynamic'"]);
    expect(directives["connect-src"]).toEqual(["'self'", "https://store.example.org"]);
    expect(directives["img-src"]).toContain("https://store.example.org");
    expect(directives["object-src"]).toEqual(["'none'"]);
    expect(directives["frame-ancestors"]).toEqual(["'none'"]);
  });

  it("adds eval for the development server only", () => {
    expect(contentSecurityPolicy("n", { development: true })).toContain("'unsafe-eval'");
    expect(contentSecurityPolicy("n")).not.toContain("'unsafe-eval'");
    expect(contentSecurityPolicy("n")).toContain("connect-src 'self';");
  });
});
