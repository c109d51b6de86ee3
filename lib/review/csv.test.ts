import { describe, expect, it } from "vitest";
import { csvCell } from "./csv";

describe("CSV cells (issue 17: formula injection)", () => {
  it("neutralises every text cell that starts with = + - @ tab or carriage return", () => {
    expect(csvCell('=HYPERLINK("http://x")')).toBe(`"'=HYPERLINK(""http://x"")"`);
    expect(csvCell("+1+cmd")).toBe("'+1+cmd");
    expect(csvCell("-1+cmd|' /C calc'!A0")).toBe("'-1+cmd|' /C calc'!A0");
    expect(csvCell("-2")).toBe("'-2");
    expect(csvCell("@SUM(A1)")).toBe("'@SUM(A1)");
    expect(csvCell("\t=1")).toBe("'\t=1");
    expect(csvCell("\r=1")).toBe(`"'\r=1"`);
  });

  it("keeps numbers, plain text and empty cells", () => {
    expect(csvCell(-0.25)).toBe("-0.25");
    expect(csvCell(3)).toBe("3");
    expect(csvCell("Lantern, phase A")).toBe(`"Lantern, phase A"`);
    expect(csvCell(null)).toBe("");
  });
});
