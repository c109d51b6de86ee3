/**
 * Shared limits and helpers of the orbit-file parsers. Every parser stops at the first
 * problem with a ParseStop (caught by the entry points, never escaping them).
 */
import { ACCEPTED_FRAMES, ACCEPTED_TIME_SYSTEMS, ELEMENT_SET_FRAMES, type Epoch, type ParseError } from "./types";

export const LIMITS = {
  /** Characters of text a parser reads at all. */
  maxChars: 8 * 1024 * 1024,
  /** Lines of text. */
  maxLines: 200_000,
  /** Two-line element sets in one file. */
  maxElementSets: 5_000,
  /** OEM segments in one file. */
  maxSegments: 200,
  /** States kept per OEM segment (first and last included). */
  oemSampleStates: 50,
  /** Covariance matrices kept per OEM segment (first and last included); all are checked. */
  oemSampleCovariances: 10,
  /** KVN line length (CCSDS 502.0-B-2 limits ODM lines to 254 characters; recalled from memory). */
  maxKvnLineChars: 254,
  /** XML nesting depth. */
  maxXmlDepth: 12,
  /** Wall-clock budget for one parse, ms (a guard; files within the caps take far less). */
  maxMillis: 3_000,
} as const;

export class ParseStop extends Error {
  constructor(
    public readonly line: number | null,
    message: string,
  ) {
    super(message);
  }
  toParseError(): ParseError {
    return { line: this.line, message: this.line === null ? this.message : `line ${this.line}: ${this.message}` };
  }
}

export function stop(line: number | null, message: string): never {
  throw new ParseStop(line, message);
}

/** A deadline checked every so often inside loops. */
export function deadline(ms: number = LIMITS.maxMillis): () => void {
  const until = Date.now() + ms;
  let n = 0;
  return () => {
    n += 1;
    if (n % 512 === 0 && Date.now() > until) stop(null, `parsing took longer than ${ms / 1000} s; the file is too large or too complex to read here`);
  };
}

/**
 * Splits text into lines after the whole-file checks: size, ASCII only (these formats are
 * ASCII by definition), and the line cap. Returns lines without their line ends.
 */
export function asciiLines(text: string, what: string): string[] {
  if (typeof text !== "string") stop(null, "no text to read");
  if (text.length > LIMITS.maxChars) stop(null, `the file has ${text.length} characters; ${what} files are read up to ${LIMITS.maxChars} characters`);
  let start = 0;
  if (text.charCodeAt(0) === 0xfeff) start = 1;
  let line = 1;
  let col = 1;
  for (let i = start; i < text.length; i += 1) {
    const c = text.charCodeAt(i);
    if (c === 10) {
      line += 1;
      col = 1;
      if (line > LIMITS.maxLines) stop(null, `the file has more than ${LIMITS.maxLines} lines; split it into smaller files`);
      continue;
    }
    if (c > 126 || (c < 32 && c !== 9 && c !== 13)) {
      const code = c.toString(16).toUpperCase().padStart(4, "0");
      stop(line, `column ${col}: character U+${code} is not plain ASCII; ${what} files hold ASCII text only`);
    }
    col += 1;
  }
  const lines = text.slice(start).split("\n");
  for (let i = 0; i < lines.length; i += 1) if (lines[i]!.endsWith("\r")) lines[i] = lines[i]!.slice(0, -1);
  return lines;
}

const DAY_MS = 86_400_000;

/**
 * A CCSDS epoch: YYYY-MM-DDThh:mm:ss[.d…][Z] or YYYY-DDDThh:mm:ss[.d…][Z] (CCSDS 502.0-B-2
 * section 7.5.10, the ASCII time code formats of CCSDS 301.0-B; recalled from memory).
 */
export function parseCcsdsEpoch(text: string, line: number | null, keyword: string): Epoch {
  const t = text.trim();
  const m = /^(\d{4})-(?:(\d{2})-(\d{2})|(\d{3}))T(\d{2}):(\d{2}):(\d{2}(?:\.\d{1,12})?)Z?$/.exec(t);
  if (!m) stop(line, `${keyword} "${clip(t)}" is not a date and time like 2026-03-14T09:30:00.000 or 2026-073T09:30:00`);
  const year = Number(m[1]);
  let ms: number;
  const hh = Number(m[5]);
  const mi = Number(m[6]);
  const ss = Number(m[7]);
  if (hh > 23 || mi > 59 || ss >= 61) stop(line, `${keyword} "${t}" has a time of day out of range`);
  if (m[4] !== undefined) {
    const doy = Number(m[4]);
    const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
    if (doy < 1 || doy > (leap ? 366 : 365)) stop(line, `${keyword} "${t}" has day of year ${doy}, outside 1–${leap ? 366 : 365}`);
    ms = Date.UTC(year, 0, 1) + (doy - 1) * DAY_MS;
  } else {
    const month = Number(m[2]);
    const day = Number(m[3]);
    const base = Date.UTC(year, month - 1, day);
    if (month < 1 || month > 12 || new Date(base).getUTCDate() !== day) stop(line, `${keyword} "${t}" is not a calendar date`);
    ms = base;
  }
  ms += ((hh * 60 + mi) * 60 + ss) * 1000;
  return { text: t, iso: isoOf(ms), ms };
}

export function isoOf(ms: number): string {
  return new Date(Math.round(ms)).toISOString().replace("Z", "");
}

export function clip(s: string, n = 40): string {
  return s.length > n ? `${s.slice(0, n)}…` : s;
}

export function checkFrame(frame: string, line: number | null, allowTeme: boolean, keyword = "REF_FRAME"): string {
  const f = frame.trim().toUpperCase();
  const ok = (ACCEPTED_FRAMES as readonly string[]).includes(f) || (allowTeme && (ELEMENT_SET_FRAMES as readonly string[]).includes(f));
  if (!ok) {
    const list = allowTeme ? "EME2000 (J2000), GCRF or TEME" : "EME2000 (J2000) or GCRF (TEME only for element sets)";
    stop(line, `${keyword} ${clip(f)} is not accepted; use ${list}`);
  }
  return f;
}

export function checkTimeSystem(ts: string, line: number | null): string {
  const t = ts.trim().toUpperCase();
  if (!(ACCEPTED_TIME_SYSTEMS as readonly string[]).includes(t)) stop(line, `TIME_SYSTEM ${clip(t)} is not accepted; use UTC, TAI or TT`);
  return t;
}

/** A finite decimal number (Fortran-style exponents such as 1.0D-3 are not CCSDS). */
export function parseNumber(text: string, line: number | null, keyword: string): number {
  const t = text.trim();
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) stop(line, `${keyword} "${clip(t)}" is not a number`);
  const x = Number(t);
  if (!Number.isFinite(x)) stop(line, `${keyword} "${clip(t)}" is out of range`);
  return x;
}
