import { describe, expect, it } from "vitest";
import { containsNul, pathIsMalformed, urlContainsNul } from "./nul";

describe("NUL detection (issue 17)", () => {
  it("finds NUL in strings, keys, arrays, nested objects and form data", () => {
    expect(containsNul("a\u0000b")).toBe(true);
    expect(containsNul({ a: [{ b: "x\u0000" }] })).toBe(true);
    expect(containsNul({ "k\u0000": 1 })).toBe(true);
    const form = new FormData();
    form.set("name", "Ada\u0000");
    expect(containsNul(form)).toBe(true);
    expect(containsNul({ a: "ok", b: [1, null, true, "\u0001"] })).toBe(false);
  });

  it("finds path segments that do not decode (found by the fuzz test: Next answered 500)", () => {
    expect(pathIsMalformed("/api/v1/boards/%ED%A0%80")).toBe(true);
    expect(pathIsMalformed("/api/v1/boards/%E0%A4%A")).toBe(true);
    expect(pathIsMalformed("/api/v1/boards/100%")).toBe(true);
    expect(pathIsMalformed("/api/v1/boards/%F0%9F%9A%80/x%20y")).toBe(false);
  });

  it("finds encoded NUL in URLs", () => {
    expect(urlContainsNul("http://x/api/v1/boards/%00")).toBe(true);
    expect(urlContainsNul("http://x/admin/audit?q=a%00b")).toBe(true);
    expect(urlContainsNul("http://x/admin/audit?q=100%25")).toBe(false);
  });
});
