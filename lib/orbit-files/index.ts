/**
 * Orbit data files: two-line element sets and CCSDS OPM, OMM and OEM (KVN and XML).
 * parseOrbitFile never throws: it answers a parsed file or an error naming the line.
 */
import { parseOemKvn, parseOmmKvn, parseOpmKvn } from "./kvn";
import { parseTle } from "./tle";
import type { OrbitFileEncoding, OrbitFileFormat, ParseOutcome } from "./types";
import { parseOemXml, parseOmmXml, parseOpmXml } from "./xml";

export * from "./types";
export { LIMITS } from "./common";
export { tleChecksum } from "./tle";

export interface DetectedFormat {
  format: OrbitFileFormat;
  encoding: OrbitFileEncoding;
}

/** What the text looks like from its first lines, or null when it is no orbit file. */
export function detectOrbitFormat(text: string): DetectedFormat | null {
  if (typeof text !== "string") return null;
  const head = text.slice(0, 4096).replace(/^\uFEFF/, "");
  const trimmed = head.trimStart();
  if (trimmed.startsWith("<")) {
    const m = /<(?:[A-Za-z_][\w.-]*:)?(opm|omm|oem)[\s>/]/i.exec(head);
    return m ? { format: m[1]!.toLowerCase() as OrbitFileFormat, encoding: "xml" } : null;
  }
  const kvn = /^(?:COMMENT[^\n]*\n\s*)*CCSDS_(OPM|OMM|OEM)_VERS\s*=/.exec(trimmed);
  if (kvn) return { format: kvn[1]!.toLowerCase() as OrbitFileFormat, encoding: "kvn" };
  const lines = trimmed.split(/\r?\n/, 3);
  if (lines[0]?.startsWith("1 ") || (lines[1]?.startsWith("1 ") && lines[0]!.length <= 26)) return { format: "tle", encoding: "tle" };
  return null;
}

const PARSERS: Record<string, (text: string) => ParseOutcome> = {
  "tle/tle": parseTle,
  "opm/kvn": parseOpmKvn,
  "omm/kvn": parseOmmKvn,
  "oem/kvn": parseOemKvn,
  "opm/xml": parseOpmXml,
  "omm/xml": parseOmmXml,
  "oem/xml": parseOemXml,
};

/** Parses any orbit file this product reads; the format comes from the content. */
export function parseOrbitFile(text: string): ParseOutcome {
  try {
    const detected = detectOrbitFormat(text);
    if (!detected)
      return {
        ok: false,
        error: { line: 1, message: "line 1: not an orbit file this product reads (two-line element sets, or CCSDS OPM, OMM or OEM in KVN or XML)" },
      };
    return PARSERS[`${detected.format}/${detected.encoding}`]!(text);
  } catch {
    return { ok: false, error: { line: null, message: "the file could not be read" } };
  }
}

export { parseTle, parseOpmKvn, parseOmmKvn, parseOemKvn, parseOpmXml, parseOmmXml, parseOemXml };
