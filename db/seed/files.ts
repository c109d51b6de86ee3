// Small, valid attachment files for the demo dossiers, made in code: a one-page PDF (pdfkit),
// a CSV Δv ledger, a CCSDS orbit ephemeris message in KVN and a two-line element set. The
// orbit data comes from the engine (classical elements to a state, then propagation).
import PDFDocument from "pdfkit";
import { engine, rounded, type Maneuver } from "./claims";

export interface SeedFile {
  filename: string;
  contentType: "application/pdf" | "text/csv" | "text/plain";
  body: Buffer;
}

/** A one-page mission summary PDF (built-in Helvetica, so no font files are needed). */
export async function summaryPdf(filename: string, title: string, organisation: string, lines: string[]): Promise<SeedFile> {
  const doc = new PDFDocument({ size: "A4", margin: 56, info: { Title: title, Author: organisation, Subject: "Mission concept summary (VisViva demo)" } });
  const chunks: Buffer[] = [];
  doc.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<void>((resolve, reject) => {
    doc.on("end", () => resolve());
    doc.on("error", reject);
  });
  doc.font("Helvetica-Bold").fontSize(18).fillColor("#121a30").text(title);
  doc.moveDown(0.3).font("Helvetica").fontSize(11).fillColor("#45537a").text(`${organisation} - mission concept summary`);
  doc.moveDown(1).fillColor("#121a30").fontSize(11);
  for (const line of lines) doc.text(line, { paragraphGap: 6 });
  doc
    .moveDown(1)
    .fontSize(8)
    .fillColor("#45537a")
    .text("Invented data for the VisViva demo board. Orbit figures are two-body screening estimates, not a substitute for high-fidelity analysis.");
  doc.end();
  await done;
  return { filename, contentType: "application/pdf", body: Buffer.concat(chunks) };
}

/** The Δv ledger of a budget block as CSV (m/s). */
export function ledgerCsv(filename: string, maneuvers: Maneuver[], note: string): SeedFile {
  const rows = ["maneuver,delta_v_m_s,note", ...maneuvers.map((m) => `"${m.name.replace(/"/g, '""')}",${rounded(m.deltaV * 1000, 1)},`)];
  rows.push(`"total",${rounded(maneuvers.reduce((s, m) => s + m.deltaV, 0) * 1000, 1)},"${note.replace(/"/g, '""')}"`);
  return { filename, contentType: "text/csv", body: Buffer.from(rows.join("\n") + "\n", "utf8") };
}

export interface Elements {
  semiMajorAxis: number;
  eccentricity: number;
  inclination: number;
  raan: number;
  argPeriapsis: number;
  trueAnomaly: number;
}

const EPOCH = "2026-03-01T00:00:00.000";

function vec(values: Record<string, unknown>, name: string): [number, number, number] {
  const v = values[name];
  if (!Array.isArray(v) || v.length !== 3) throw new Error(`the engine gave no ${name} vector`);
  return v as [number, number, number];
}

function stamp(offsetSeconds: number): string {
  return new Date(Date.parse(`${EPOCH}Z`) + offsetSeconds * 1000).toISOString().replace("Z", "");
}

/** A CCSDS OEM (KVN) with `steps` states `stepSeconds` apart, propagated with the engine's two-body propagation. */
export function ephemerisOem(filename: string, objectName: string, originator: string, elements: Elements, steps = 10, stepSeconds = 600): SeedFile {
  const start = engine("elements", "earth", { ...elements });
  const r0 = vec(start, "position");
  const v0 = vec(start, "velocity");
  const lines = [
    "CCSDS_OEM_VERS = 2.0",
    `CREATION_DATE = ${EPOCH}`,
    `ORIGINATOR = ${originator}`,
    "",
    "META_START",
    `OBJECT_NAME = ${objectName}`,
    "OBJECT_ID = DEMO-0001",
    "CENTER_NAME = EARTH",
    "REF_FRAME = EME2000",
    "TIME_SYSTEM = UTC",
    `START_TIME = ${stamp(0)}`,
    `STOP_TIME = ${stamp((steps - 1) * stepSeconds)}`,
    "META_STOP",
    "",
    "COMMENT Two-body prediction made for the VisViva demo (invented mission).",
  ];
  for (let i = 0; i < steps; i++) {
    const state = i === 0 ? { position: r0, velocity: v0 } : engine("propagate", "earth", { position: r0, velocity: v0, time: i * stepSeconds });
    // Round away negative zeros ("-0.000000000") that a zero component would print.
    const r = vec(state, "position").map((x) => (Math.abs(x) < 5e-7 ? 0 : x).toFixed(6));
    const v = vec(state, "velocity").map((x) => (Math.abs(x) < 5e-10 ? 0 : x).toFixed(9));
    lines.push(`${stamp(i * stepSeconds)} ${r.join(" ")} ${v.join(" ")}`);
  }
  return { filename, contentType: "text/plain", body: Buffer.from(lines.join("\n") + "\n", "utf8") };
}

function tleChecksum(line: string): number {
  let sum = 0;
  for (const ch of line) {
    if (ch >= "0" && ch <= "9") sum += Number(ch);
    else if (ch === "-") sum += 1;
  }
  return sum % 10;
}

/**
 * A two-line element set for a planned orbit (placeholder catalogue number; mean motion in
 * revolutions per day from the engine's period). Column layout per the published format.
 */
export function elementSet(filename: string, name: string, elements: Omit<Elements, "trueAnomaly"> & { meanAnomaly: number }): SeedFile {
  const orbit = engine("orbit", "earth", { semiMajorAxis: elements.semiMajorAxis, eccentricity: elements.eccentricity });
  const period = orbit.period as number;
  const revsPerDay = 86_400 / period;
  const deg = (x: number) => x.toFixed(4).padStart(8, " ");
  const l1body = `1 99901U 26001A   26060.00000000  .00000000  00000-0  00000-0 0  999`;
  const ecc = elements.eccentricity.toFixed(7).slice(2);
  const l2body = `2 99901 ${deg(elements.inclination)} ${deg(elements.raan)} ${ecc} ${deg(elements.argPeriapsis)} ${deg(elements.meanAnomaly)} ${revsPerDay.toFixed(8).padStart(11, " ")}    1`;
  const line1 = `${l1body}${tleChecksum(l1body)}`;
  const line2 = `${l2body}${tleChecksum(l2body)}`;
  if (line1.length !== 69 || line2.length !== 69) throw new Error(`element set lines must be 69 characters (got ${line1.length} and ${line2.length})`);
  return { filename, contentType: "text/plain", body: Buffer.from(`${name}\n${line1}\n${line2}\n`, "utf8") };
}
