/**
 * Time scales of orbit files: UTC, TAI and TT. Epochs are carried as milliseconds of a
 * calendar without leap seconds (the form the orbit-file parsers produce), one count per
 * scale; these functions move an epoch between scales with the leap-second table.
 * Pure: no I/O, the same in browser and server.
 */

export type TimeScale = "UTC" | "TAI" | "TT";

const DAY_MS = 86_400_000;

/**
 * TAI − UTC in whole seconds from each date (0 h UTC) on, since UTC took whole-second steps.
 * Source: IERS Bulletin C (the leap-second announcements) and the IERS/USNO table of TAI − UTC
 * (tai-utc.dat); values as published, typed here from that table (recalled from memory, and
 * cross-checked in time-scales.test.ts against GPS − UTC = 18 s since 2017, GPS = TAI − 19 s,
 * ICD-GPS-200).
 */
export const LEAP_SECONDS: readonly { from: string; taiMinusUtc: number }[] = [
  { from: "1972-01-01", taiMinusUtc: 10 },
  { from: "1972-07-01", taiMinusUtc: 11 },
  { from: "1973-01-01", taiMinusUtc: 12 },
  { from: "1974-01-01", taiMinusUtc: 13 },
  { from: "1975-01-01", taiMinusUtc: 14 },
  { from: "1976-01-01", taiMinusUtc: 15 },
  { from: "1977-01-01", taiMinusUtc: 16 },
  { from: "1978-01-01", taiMinusUtc: 17 },
  { from: "1979-01-01", taiMinusUtc: 18 },
  { from: "1980-01-01", taiMinusUtc: 19 },
  { from: "1981-07-01", taiMinusUtc: 20 },
  { from: "1982-07-01", taiMinusUtc: 21 },
  { from: "1983-07-01", taiMinusUtc: 22 },
  { from: "1985-07-01", taiMinusUtc: 23 },
  { from: "1988-01-01", taiMinusUtc: 24 },
  { from: "1990-01-01", taiMinusUtc: 25 },
  { from: "1991-01-01", taiMinusUtc: 26 },
  { from: "1992-07-01", taiMinusUtc: 27 },
  { from: "1993-07-01", taiMinusUtc: 28 },
  { from: "1994-07-01", taiMinusUtc: 29 },
  { from: "1996-01-01", taiMinusUtc: 30 },
  { from: "1997-07-01", taiMinusUtc: 31 },
  { from: "1999-01-01", taiMinusUtc: 32 },
  { from: "2006-01-01", taiMinusUtc: 33 },
  { from: "2009-01-01", taiMinusUtc: 34 },
  { from: "2012-07-01", taiMinusUtc: 35 },
  { from: "2015-07-01", taiMinusUtc: 36 },
  { from: "2017-01-01", taiMinusUtc: 37 },
];

/**
 * The last day the table is known to hold every leap second: IERS Bulletin C announced none
 * after 2017-01-01 up to the end of 2025 (recalled from memory). A later epoch is converted
 * with the last offset and its summary says the table may be out of date.
 */
export const LEAP_SECONDS_KNOWN_UNTIL = "2025-12-31";

// TT = TAI + 32.184 s exactly (IAU 1991 Resolution A4, Recommendation IV; IERS Conventions 2010, §1.2).
export const TT_MINUS_TAI_S = 32.184;

const TABLE = LEAP_SECONDS.map((e) => ({ fromMs: Date.parse(`${e.from}T00:00:00Z`), offsetMs: e.taiMinusUtc * 1000 }));
const FIRST_MS = TABLE[0]!.fromMs;
const KNOWN_UNTIL_MS = Date.parse(`${LEAP_SECONDS_KNOWN_UNTIL}T00:00:00Z`) + DAY_MS;

/** TAI − UTC (s) at a UTC epoch, or null before 1972 (UTC then had no whole-second offset). */
export function taiMinusUtc(utcMs: number): number | null {
  if (!Number.isFinite(utcMs) || utcMs < FIRST_MS) return null;
  for (let i = TABLE.length - 1; i >= 0; i--) if (utcMs >= TABLE[i]!.fromMs) return TABLE[i]!.offsetMs / 1000;
  return null;
}

export type ConvertedEpoch = { ok: true; ms: number; note: string | null } | { ok: false; message: string };

function afterTableNote(utcMs: number): string | null {
  return utcMs >= KNOWN_UNTIL_MS
    ? `The leap-second table is known to be complete until ${LEAP_SECONDS_KNOWN_UNTIL}; a leap second announced after it would move this UTC epoch by 1 s.`
    : null;
}

/** An epoch of one scale in UTC (ms of a calendar without leap seconds). */
export function toUtc(ms: number, scale: TimeScale): ConvertedEpoch {
  if (!Number.isFinite(ms)) return { ok: false, message: "the epoch is not a date" };
  if (scale === "UTC") return { ok: true, ms, note: null };
  const tai = scale === "TT" ? ms - TT_MINUS_TAI_S * 1000 : ms;
  // UTC = TAI − (TAI − UTC); the offset is the one in force at the resulting UTC. The inserted
  // second itself (23:59:60 UTC) has no place in a calendar without leap seconds and comes out
  // as the first second of the next day.
  for (let i = TABLE.length - 1; i >= 0; i--) {
    const utc = tai - TABLE[i]!.offsetMs;
    if (utc >= TABLE[i]!.fromMs) return { ok: true, ms: utc, note: afterTableNote(utc) };
  }
  return { ok: false, message: `the epoch is before 1972-01-01 UTC, when UTC had no whole-second offset from ${scale}; give it in UTC` };
}

/** A UTC epoch in another scale. */
export function fromUtc(utcMs: number, scale: TimeScale): ConvertedEpoch {
  if (!Number.isFinite(utcMs)) return { ok: false, message: "the epoch is not a date" };
  if (scale === "UTC") return { ok: true, ms: utcMs, note: null };
  const dat = taiMinusUtc(utcMs);
  if (dat === null) return { ok: false, message: "the epoch is before 1972-01-01 UTC, when UTC had no whole-second offset from TAI" };
  const tai = utcMs + dat * 1000;
  return { ok: true, ms: scale === "TT" ? tai + TT_MINUS_TAI_S * 1000 : tai, note: afterTableNote(utcMs) };
}

// Julian date of 1970-01-01T00:00 is 2440587.5 (Meeus, Astronomical Algorithms 2nd ed., ch. 7).
const JD_UNIX_EPOCH = 2_440_587.5;
// J2000.0 = JD 2451545.0 TT (IAU 1976; Vallado, Fundamentals of Astrodynamics and Applications 4th ed., eq. 3-42).
const JD_J2000 = 2_451_545.0;

/** Julian centuries of TT since J2000.0 at a UTC epoch (TT from the leap-second table); null before 1972. */
export function julianCenturiesTT(utcMs: number): number | null {
  const tt = fromUtc(utcMs, "TT");
  if (!tt.ok) return null;
  // T_TT = (JD_TT − 2451545.0) / 36525 (Vallado, Fundamentals 4th ed., eq. 3-42).
  return (tt.ms / DAY_MS + JD_UNIX_EPOCH - JD_J2000) / 36_525;
}
