/**
 * OEM covariance blocks (CCSDS 502.0-B-2, OEM covariance section, KVN and XML; layout recalled
 * from memory): every matrix is read and checked, the first, the last and a bounded sample are
 * kept. The numbers are those of the standard's second OPM example covariance (the fixture
 * ccsds-opm-example.xml, recalled from memory), so KVN, XML and OPM must agree.
 */
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { LIMITS, parseOrbitFile, type OemFile, type OpmFile } from "./index";
import { COVARIANCE_KEYS } from "./odm";

const fixture = (name: string) => fs.readFileSync(path.join(__dirname, "fixtures", name), "utf8");
const opm = (() => {
  const r = parseOrbitFile(fixture("ccsds-opm-example.xml"));
  if (!r.ok) throw new Error(r.error.message);
  return r.file as OpmFile;
})();
const TRIANGLE = opm.covariance!.lowerTriangle;
const rows = (values: number[]) =>
  [0, 1, 3, 6, 10, 15].map((start, r) =>
    values
      .slice(start, start + r + 1)
      .map((x) => x.toExponential(15))
      .join(" "),
  );

/** The example OEM's first segment (KVN, up to its last state line) followed by a covariance block. */
function withCovariance(block: string[]): string {
  const lines = fixture("ccsds-oem-example.kvn").split("\n");
  const second = lines.findIndex((l, i) => i > 0 && l.trim() === "META_START" && lines.slice(0, i).some((x) => x.trim() === "META_STOP"));
  return [...lines.slice(0, second), "COVARIANCE_START", ...block, "COVARIANCE_STOP", ""].join("\n");
}

function matrix(epoch: string, values = TRIANGLE, frame: string | null = "EME2000"): string[] {
  return [`EPOCH = ${epoch}`, ...(frame ? [`COV_REF_FRAME = ${frame}`] : []), ...rows(values)];
}

function parsed(text: string): OemFile {
  const r = parseOrbitFile(text);
  if (!r.ok) throw new Error(r.error.message);
  return r.file as OemFile;
}

function refused(text: string): string {
  const r = parseOrbitFile(text);
  if (r.ok) throw new Error("expected a refusal");
  return r.error.message;
}

describe("OEM covariance", () => {
  it("keeps the matrices of a KVN block: epoch, frame and the 21 values of the lower triangle", () => {
    const f = parsed(
      withCovariance([...matrix("1996-12-18T12:00:00.331"), "COMMENT second matrix in the RTN frame", ...matrix("1996-12-18T12:02:00.331", TRIANGLE, "RTN")]),
    );
    const seg = f.segments[0]!;
    expect(seg.covarianceCount).toBe(2);
    expect(seg.covariance!.first.epoch.iso).toBe("1996-12-18T12:00:00.331");
    expect(seg.covariance!.first.refFrame).toBe("EME2000");
    expect(seg.covariance!.first.lowerTriangle).toEqual(TRIANGLE);
    expect(seg.covariance!.last.refFrame).toBe("RTN");
    expect(seg.covariance!.sample).toHaveLength(2);
  });

  it("reads the XML form to the same values, with units checked", () => {
    const xml = fixture("ccsds-oem-example.xml");
    const cov = [
      "<covarianceMatrix>",
      "<EPOCH>1996-12-18T12:00:00.331</EPOCH>",
      "<COV_REF_FRAME>EME2000</COV_REF_FRAME>",
      ...COVARIANCE_KEYS.map((k, i) => `<${k}>${TRIANGLE[i]!.toExponential(15)}</${k}>`),
      "</covarianceMatrix>",
    ].join("\n");
    const at = xml.lastIndexOf("</data>");
    const f = parsed(`${xml.slice(0, at)}${cov}\n${xml.slice(at)}`);
    const seg = f.segments[f.segments.length - 1]!;
    expect(seg.covarianceCount).toBe(1);
    expect(seg.covariance!.first.lowerTriangle).toEqual(TRIANGLE);
    const wrongUnit = cov.replace("<CX_X>", '<CX_X units="m**2">');
    expect(refused(`${xml.slice(0, at)}${wrongUnit}\n${xml.slice(at)}`)).toMatch(
      /^line \d+: CX_X is given in \[m\*\*2\]; a CCSDS OEM gives it in \[km\*\*2\]$/,
    );
    const missing = cov.replace(/<CZ_DOT_Z_DOT>.*<\/CZ_DOT_Z_DOT>\n/, "");
    expect(refused(`${xml.slice(0, at)}${missing}\n${xml.slice(at)}`)).toMatch(/^line \d+: CZ_DOT_Z_DOT missing in the <covarianceMatrix>$/);
  });

  it("refuses a malformed block at its line, saying what a matrix holds", () => {
    const good = withCovariance(matrix("1996-12-18T12:00:00.331"));
    const lineOf = (text: string, needle: string) => text.split("\n").findIndex((l) => l.startsWith(needle)) + 1;
    // Row 3 with two numbers.
    const shortRow = rows(TRIANGLE)[2]!;
    const cut = good.replace(shortRow, shortRow.split(" ").slice(0, 2).join(" "));
    expect(refused(cut)).toBe(`line ${lineOf(good, shortRow)}: row 3 of a covariance matrix holds 3 numbers (lower triangle); this line has 2`);
    // Truncated: the block ends after four rows.
    const truncated = good.replace(`${rows(TRIANGLE)[4]}\n${rows(TRIANGLE)[5]}\n`, "");
    expect(refused(truncated)).toBe(
      `line ${lineOf(truncated, "COVARIANCE_STOP")}: the covariance matrix of line ${lineOf(good, "EPOCH = 1996-12-18T12:00:00.331")} has 10 of its 21 values (six rows of 1 to 6 numbers)`,
    );
    // A negative variance.
    const negative = good.replace(rows(TRIANGLE)[0]!, `-${rows(TRIANGLE)[0]}`);
    expect(refused(negative)).toBe(`line ${lineOf(good, rows(TRIANGLE)[0]!)}: CX_X is negative; a variance cannot be`);
    // Numbers before the EPOCH line; a frame the product does not read.
    expect(refused(withCovariance(rows(TRIANGLE)))).toMatch(/^line \d+: covariance numbers come after the matrix's EPOCH = line$/);
    expect(refused(withCovariance(matrix("1996-12-18T12:00:00.331", TRIANGLE, "ITRF-97")))).toMatch(/ITRF-97/);
    // A block never closed.
    expect(refused(good.replace("COVARIANCE_STOP\n", ""))).toMatch(/has no COVARIANCE_STOP \(the file is cut short\)$/);
  });

  it("keeps a bounded sample of many matrices, first and last included", () => {
    const block: string[] = [];
    for (let i = 0; i < 500; i += 1) {
      const values = [...TRIANGLE];
      values[0] = i + 1;
      block.push(...matrix(new Date(Date.UTC(1996, 11, 18, 12, 0, 0) + i * 1000).toISOString().replace("Z", ""), values, null));
    }
    const seg = parsed(withCovariance(block)).segments[0]!;
    expect(seg.covarianceCount).toBe(500);
    expect(seg.covariance!.sample.length).toBeLessThanOrEqual(LIMITS.oemSampleCovariances);
    expect(seg.covariance!.first.lowerTriangle[0]).toBe(1);
    expect(seg.covariance!.last.lowerTriangle[0]).toBe(500);
    expect(seg.covariance!.sample[seg.covariance!.sample.length - 1]).toEqual(seg.covariance!.last);
  });
});

describe("covariance in the orbit summary", () => {
  it("gives 1σ per axis (√ of the diagonal) of the first and last matrices, and the count", async () => {
    const { summarizeOrbitFile } = await import("./summary");
    const last = [...TRIANGLE];
    last[0] = 4e-4;
    const [s] = summarizeOrbitFile(parsed(withCovariance([...matrix("1996-12-18T12:00:00.331"), ...matrix("1996-12-18T12:02:00.331", last)])));
    expect(s!.covariance!.count).toBe(2);
    // √(3.331349476038534e-4 km²) = 0.018252 km (the OPM example's CX_X).
    expect(s!.covariance!.first.positionKm[0]).toBeCloseTo(Math.sqrt(3.331349476038534e-4), 15);
    expect(s!.covariance!.first.velocityKmS[2]).toBeCloseTo(Math.sqrt(6.2244443386355e-10), 15);
    expect(s!.covariance!.last.positionKm[0]).toBeCloseTo(0.02, 15);
    expect(s!.covariance!.first.refFrame).toBe("EME2000");
  });
});
