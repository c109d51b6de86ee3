import { describe, expect, it } from "vitest";
import { isMalformedCallbackUrl, safeRedirect } from "./callback-url";

describe("next-auth callbackUrl (issue 17: a malformed one gave a 500)", () => {
  it("calls malformed what no URL parser accepts or what carries control characters or backslashes", () => {
    for (const bad of ["http://[", "https://exa mple.org:99999/", "/\\evil.example", "/boards\u0000", "http://%zz"]) {
      expect(isMalformedCallbackUrl(bad), JSON.stringify(bad)).toBe(true);
    }
    for (const fine of [null, "", "/boards", "http://127.0.0.1:3000/boards?x=1", "https://elsewhere.example/"]) {
      expect(isMalformedCallbackUrl(fine), JSON.stringify(fine)).toBe(false);
    }
  });

  it("redirects only within the site", () => {
    const base = "http://127.0.0.1:3000";
    expect(safeRedirect("/boards", base)).toBe("http://127.0.0.1:3000/boards");
    expect(safeRedirect("http://127.0.0.1:3000/account", base)).toBe("http://127.0.0.1:3000/account");
    expect(safeRedirect("https://elsewhere.example/", base)).toBe(base);
    expect(safeRedirect("//elsewhere.example/", base)).toBe(base);
    expect(safeRedirect("http://[", base)).toBe(base);
  });
});
