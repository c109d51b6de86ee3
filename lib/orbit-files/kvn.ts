/**
 * The keyword = value notation (KVN) of CCSDS 502.0-B-2: "KEYWORD = value [unit]" lines,
 * COMMENT lines, and for the OEM META_START/META_STOP, COVARIANCE_START/COVARIANCE_STOP
 * blocks and ephemeris data lines.
 */
import { LIMITS, ParseStop, asciiLines, clip, deadline, stop } from "./common";
import { COVARIANCE_KEYS, buildOem, buildOmm, buildOpm, type Entry, type RawSegment, type VersionLine } from "./odm";
import type { ParseOutcome } from "./types";

const KV = /^([A-Z][A-Z0-9_]*)\s*=\s*(.*)$/;

function entryOf(line: string, lineNo: number): Entry | null {
  const trimmed = line.trim();
  if (trimmed === "") return null;
  if (trimmed === "COMMENT" || trimmed.startsWith("COMMENT ") || trimmed.startsWith("COMMENT\t"))
    return { key: "COMMENT", value: trimmed.slice(7).trim(), unit: null, line: lineNo };
  const m = KV.exec(trimmed);
  if (!m) return { key: "", value: trimmed, unit: null, line: lineNo };
  let value = m[2]!.trim();
  let unit: string | null = null;
  const u = /^(.*?)\s*\[([^\]]*)\]$/.exec(value);
  if (u) {
    value = u[1]!.trim();
    unit = u[2]!.trim();
  }
  return { key: m[1]!, value, unit, line: lineNo };
}

function lineChecks(lines: string[]): void {
  for (let i = 0; i < lines.length; i += 1)
    if (lines[i]!.length > LIMITS.maxKvnLineChars)
      stop(i + 1, `${lines[i]!.length} characters; a CCSDS KVN line has at most ${LIMITS.maxKvnLineChars} (recalled from the standard)`);
}

function versionOf(first: Entry | undefined, message: string): VersionLine {
  if (!first || first.key !== `CCSDS_${message}_VERS`) stop(first?.line ?? 1, `the first line must be CCSDS_${message}_VERS = version`);
  return { version: first.value, line: first.line };
}

/** OPM or OMM in KVN: one flat list of keyword lines. */
function parseFlat(text: string, message: "OPM" | "OMM"): ParseOutcome {
  try {
    const lines = asciiLines(text, `CCSDS ${message}`);
    lineChecks(lines);
    const tick = deadline();
    const entries: Entry[] = [];
    for (let i = 0; i < lines.length; i += 1) {
      tick();
      const e = entryOf(lines[i]!, i + 1);
      if (!e) continue;
      if (e.key === "") stop(e.line, `"${clip(e.value)}" is not a KEYWORD = value line`);
      entries.push(e);
    }
    const firstData = entries.find((e) => e.key !== "COMMENT");
    const version = versionOf(firstData, message);
    const rest = entries.filter((e) => e !== firstData);
    const endLine = lines.length;
    const file = message === "OPM" ? buildOpm(rest, version, "kvn", endLine) : buildOmm(rest, version, "kvn", endLine);
    return { ok: true, file };
  } catch (error) {
    if (error instanceof ParseStop) return { ok: false, error: error.toParseError() };
    return { ok: false, error: { line: null, message: `the CCSDS ${message} could not be read` } };
  }
}

export const parseOpmKvn = (text: string) => parseFlat(text, "OPM");
export const parseOmmKvn = (text: string) => parseFlat(text, "OMM");

/**
 * One line of an OEM covariance block (CCSDS 502.0-B-2, OEM covariance section; recalled from
 * memory): "EPOCH = …" opens a matrix, "COV_REF_FRAME = …" may follow, then six rows of the
 * lower triangle holding 1, 2, … 6 numbers.
 */
function covarianceLine(seg: RawSegment, line: string, n: number): void {
  const e = entryOf(line, n);
  if (!e || e.key === "COMMENT") return;
  const current = seg.covariances[seg.covariances.length - 1];
  if (e.key === "EPOCH") {
    covarianceComplete(seg, n);
    seg.covariances.push({ line: n, epoch: { text: e.value, line: n }, refFrame: null, values: [] });
    seg.covarianceCount += 1;
    return;
  }
  if (e.key === "COV_REF_FRAME") {
    if (!current || current.values.length > 0) stop(n, "COV_REF_FRAME goes right after a covariance matrix's EPOCH line");
    current.refFrame = { text: e.value, line: n };
    return;
  }
  if (e.key !== "") stop(n, `${clip(e.key)} = … is not a line of a covariance block (EPOCH, COV_REF_FRAME, then six rows of numbers)`);
  if (!current || current.epoch === null) stop(n, "covariance numbers come after the matrix's EPOCH = line");
  const row = rowsOf(current.values.length);
  if (row >= 6) stop(n, `the covariance matrix of line ${current.line} already has its six rows; start the next matrix with EPOCH =`);
  const fields = e.value.split(/\s+/);
  if (fields.length !== row + 1)
    stop(n, `row ${row + 1} of a covariance matrix holds ${row + 1} number${row === 0 ? "" : "s"} (lower triangle); this line has ${fields.length}`);
  for (const text of fields) current.values.push({ text, line: n, key: COVARIANCE_KEYS[current.values.length]! });
}

/** Rows already written, from the count of values (1 + 2 + … + rows). */
function rowsOf(values: number): number {
  let rows = 0;
  let sum = 0;
  while (sum < values) sum += ++rows;
  return rows;
}

function covarianceComplete(seg: RawSegment, n: number): void {
  const current = seg.covariances[seg.covariances.length - 1];
  if (current && current.values.length !== 21)
    stop(n, `the covariance matrix of line ${current.line} has ${current.values.length} of its 21 values (six rows of 1 to 6 numbers)`);
}

/** OEM in KVN: header lines, then segments of metadata block, data lines and covariance blocks. */
export function parseOemKvn(text: string): ParseOutcome {
  try {
    const lines = asciiLines(text, "CCSDS OEM");
    lineChecks(lines);
    const tick = deadline();
    const headerEntries: Entry[] = [];
    const segments: RawSegment[] = [];
    let version: VersionLine | null = null;
    let mode: "header" | "meta" | "data" | "cov" = "header";
    let seg: RawSegment | null = null;
    let openedAt = 0;
    for (let i = 0; i < lines.length; i += 1) {
      tick();
      const n = i + 1;
      const trimmed = lines[i]!.trim();
      if (trimmed === "") continue;
      if (trimmed === "META_START") {
        if (mode === "meta") stop(n, `META_START inside the metadata block opened on line ${openedAt}; close it with META_STOP first`);
        if (mode === "cov") stop(n, `META_START inside the covariance block opened on line ${openedAt}; close it with COVARIANCE_STOP first`);
        if (!version) stop(n, "the first line must be CCSDS_OEM_VERS = version");
        if (segments.length >= 1000) stop(n, "too many segments; split the file");
        seg = { line: n, meta: [], metaEndLine: n, states: [], covarianceCount: 0, covariances: [] };
        segments.push(seg);
        mode = "meta";
        openedAt = n;
        continue;
      }
      if (trimmed === "META_STOP") {
        if (mode !== "meta") stop(n, "META_STOP without a META_START before it");
        seg!.metaEndLine = n;
        mode = "data";
        continue;
      }
      if (trimmed === "COVARIANCE_START") {
        if (mode !== "data") stop(n, "COVARIANCE_START must follow a segment's ephemeris lines");
        mode = "cov";
        openedAt = n;
        continue;
      }
      if (trimmed === "COVARIANCE_STOP") {
        if (mode !== "cov") stop(n, "COVARIANCE_STOP without a COVARIANCE_START before it");
        covarianceComplete(seg!, n);
        mode = "data";
        continue;
      }
      if (mode === "cov") {
        covarianceLine(seg!, lines[i]!, n);
        continue;
      }
      const e = entryOf(lines[i]!, n);
      if (!e) continue;
      if (mode === "header") {
        if (e.key === "") stop(n, `"${clip(e.value)}" is not a KEYWORD = value line of the OEM header`);
        if (!version && e.key !== "COMMENT") {
          version = versionOf(e, "OEM");
          continue;
        }
        headerEntries.push(e);
      } else if (mode === "meta") {
        if (e.key === "") stop(n, `"${clip(e.value)}" is not a KEYWORD = value line (the metadata block opened on line ${openedAt} has no META_STOP yet)`);
        seg!.meta.push(e);
      } else {
        if (e.key === "COMMENT") continue;
        if (e.key !== "") stop(n, `${clip(e.key)} = … appears among ephemeris lines; start a new segment with META_START`);
        seg!.states.push({ line: n, fields: trimmed.split(/\s+/) });
      }
    }
    if (mode === "meta") stop(lines.length, `the metadata block opened on line ${openedAt} has no META_STOP (the file is cut short)`);
    if (mode === "cov") stop(lines.length, `the covariance block opened on line ${openedAt} has no COVARIANCE_STOP (the file is cut short)`);
    if (!version) stop(1, "the first line must be CCSDS_OEM_VERS = version");
    return { ok: true, file: buildOem(segments, headerEntries, version, "kvn", tick) };
  } catch (error) {
    if (error instanceof ParseStop) return { ok: false, error: error.toParseError() };
    return { ok: false, error: { line: null, message: "the CCSDS OEM could not be read" } };
  }
}
