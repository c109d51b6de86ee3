/**
 * The XML form of the orbit data messages (CCSDS 505.0-B, "XML Specification for Navigation
 * Data Messages"; element names recalled from memory): <opm>, <omm> or <oem> with a header
 * and a body of segments holding metadata and data, the leaf elements named by the KVN
 * keywords, units in a `units` attribute. Read with fast-xml-parser, entities off: a document
 * type declaration or entity definition is refused before parsing, so nothing is ever fetched
 * or expanded.
 */
import { XMLParser, XMLValidator } from "fast-xml-parser";
import { LIMITS, ParseStop, asciiLines, clip, deadline, stop } from "./common";
import { COVARIANCE_KEYS, buildOem, buildOmm, buildOpm, type Entry, type RawSegment, type VersionLine } from "./odm";
import type { ParseOutcome } from "./types";

type XmlNode = Record<string, unknown>;
const META = XMLParser.getMetaDataSymbol() as unknown as string;

function tagOf(node: XmlNode): string {
  for (const k of Object.keys(node)) if (k !== ":@") return k;
  return "";
}
function childrenOf(node: XmlNode): XmlNode[] {
  const c = node[tagOf(node)];
  return Array.isArray(c) ? (c as XmlNode[]) : [];
}
function attrsOf(node: XmlNode): Record<string, string> {
  return (node[":@"] as Record<string, string> | undefined) ?? {};
}
function elements(node: XmlNode): XmlNode[] {
  return childrenOf(node).filter((c) => {
    const t = tagOf(c);
    return t !== "#text" && t !== "#comment" && t !== "?xml";
  });
}
function textOf(node: XmlNode): string {
  return childrenOf(node)
    .filter((c) => tagOf(c) === "#text")
    .map((c) => String(c["#text"]))
    .join("")
    .trim();
}

/** Parses and checks the common shape; returns the root element and a line finder. */
function readXml(text: string, message: "opm" | "omm" | "oem"): { root: XmlNode; lineAt: (node: XmlNode) => number; lines: number } {
  const lines = asciiLines(text, `CCSDS ${message.toUpperCase()} (XML)`);
  const declared = /<!(DOCTYPE|ENTITY)/i.exec(text);
  if (declared) {
    const line = text.slice(0, declared.index).split("\n").length;
    stop(
      line,
      `XML ${declared[1]!.toUpperCase()} declarations are refused: entities are never fetched or expanded. Remove the declaration and write the values out`,
    );
  }
  const valid = XMLValidator.validate(text, { allowBooleanAttributes: false });
  if (valid !== true) stop(valid.err.line ?? null, `the XML is not well formed: ${valid.err.msg}`);
  const starts: number[] = [0];
  for (let i = 0; i < text.length; i += 1) if (text.charCodeAt(i) === 10) starts.push(i + 1);
  const lineOf = (index: number) => {
    let lo = 0;
    let hi = starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (starts[mid]! <= index) lo = mid;
      else hi = mid - 1;
    }
    return lo + 1;
  };
  const parser = new XMLParser({
    preserveOrder: true,
    ignoreAttributes: false,
    attributeNamePrefix: "",
    processEntities: false,
    htmlEntities: false,
    parseTagValue: false,
    parseAttributeValue: false,
    trimValues: true,
    captureMetaData: true,
    maxNestedTags: LIMITS.maxXmlDepth,
    removeNSPrefix: true,
  });
  let doc: XmlNode[];
  try {
    doc = parser.parse(text) as XmlNode[];
  } catch (error) {
    stop(null, `the XML could not be read: ${clip(error instanceof Error ? error.message : "unknown problem", 120)}`);
  }
  const root = doc.find((n) => tagOf(n) !== "?xml" && tagOf(n) !== "#text" && tagOf(n) !== "#comment");
  const lineAt = (node: XmlNode) => {
    const meta = node[META] as { startIndex?: number } | undefined;
    return meta?.startIndex !== undefined ? lineOf(meta.startIndex) : 1;
  };
  if (!root || tagOf(root).toLowerCase() !== message)
    stop(root ? lineAt(root) : 1, `the root element must be <${message}>, found <${root ? clip(tagOf(root)) : "nothing"}>`);
  return { root, lineAt, lines: lines.length };
}

function versionOf(root: XmlNode, lineAt: (n: XmlNode) => number, message: string): VersionLine {
  const attrs = attrsOf(root);
  if (attrs.id !== undefined && attrs.id !== `CCSDS_${message}_VERS`)
    stop(lineAt(root), `the id attribute must be CCSDS_${message}_VERS, found "${clip(attrs.id)}"`);
  if (!attrs.version) stop(lineAt(root), `the <${message.toLowerCase()}> element needs a version attribute`);
  return { version: attrs.version, line: lineAt(root) };
}

function child(node: XmlNode, tag: string): XmlNode | undefined {
  return elements(node).find((c) => tagOf(c) === tag);
}

/** Leaf elements of a container as keyword entries (nested containers flattened in order). */
function leafEntries(node: XmlNode, lineAt: (n: XmlNode) => number, out: Entry[], tick: () => void): Entry[] {
  for (const c of elements(node)) {
    tick();
    const tag = tagOf(c);
    const kids = elements(c);
    if (kids.length > 0) {
      leafEntries(c, lineAt, out, tick);
      continue;
    }
    const attrs = attrsOf(c);
    const key = tag === "USER_DEFINED" ? `USER_DEFINED_${attrs.parameter ?? ""}` : tag;
    out.push({ key, value: textOf(c), unit: attrs.units ?? null, line: lineAt(c) });
  }
  return out;
}

function bodySegments(root: XmlNode, lineAt: (n: XmlNode) => number): XmlNode[] {
  const body = child(root, "body");
  if (!body) stop(lineAt(root), "the message has no <body>");
  const segments = elements(body).filter((c) => tagOf(c) === "segment");
  if (segments.length === 0) stop(lineAt(body), "the <body> has no <segment>");
  return segments;
}

function parseFlatXml(text: string, message: "OPM" | "OMM"): ParseOutcome {
  try {
    const tick = deadline();
    const { root, lineAt, lines } = readXml(text, message === "OPM" ? "opm" : "omm");
    const version = versionOf(root, lineAt, message);
    const entries: Entry[] = [];
    const header = child(root, "header");
    if (header) leafEntries(header, lineAt, entries, tick);
    const segments = bodySegments(root, lineAt);
    if (segments.length > 1) stop(lineAt(segments[1]!), `an ${message} has one <segment>; this one has ${segments.length}`);
    const seg = segments[0]!;
    const metadata = child(seg, "metadata");
    if (!metadata) stop(lineAt(seg), "the <segment> has no <metadata>");
    leafEntries(metadata, lineAt, entries, tick);
    const data = child(seg, "data");
    if (!data) stop(lineAt(seg), "the <segment> has no <data>");
    leafEntries(data, lineAt, entries, tick);
    const file = message === "OPM" ? buildOpm(entries, version, "xml", lines) : buildOmm(entries, version, "xml", lines);
    return { ok: true, file };
  } catch (error) {
    if (error instanceof ParseStop) return { ok: false, error: error.toParseError() };
    return { ok: false, error: { line: null, message: `the CCSDS ${message} (XML) could not be read` } };
  }
}

export const parseOpmXml = (text: string) => parseFlatXml(text, "OPM");
export const parseOmmXml = (text: string) => parseFlatXml(text, "OMM");

const STATE_KEYS = ["EPOCH", "X", "Y", "Z", "X_DOT", "Y_DOT", "Z_DOT"];
const ACCEL_KEYS = ["X_DDOT", "Y_DDOT", "Z_DDOT"];

export function parseOemXml(text: string): ParseOutcome {
  try {
    const tick = deadline();
    const { root, lineAt } = readXml(text, "oem");
    const version = versionOf(root, lineAt, "OEM");
    const headerEntries: Entry[] = [];
    const header = child(root, "header");
    if (header) leafEntries(header, lineAt, headerEntries, tick);
    const raw: RawSegment[] = bodySegments(root, lineAt).map((seg) => {
      const metadata = child(seg, "metadata");
      if (!metadata) stop(lineAt(seg), "the <segment> has no <metadata>");
      const meta = leafEntries(metadata, lineAt, [], tick);
      const data = child(seg, "data");
      if (!data) stop(lineAt(seg), "the <segment> has no <data> (the file may be cut short)");
      const out: RawSegment = { line: lineAt(seg), meta, metaEndLine: lineAt(data), states: [], covarianceCount: 0, covariances: [] };
      for (const c of elements(data)) {
        tick();
        const tag = tagOf(c);
        if (tag === "COMMENT") continue;
        if (tag === "covarianceMatrix") {
          out.covarianceCount += 1;
          const values = new Map<string, XmlNode>();
          let epoch: { text: string; line: number } | null = null;
          let refFrame: { text: string; line: number } | null = null;
          for (const e of elements(c)) {
            tick();
            const k = tagOf(e);
            if (k === "COMMENT") continue;
            if (k === "EPOCH") epoch = { text: textOf(e), line: lineAt(e) };
            else if (k === "COV_REF_FRAME") refFrame = { text: textOf(e), line: lineAt(e) };
            else if (COVARIANCE_KEYS.includes(k)) values.set(k, e);
            else stop(lineAt(e), `<${clip(k)}> is not an element of a <covarianceMatrix>`);
          }
          if (!epoch) stop(lineAt(c), "EPOCH missing in the <covarianceMatrix>");
          for (const k of COVARIANCE_KEYS) if (!values.has(k)) stop(lineAt(c), `${k} missing in the <covarianceMatrix>`);
          out.covariances.push({
            line: lineAt(c),
            epoch,
            refFrame,
            values: COVARIANCE_KEYS.map((k) => {
              const e = values.get(k)!;
              return { text: textOf(e), line: lineAt(e), key: k, unit: attrsOf(e).units ?? null };
            }),
          });
          continue;
        }
        if (tag !== "stateVector") stop(lineAt(c), `<${clip(tag)}> is not an element of OEM data; use <stateVector> or <covarianceMatrix>`);
        const values = new Map(elements(c).map((e) => [tagOf(e), e] as const));
        for (const [k, e] of values) {
          const unit = attrsOf(e).units;
          const want = k === "EPOCH" ? null : k.endsWith("_DDOT") ? "km/s**2" : k.endsWith("_DOT") ? "km/s" : "km";
          if (unit !== undefined && want !== null && unit.toLowerCase() !== want)
            stop(lineAt(e), `${k} is given in [${clip(unit)}]; a CCSDS OEM gives it in [${want}]`);
          if (![...STATE_KEYS, ...ACCEL_KEYS].includes(k)) stop(lineAt(e), `<${clip(k)}> is not an element of a <stateVector>`);
        }
        for (const k of STATE_KEYS) if (!values.has(k)) stop(lineAt(c), `${k} missing in the <stateVector>`);
        const keys = values.has("X_DDOT") ? [...STATE_KEYS, ...ACCEL_KEYS] : STATE_KEYS;
        out.states.push({ line: lineAt(c), fields: keys.map((k) => (values.get(k) ? textOf(values.get(k)!) : "")) });
      }
      return out;
    });
    return { ok: true, file: buildOem(raw, headerEntries, version, "xml", tick) };
  } catch (error) {
    if (error instanceof ParseStop) return { ok: false, error: error.toParseError() };
    return { ok: false, error: { line: null, message: "the CCSDS OEM (XML) could not be read" } };
  }
}
