import { describe, expect, it } from "vitest";
import { safeHref } from "./schema";

describe("dossier link sanitiser (issue 17: /\\host/path left the site)", () => {
  it("refuses paths a browser would read as another host", () => {
    for (const href of ["/\\evil.example/path", "/\\\\evil.example", "//evil.example", "/\t/evil.example", "/\n/evil.example", "\\\\evil.example"]) {
      expect(safeHref(href), JSON.stringify(href)).toBeUndefined();
    }
  });

  it("keeps same-site paths, fragments and http(s)/mailto links", () => {
    expect(safeHref("/boards/x?tab=1#a")).toBe("/boards/x?tab=1#a");
    expect(safeHref("#section-2")).toBe("#section-2");
    expect(safeHref("https://example.org/a")).toBe("https://example.org/a");
    expect(safeHref("mailto:chair@example.org")).toBe("mailto:chair@example.org");
    expect(safeHref("javascript:alert(1)")).toBeUndefined();
  });
});
