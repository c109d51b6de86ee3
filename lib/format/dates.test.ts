import { describe, expect, it } from "vitest";
import { formatDate, formatDateTime, formatTime, formatWait } from "./dates";

describe("date formatting", () => {
  it("writes day, month, year and a 24-hour UTC clock, with the zone", () => {
    expect(formatDateTime("2026-12-02T14:52:09.123Z")).toBe("2 Dec 2026, 14:52 UTC");
    expect(formatDateTime(new Date("2026-09-04T03:05:00Z"))).toBe("4 Sep 2026, 03:05 UTC");
    expect(formatDate("2026-01-31T23:59:59Z")).toBe("31 Jan 2026 (UTC)");
    expect(formatTime(Date.UTC(2026, 11, 2, 7, 8, 9))).toBe("07:08:09 UTC");
  });

  it("uses UTC whatever offset the input carries", () => {
    expect(formatDateTime("2026-12-03T01:30:00+02:00")).toBe("2 Dec 2026, 23:30 UTC");
  });

  it("words a wait as a person says it", () => {
    expect(formatWait(887)).toBe("in about 15 minutes");
    expect(formatWait(900)).toBe("in about 15 minutes");
    expect(formatWait(59)).toBe("in under a minute");
    expect(formatWait(75)).toBe("in about a minute");
    expect(formatWait(2 * 3600 + 100)).toBe("in about 2 hours");
    expect(formatWait(3 * 86400)).toBe("in about 3 days");
  });

  it("says so when the value is not a date", () => {
    expect(formatDateTime("not a date")).toBe("unknown date");
    expect(formatDate(Number.NaN)).toBe("unknown date");
    expect(formatTime("")).toBe("unknown time");
  });
});
