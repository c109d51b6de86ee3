/**
 * TAI, TT and UTC: the leap-second table and TT = TAI + 32.184 s against published values.
 */
import { describe, expect, it } from "vitest";
import { LEAP_SECONDS, fromUtc, julianCenturiesTT, taiMinusUtc, toUtc } from "./time-scales";

describe("time scales", () => {
  it("TAI − UTC: 10 s in 1972, 32 s in 2004, 37 s since 2017 (IERS Bulletin C; recalled from memory)", () => {
    expect(taiMinusUtc(Date.UTC(1972, 0, 1))).toBe(10);
    expect(taiMinusUtc(Date.UTC(2004, 3, 6))).toBe(32);
    expect(taiMinusUtc(Date.UTC(2016, 11, 31, 23, 59, 59))).toBe(36);
    expect(taiMinusUtc(Date.UTC(2017, 0, 1))).toBe(37);
    expect(taiMinusUtc(Date.UTC(1971, 11, 31))).toBeNull();
    // GPS time = TAI − 19 s (ICD-GPS-200) and GPS − UTC = 18 s since 2017-01-01 (published in every GPS navigation message since).
    expect(taiMinusUtc(Date.UTC(2026, 2, 1))! - 19).toBe(18);
    // 27 leap seconds were inserted after the initial 10 s (IERS: 27 positive leap seconds 1972–2016).
    expect(LEAP_SECONDS.length - 1).toBe(27);
  });

  it("TT = TAI + 32.184 s and TT − UTC = 64.184 s in 2004 (Vallado, Fundamentals 4th ed., Example 3-15: TT 07:52:32.570009 for UTC 07:51:28.386009; recalled from memory)", () => {
    const utc = Date.parse("2004-04-06T07:51:28.386Z");
    const tt = fromUtc(utc, "TT");
    expect(tt).toEqual({ ok: true, ms: Date.parse("2004-04-06T07:52:32.570Z"), note: null });
    expect(toUtc(Date.parse("2004-04-06T07:52:32.570Z"), "TT")).toEqual({ ok: true, ms: utc, note: null });
    expect(toUtc(Date.parse("2004-04-06T07:52:00.386Z"), "TAI")).toEqual({ ok: true, ms: utc, note: null });
  });

  it("crosses a leap second: TAI 2017-01-01 00:00:36 is UTC 2016-12-31 23:59:60, shown as the first second of 2017", () => {
    expect(toUtc(Date.parse("2017-01-01T00:00:35.000Z"), "TAI")).toMatchObject({ ok: true, ms: Date.parse("2016-12-31T23:59:59.000Z") });
    expect(toUtc(Date.parse("2017-01-01T00:00:37.000Z"), "TAI")).toMatchObject({ ok: true, ms: Date.parse("2017-01-01T00:00:00.000Z") });
    // UTC and back agree on both sides.
    for (const iso of ["2016-12-31T23:59:58.500Z", "2017-01-01T00:00:01.250Z", "2026-03-01T12:00:00.000Z"]) {
      const ms = Date.parse(iso);
      const tai = fromUtc(ms, "TAI");
      if (!tai.ok) throw new Error(tai.message);
      expect(toUtc(tai.ms, "TAI")).toMatchObject({ ok: true, ms });
    }
  });

  it("says when an epoch lies past the table's known end, and refuses epochs before 1972", () => {
    const late = toUtc(Date.parse("2026-03-01T12:01:09.184Z"), "TT");
    expect(late).toMatchObject({ ok: true, ms: Date.parse("2026-03-01T12:00:00.000Z") });
    expect(late.ok && late.note).toMatch(/^The leap-second table is known to be complete until 2025-12-31/);
    expect(toUtc(Date.parse("1965-01-01T00:00:00Z"), "TAI")).toEqual({
      ok: false,
      message: "the epoch is before 1972-01-01 UTC, when UTC had no whole-second offset from TAI; give it in UTC",
    });
    expect(julianCenturiesTT(Date.parse("1960-01-01T00:00:00Z"))).toBeNull();
  });

  it("J2000.0 is 2000-01-01 11:58:55.816 UTC (TT 12:00:00; TAI − UTC = 32 s; Vallado, Fundamentals 4th ed., §3.5; recalled from memory)", () => {
    expect(julianCenturiesTT(Date.parse("2000-01-01T11:58:55.816Z"))).toBeCloseTo(0, 14);
  });
});
