import { describe, expect, it } from "vitest";
import { parseWrittenDate } from "./parse-date";

const iso = (text: string, edge: "start" | "end" = "start") => {
  const r = parseWrittenDate(text, edge);
  return r.ok ? r.date.toISOString() : r.error;
};

describe("parseWrittenDate", () => {
  it("reads the ways people write a date, in UTC", () => {
    expect(iso("12 Dec 2026")).toBe("2026-12-12T00:00:00.000Z");
    expect(iso("12 December 2026 14:30")).toBe("2026-12-12T14:30:00.000Z");
    expect(iso("Dec 12, 2026")).toBe("2026-12-12T00:00:00.000Z");
    expect(iso("sept 3 2027")).toBe("2027-09-03T00:00:00.000Z");
    expect(iso("2026-12-12")).toBe("2026-12-12T00:00:00.000Z");
    expect(iso("2026-12-12 09:05 UTC")).toBe("2026-12-12T09:05:00.000Z");
    expect(iso("12/11/2026")).toBe("2026-11-12T00:00:00.000Z");
    expect(iso("2026-12-12T10:00:00+02:00")).toBe("2026-12-12T08:00:00.000Z");
    // What formatDateTime prints reads back.
    expect(iso("2 Dec 2026, 14:52 UTC")).toBe("2026-12-02T14:52:00.000Z");
  });

  it("takes a bare end date as the last minute of that day", () => {
    expect(iso("26 Dec 2026", "end")).toBe("2026-12-26T23:59:00.000Z");
    expect(iso("26 Dec 2026 12:00", "end")).toBe("2026-12-26T12:00:00.000Z");
  });

  it("refuses what is not a date with a sentence saying what to write", () => {
    expect(iso("31 Feb 2026")).toMatch(/^31 is not a day of that month\. Write a date such as/);
    expect(iso("12 Smarch 2026")).toMatch(/"Smarch" is not a month/);
    expect(iso("2026-13-01")).toMatch(/no month 13/);
    expect(iso("12 Dec 2026 25:00")).toMatch(/25:00 is not a time of day/);
    expect(iso("")).toMatch(/^Enter a date/);
    expect(iso("tomorrow")).toMatch(/is not a date we can read/);
    expect(iso("x".repeat(61))).toMatch(/too long/);
  });
});
