/**
 * Two-line element sets: the column layout of the element-set format (as documented with
 * the SGP4 reference implementation, Vallado et al. 2006, "Revisiting Spacetrack Report #3",
 * AIAA 2006-6753, Appendix), the modulo-10 checksum per line, and satellite.js (the npm
 * SGP4 library) to initialise each set. An optional name line may precede each pair.
 */
import { sgp4, twoline2satrec } from "satellite.js";
import { LIMITS, ParseStop, asciiLines, clip, deadline, isoOf, stop } from "./common";
import type { ParseOutcome, TleFile, TleSet } from "./types";

/** The element-set checksum: digits add their value, a minus sign adds 1, modulo 10. */
export function tleChecksum(line: string): number {
  let s = 0;
  for (let i = 0; i < 68 && i < line.length; i += 1) {
    const ch = line[i]!;
    if (ch >= "0" && ch <= "9") s += ch.charCodeAt(0) - 48;
    else if (ch === "-") s += 1;
  }
  return s % 10;
}

/** Columns (1-based, inclusive) that must be blank on each line. */
const BLANKS: Record<1 | 2, number[]> = { 1: [2, 9, 18, 33, 44, 53, 62, 64], 2: [2, 8, 17, 26, 34, 43, 52] };

const col = (line: string, from: number, to: number) => line.slice(from - 1, to);

function field(line: string, lineNo: number, from: number, to: number, name: string, pattern: RegExp): string {
  const raw = col(line, from, to);
  if (!pattern.test(raw)) stop(lineNo, `columns ${from}–${to} (${name}) hold "${raw}", which is not a valid ${name}`);
  return raw.trim();
}

/** "12345-5" → 0.12345e-5 (the assumed-decimal-point exponent fields of line 1). */
function impliedDecimal(raw: string): number {
  const m = /^([+-]?)(\d{5})([ +-])(\d)$/.exec(raw.replace(/^ /, ""));
  if (!m) return 0;
  return Number(`${m[1]}0.${m[2]}e${m[3] === "-" ? "-" : "+"}${m[4]}`);
}

const NUM = /^ *[+-]?\d*\.?\d+ *$/;
const DECIMAL_EXP = /^[ +-]\d{5}[ +-]\d$/;
const CATNUM = /^[0-9A-Z]\d{4}$/;
const SAT_NUM_FIELD = /^(?:[ 0-9A-Z]{1}\d{4}|\s*\d{1,5})$/;

function checkLine(line: string, lineNo: number, which: 1 | 2): void {
  if (line.length !== 69) {
    const trunc = line.length < 69 ? "it is cut short" : "it is too long";
    stop(lineNo, `element-set line ${which} has ${line.length} characters; it must have 69 (${trunc})`);
  }
  for (const c of BLANKS[which]) if (line[c - 1] !== " ") stop(lineNo, `column ${c} must be blank in line ${which} of an element set, found "${line[c - 1]}"`);
  const given = line[68]!;
  if (!/\d/.test(given)) stop(lineNo, `checksum "${given}" is not a digit`);
  const expected = tleChecksum(line);
  if (Number(given) !== expected) stop(lineNo, `checksum ${given} expected ${expected}`);
}

function parseSet(name: string | null, l1: string, l2: string, n1: number): TleSet {
  const n2 = n1 + 1;
  checkLine(l1, n1, 1);
  checkLine(l2, n2, 2);
  const cat1 = field(l1, n1, 3, 7, "catalogue number", SAT_NUM_FIELD);
  const cat2 = field(l2, n2, 3, 7, "catalogue number", SAT_NUM_FIELD);
  if (cat1.padStart(5, "0") !== cat2.padStart(5, "0")) stop(n2, `catalogue number ${cat2} differs from ${cat1} on line ${n1}`);
  if (!CATNUM.test(cat1.padStart(5, "0"))) stop(n1, `catalogue number "${cat1}" is not valid`);
  const classification = field(l1, n1, 8, 8, "classification", /^[A-Z ]$/);
  const intl = col(l1, 10, 17).trim();
  const yy = Number(field(l1, n1, 19, 20, "epoch year", /^\d\d$/));
  const dayText = field(l1, n1, 21, 32, "epoch day", /^[ \d]{3}\.\d{8}$/);
  const day = Number(dayText);
  const year = yy < 57 ? 2000 + yy : 1900 + yy;
  const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
  if (!(day >= 1 && day < (leap ? 367 : 366))) stop(n1, `epoch day ${dayText.trim()} is outside the year ${year}`);
  const ndot = Number(field(l1, n1, 34, 43, "mean motion derivative", NUM));
  const nddotRaw = field(l1, n1, 45, 52, "second derivative of mean motion", DECIMAL_EXP);
  const bstarRaw = field(l1, n1, 54, 61, "B* drag term", DECIMAL_EXP);
  const setNo = field(l1, n1, 65, 68, "element set number", /^ *\d{0,4}$/);
  const incl = Number(field(l2, n2, 9, 16, "inclination", NUM));
  const raan = Number(field(l2, n2, 18, 25, "right ascension of the ascending node", NUM));
  const ecc = Number(`0.${field(l2, n2, 27, 33, "eccentricity", /^\d{7}$/)}`);
  const argp = Number(field(l2, n2, 35, 42, "argument of perigee", NUM));
  const ma = Number(field(l2, n2, 44, 51, "mean anomaly", NUM));
  const meanMotion = Number(field(l2, n2, 53, 63, "mean motion", NUM));
  const revText = field(l2, n2, 64, 68, "revolution number", /^ *\d{0,5}$/);
  if (!(incl >= 0 && incl <= 180)) stop(n2, `inclination ${incl}° is outside 0–180°`);
  if (!(raan >= 0 && raan < 360)) stop(n2, `right ascension of the ascending node ${raan}° is outside 0–360°`);
  if (!(argp >= 0 && argp < 360)) stop(n2, `argument of perigee ${argp}° is outside 0–360°`);
  if (!(ma >= 0 && ma < 360)) stop(n2, `mean anomaly ${ma}° is outside 0–360°`);
  if (!(meanMotion > 0 && meanMotion < 20)) stop(n2, `mean motion ${meanMotion} rev/day is not that of an Earth orbit (0–20 rev/day)`);

  // satellite.js initialises SGP4 from the two lines; its error code tells if the elements make no orbit.
  const satrec = twoline2satrec(l1, l2);
  const pv = sgp4(satrec, 0);
  if (satrec.error !== 0 || !pv) stop(n2, `SGP4 cannot start from these elements (satellite.js error ${satrec.error}); check eccentricity and mean motion`);

  const epochMs = Date.UTC(year, 0, 1) + (day - 1) * 86_400_000;
  return {
    line: n1,
    name,
    catalogNumber: cat1.padStart(5, "0"),
    classification: classification.trim() || "U",
    internationalDesignator: intl,
    epoch: { text: `${String(yy).padStart(2, "0")}${dayText.trim().padStart(12, "0")}`, iso: isoOf(epochMs), ms: epochMs },
    meanMotion,
    meanMotionDot: ndot,
    meanMotionDdot: impliedDecimal(nddotRaw),
    bstar: impliedDecimal(bstarRaw),
    eccentricity: ecc,
    inclination: incl,
    raan,
    argPerigee: argp,
    meanAnomaly: ma,
    elementSetNumber: Number(setNo || "0"),
    revolutionNumber: Number(revText || "0"),
    line1: l1,
    line2: l2,
  };
}

/** Parses a file of one or more element sets (two lines each, optionally a name line before). */
export function parseTle(text: string): ParseOutcome {
  try {
    const lines = asciiLines(text, "element-set").map((l) => l.replace(/[ \t]+$/, ""));
    const tick = deadline();
    // Count first: a file with too many sets is refused before any work per set.
    let dataLines = 0;
    for (const l of lines) if (l.startsWith("1 ") || l.startsWith("2 ")) dataLines += 1;
    if (dataLines / 2 > LIMITS.maxElementSets)
      stop(null, `the file holds about ${Math.floor(dataLines / 2)} element sets; at most ${LIMITS.maxElementSets} are read from one file`);
    const sets: TleSet[] = [];
    let name: string | null = null;
    let nameLine = 0;
    for (let i = 0; i < lines.length; i += 1) {
      tick();
      const l = lines[i]!;
      const n = i + 1;
      if (l.trim() === "") {
        if (name !== null) stop(nameLine, `name line "${clip(name)}" is not followed by an element set`);
        continue;
      }
      if (l.startsWith("1 ")) {
        const next = lines[i + 1];
        if (next === undefined || next.trim() === "") stop(n, "line 1 of an element set is not followed by its line 2 (the file is cut short)");
        if (!next.startsWith("2 ")) stop(n + 1, `line 2 of an element set must start with "2 ", found "${clip(next, 10)}"`);
        sets.push(parseSet(name, l, next, n));
        name = null;
        i += 1;
        continue;
      }
      if (l.startsWith("2 ")) stop(n, "line 2 of an element set without its line 1 before it");
      if (name !== null) stop(n, `expected line 1 of an element set after the name line ${nameLine}, found "${clip(l, 20)}"`);
      if (l.length > 24 + 2) stop(n, `a name line has at most 24 characters (optionally after "0 "); this one has ${l.length}`);
      name = l.startsWith("0 ") ? l.slice(2).trim() : l.trim();
      nameLine = n;
    }
    if (name !== null) stop(nameLine, `name line "${clip(name)}" is not followed by an element set (the file is cut short)`);
    if (sets.length === 0) stop(null, "no element sets found: each set is two 69-character lines starting with 1 and 2");
    const file: TleFile = { format: "tle", encoding: "tle", refFrame: "TEME", timeSystem: "UTC", sets };
    return { ok: true, file };
  } catch (error) {
    if (error instanceof ParseStop) return { ok: false, error: error.toParseError() };
    return { ok: false, error: { line: null, message: "the element sets could not be read" } };
  }
}
