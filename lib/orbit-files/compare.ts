/**
 * The file against the text: every named orbit of a dossier (an orbit-check block with a
 * label) compared with the orbit files the proposer linked to it — a block made from a file
 * carries that file's attachment id and SHA-256, and blocks sharing its label name the same
 * orbit. Pure: the editor shows it live, the server stores it at submission as a flag.
 * Answers "do the attached orbit files say what the text says?", not "are the numbers right?".
 */
import { BODIES } from "@/lib/orbit/constants";
import type { OrbitSummary } from "./summary";

export const FILE_QUESTION = "Do the attached orbit files say what the text says?";

/** A block's link to the file it was made from. */
export interface OrbitFileSource {
  attachmentId: string;
  sha256: string;
  filename: string;
  /** Which orbit of the file (element set, OEM segment), 0-based. */
  index: number;
}

/** Per-unit tolerance of a call for file comparisons (absolute, in the unit). */
export interface FileComparisonTolerance {
  km: number;
  deg: number;
  /** dimensionless (eccentricity) */
  "1": number;
  s: number;
}

/**
 * Defaults (common practice for screening, not a standard): mean and osculating altitudes of
 * a low orbit differ by up to about 10 km and element sets are a day or more old, so a few km
 * and a tenth of a degree separate a real disagreement from the file's own noise.
 */
export const DEFAULT_FILE_TOLERANCE: FileComparisonTolerance = { km: 5, deg: 0.1, "1": 0.002, s: 60 };

export function fileTolerance(input: unknown): FileComparisonTolerance {
  const out = { ...DEFAULT_FILE_TOLERANCE };
  if (input && typeof input === "object") {
    for (const k of Object.keys(out) as (keyof FileComparisonTolerance)[]) {
      const v = (input as Record<string, unknown>)[k];
      if (typeof v === "number" && Number.isFinite(v) && v >= 0) out[k] = v;
    }
  }
  return out;
}

export interface ComparedBlock {
  blockId: string;
  label: string;
  claim: { kind: string; body?: unknown; given: Record<string, unknown>; claimed?: Record<string, unknown> };
  source?: OrbitFileSource | null;
}

export interface LinkedFile {
  attachmentId: string;
  filename: string;
  sha256: string;
  format: string | null;
  status: "parsed" | "unparsed";
  error: { line: number | null; message: string } | null;
  summaries: OrbitSummary[];
}

export interface ComparisonRow {
  quantity: string;
  unit: string;
  text: number;
  file: number;
  difference: number;
  tolerance: number;
  ok: boolean;
}

export interface FileComparison {
  blockId: string;
  label: string;
  attachmentId: string | null;
  filename: string;
  status: "consistent" | "inconsistent" | "invalid";
  rows: ComparisonRow[];
  messages: string[];
}

const FORMAT_NAMES: Record<string, string> = {
  tle: "element set",
  opm: "orbit parameter message",
  omm: "orbit mean-elements message",
  oem: "orbit ephemeris message",
};

function num(x: unknown): number | null {
  if (typeof x === "number" && Number.isFinite(x)) return x;
  if (typeof x === "string" && x.trim() !== "" && Number.isFinite(Number(x.trim()))) return Number(x.trim());
  return null;
}

function isEarth(body: unknown): boolean {
  return body === undefined || body === null || body === "earth";
}

/** What a block states about its orbit, in km, deg, s. Given values first, then claimed. */
export function orbitOfBlock(
  claim: ComparedBlock["claim"],
): Partial<Record<"altitude" | "periapsisAltitude" | "apoapsisAltitude" | "inclination" | "eccentricity" | "period", number>> {
  if (!isEarth(claim.body)) return {};
  const R = BODIES.earth.radius.value;
  const all: Record<string, unknown> = { ...(claim.claimed ?? {}), ...claim.given };
  const v = (k: string) => num(all[k]);
  const out: ReturnType<typeof orbitOfBlock> = {};
  const alt = v("altitude");
  const pa = v("periapsisAltitude") ?? (v("periapsisRadius") !== null ? v("periapsisRadius")! - R : null);
  const aa = v("apoapsisAltitude") ?? (v("apoapsisRadius") !== null ? v("apoapsisRadius")! - R : null);
  const a = v("semiMajorAxis");
  const e = v("eccentricity");
  if (alt !== null) out.altitude = alt;
  else if (pa !== null && aa !== null)
    out.altitude = (pa + aa) / 2; // (r_p + r_a)/2 − R = a − R
  else if (a !== null) out.altitude = a - R;
  if (pa !== null) out.periapsisAltitude = pa;
  if (aa !== null) out.apoapsisAltitude = aa;
  if (a !== null && e !== null && pa === null && aa === null && e < 1) {
    out.periapsisAltitude = a * (1 - e) - R;
    out.apoapsisAltitude = a * (1 + e) - R;
  }
  const i = v("inclination");
  if (i !== null) out.inclination = i;
  if (e !== null) out.eccentricity = e;
  const p = v("period");
  if (p !== null) out.period = p;
  return out;
}

const QUANTITIES: {
  key: keyof ReturnType<typeof orbitOfBlock>;
  name: string;
  unit: keyof FileComparisonTolerance;
  file: (c: NonNullable<OrbitSummary["compare"]>) => number;
}[] = [
  { key: "altitude", name: "altitude", unit: "km", file: (c) => c.altitudeKm },
  { key: "periapsisAltitude", name: "periapsis altitude", unit: "km", file: (c) => c.periapsisAltitudeKm },
  { key: "apoapsisAltitude", name: "apoapsis altitude", unit: "km", file: (c) => c.apoapsisAltitudeKm },
  { key: "inclination", name: "inclination", unit: "deg", file: (c) => c.inclinationDeg },
  { key: "eccentricity", name: "eccentricity", unit: "1", file: (c) => c.eccentricity },
  { key: "period", name: "period", unit: "s", file: (c) => c.periodMin * 60 },
];

const UNIT_TEXT: Record<keyof FileComparisonTolerance, string> = { km: " km", deg: "°", "1": "", s: " s" };
const DECIMALS: Record<keyof FileComparisonTolerance, number> = { km: 1, deg: 2, "1": 4, s: 0 };

function show(x: number, unit: keyof FileComparisonTolerance): string {
  return `${Number(x.toFixed(DECIMALS[unit]))}${UNIT_TEXT[unit]}`;
}

/** Which files each named orbit is linked to: its own source, and the sources of blocks with the same label. */
export function linksOf(blocks: ComparedBlock[]): Map<string, OrbitFileSource[]> {
  const byLabel = new Map<string, OrbitFileSource[]>();
  const key = (l: string) => l.trim().toLowerCase();
  for (const b of blocks) {
    if (!b.source || !b.label.trim()) continue;
    const list = byLabel.get(key(b.label)) ?? [];
    if (!list.some((s) => s.attachmentId === b.source!.attachmentId && s.index === b.source!.index)) list.push(b.source);
    byLabel.set(key(b.label), list);
  }
  const out = new Map<string, OrbitFileSource[]>();
  for (const b of blocks) {
    if (!b.label.trim()) continue;
    const list = byLabel.get(key(b.label));
    if (list?.length) out.set(b.blockId, list);
  }
  return out;
}

/** Compares every named, linked orbit with its files. */
export function compareFilesWithText(
  blocks: ComparedBlock[],
  files: LinkedFile[],
  tolerance: FileComparisonTolerance = DEFAULT_FILE_TOLERANCE,
): FileComparison[] {
  const links = linksOf(blocks);
  const out: FileComparison[] = [];
  for (const b of blocks) {
    const sources = links.get(b.blockId);
    if (!sources) continue;
    for (const src of sources) {
      let file = files.find((f) => f.attachmentId === src.attachmentId) ?? null;
      const messages: string[] = [];
      if (!file) {
        // A new version of the same file (same name, new upload) stands in for the one the block was made from.
        file = files.find((f) => f.filename === src.filename) ?? null;
        if (file)
          messages.push(`${src.filename} was replaced by a new version since this block was made from it; the block still holds the earlier file's values.`);
      } else if (file.sha256 !== src.sha256 && b.source?.attachmentId === src.attachmentId) {
        messages.push(`${src.filename} changed since this block was made from it (SHA-256 ${file.sha256.slice(0, 12)}…, was ${src.sha256.slice(0, 12)}…).`);
      }
      const base = { blockId: b.blockId, label: b.label, attachmentId: file?.attachmentId ?? null, filename: file?.filename ?? src.filename };
      if (!file) {
        out.push({
          ...base,
          status: "invalid",
          rows: [],
          messages: [`the orbit file ${src.filename} this orbit is linked to is no longer attached; attach it again or make the block from another file.`],
        });
        continue;
      }
      if (file.status !== "parsed") {
        out.push({
          ...base,
          status: "invalid",
          rows: [],
          messages: [
            ...messages,
            `the attached ${file.filename} could not be read (${file.error?.message ?? "unparsed"}), so it cannot be compared with the text.`,
          ],
        });
        continue;
      }
      const summary = file.summaries[src.index] ?? file.summaries[0];
      if (!summary?.compare) {
        out.push({
          ...base,
          status: "invalid",
          rows: [],
          messages: [...messages, `the attached ${file.filename} gives no orbit this product can compare (${summary?.notes.join(" ") ?? "no summary"}).`],
        });
        continue;
      }
      const text = orbitOfBlock(b.claim);
      const what = FORMAT_NAMES[file.format ?? ""] ?? "orbit file";
      const rows: ComparisonRow[] = [];
      for (const q of QUANTITIES) {
        const t = text[q.key];
        if (t === undefined) continue;
        const f = q.file(summary.compare);
        if (!Number.isFinite(f)) continue;
        const difference = f - t;
        const ok = Math.abs(difference) <= tolerance[q.unit];
        rows.push({ quantity: q.name, unit: q.unit, text: t, file: f, difference, tolerance: tolerance[q.unit], ok });
        if (!ok)
          messages.push(
            `the attached ${what} gives ${show(f, q.unit)} ${q.name}, the text claims ${show(t, q.unit)} (${b.label}; tolerance ±${show(tolerance[q.unit], q.unit)})`,
          );
      }
      if (rows.length === 0) messages.push(`${b.label} states no altitude, inclination, eccentricity or period to compare with ${file.filename}.`);
      if (summary.compare.basis === "mean") messages.push("The file's mean elements are compared (SGP4 mean, not osculating).");
      out.push({ ...base, status: rows.some((r) => !r.ok) ? "inconsistent" : "consistent", rows, messages });
    }
  }
  return out;
}
