/**
 * The orbit-file parsers against the example messages of CCSDS 502.0-B-2 "Orbit Data
 * Messages" (recalled from memory; see fixtures/README.md), satellite.js's reading of the
 * same element sets, and every refusal the issue lists (line numbers, frames, time systems,
 * units, truncation, line lengths, non-ASCII bytes, too many sets, XML entities).
 */
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { twoline2satrec } from "satellite.js";
import { LIMITS, detectOrbitFormat, parseOrbitFile, tleChecksum, type OemFile, type OmmFile, type OpmFile, type TleFile } from "./index";

const fixture = (name: string) => fs.readFileSync(path.join(__dirname, "fixtures", name), "utf8");

function ok(text: string) {
  const r = parseOrbitFile(text);
  if (!r.ok) throw new Error(`expected a parse, got: ${r.error.message}`);
  return r.file;
}
function refused(text: string) {
  const r = parseOrbitFile(text);
  if (r.ok) throw new Error("expected a refusal");
  return r.error;
}

describe("CCSDS 502.0-B-2 OPM examples (recalled from memory)", () => {
  it("refuses the first example's Earth-fixed frame ITRF-97, naming it and its line", () => {
    const e = refused(fixture("ccsds-opm-example-1.kvn"));
    expect(e.line).toBe(8);
    expect(e.message).toBe("line 8: REF_FRAME ITRF-97 is not accepted; use EME2000 (J2000) or GCRF (TEME only for element sets)");
  });

  it("reads the first example's values when the frame is an accepted one", () => {
    const f = ok(fixture("ccsds-opm-example-1.kvn").replace("ITRF-97", "EME2000")) as OpmFile;
    expect(f.format).toBe("opm");
    expect(f.header).toMatchObject({ version: "2.0", creationDate: "1998-11-06T09:23:57", originator: "JAXA" });
    expect(f.metadata).toMatchObject({ objectName: "GODZILLA 5", objectId: "1998-999A", centerName: "EARTH", refFrame: "EME2000", timeSystem: "UTC" });
    expect(f.state.epoch.iso).toBe("1998-12-18T14:28:15.117");
    expect(f.state.r).toEqual([6503.514, 1239.647, -717.49]);
    expect(f.state.v).toEqual([-0.87316, 8.74042, -4.191076]);
    expect(f.spacecraft).toEqual({ mass: 3000, solarRadArea: 18.77, solarRadCoeff: 1, dragArea: 18.77, dragCoeff: 2.5 });
    expect(f.keplerian).toBeNull();
    expect(f.covariance).toBeNull();
  });

  it("refuses the second example's TOD frame and reads it in EME2000: units, Keplerian elements, two maneuvers", () => {
    expect(refused(fixture("ccsds-opm-example-2.kvn")).message).toBe(
      "line 9: REF_FRAME TOD is not accepted; use EME2000 (J2000) or GCRF (TEME only for element sets)",
    );
    const f = ok(fixture("ccsds-opm-example-2.kvn").replace("REF_FRAME = TOD", "REF_FRAME = EME2000")) as OpmFile;
    expect(f.state.r).toEqual([6655.9942, -40218.5751, -82.9177]);
    expect(f.keplerian).toEqual({
      semiMajorAxis: 41399.5123,
      eccentricity: 0.020842611,
      inclination: 0.117746,
      raan: 17.604721,
      argPericenter: 218.242943,
      trueAnomaly: 41.922339,
      meanAnomaly: null,
      gm: 398600.4415,
    });
    expect(f.maneuvers).toHaveLength(2);
    expect(f.maneuvers[1]).toEqual({ epochIgnition: "2000-06-05T18:59:21.0", duration: 0, deltaMass: -1.469, refFrame: "RTN", dv: [0.001015, -0.001873, 0] });
    expect(f.header.comments).toContain("Current intermediate orbit IO2 and maneuver planning data");
  });

  it("reads the XML form of the second example to the same values, covariance included", () => {
    const kvn = ok(fixture("ccsds-opm-example-2.kvn").replace("REF_FRAME = TOD", "REF_FRAME = EME2000")) as OpmFile;
    const xml = ok(fixture("ccsds-opm-example.xml")) as OpmFile;
    expect(xml.encoding).toBe("xml");
    expect(xml.state).toEqual(kvn.state);
    expect(xml.keplerian).toEqual(kvn.keplerian);
    expect(xml.spacecraft).toEqual(kvn.spacecraft);
    expect(xml.maneuvers[0]).toEqual(kvn.maneuvers[0]);
    expect(xml.covariance?.refFrame).toBe("EME2000");
    expect(xml.covariance?.lowerTriangle).toHaveLength(21);
    expect(xml.covariance?.lowerTriangle[0]).toBeCloseTo(3.331349476038534e-4, 15);
    expect(xml.covariance?.lowerTriangle[20]).toBeCloseTo(6.2244443386355e-10, 20);
  });
});

describe("CCSDS 502.0-B-2 OMM example (recalled from memory)", () => {
  const expectOmm = (f: OmmFile) => {
    expect(f.metadata).toMatchObject({ objectName: "GOES-9", refFrame: "TEME", timeSystem: "UTC", meanElementTheory: "SGP/SGP4" });
    expect(f.meanElements.epoch.iso).toBe("2007-03-05T10:34:41.426");
    expect(f.meanElements).toMatchObject({
      meanMotion: 1.00273272,
      eccentricity: 0.0005013,
      inclination: 3.0539,
      raan: 81.7939,
      argPericenter: 249.2363,
      meanAnomaly: 150.1602,
      gm: 398600.8,
    });
    expect(f.tleParameters).toEqual({
      ephemerisType: 0,
      classificationType: "U",
      noradCatId: 23581,
      elementSetNo: 925,
      revAtEpoch: 4316,
      bstar: 0.0001,
      meanMotionDot: -0.00000113,
      meanMotionDdot: 0,
    });
  };
  it("reads the KVN form", () => expectOmm(ok(fixture("ccsds-omm-example.kvn")) as OmmFile));
  it("reads the XML form to the same values", () => expectOmm(ok(fixture("ccsds-omm-example.xml")) as OmmFile));
  it("refuses TEME with a theory other than SGP4", () => {
    expect(refused(fixture("ccsds-omm-example.kvn").replace("SGP/SGP4", "DSST")).message).toBe(
      "line 7: REF_FRAME TEME goes with MEAN_ELEMENT_THEORY SGP/SGP4, not DSST",
    );
  });
});

describe("CCSDS 502.0-B-2 OEM example (recalled from memory)", () => {
  it("reads both segments: metadata, counts, first and last states", () => {
    const f = ok(fixture("ccsds-oem-example.kvn")) as OemFile;
    expect(f.segments).toHaveLength(2);
    const [a, b] = f.segments as [OemFile["segments"][0], OemFile["segments"][0]];
    expect(a.metadata).toMatchObject({
      objectName: "MARS GLOBAL SURVEYOR",
      centerName: "MARS BARYCENTER",
      refFrame: "EME2000",
      startTime: "1996-12-18T12:00:00.331",
      useableStartTime: "1996-12-18T12:10:00.331",
      interpolation: "HERMITE",
      interpolationDegree: 7,
    });
    expect(a.stateCount).toBe(4);
    expect(a.first.r).toEqual([2789.619, -280.045, -1746.755]);
    expect(a.last.v).toEqual([-3.28827, -3.66735, 1.63861]);
    expect(b.first.epoch.iso).toBe("1996-12-28T21:29:07.267");
    expect(b.last.r).toEqual([2164.375, 1115.811, -688.131]);
    expect(a.sample.length).toBe(4);
  });
  it("reads the XML form of the first segment to the same states", () => {
    const kvn = ok(fixture("ccsds-oem-example.kvn")) as OemFile;
    const xml = ok(fixture("ccsds-oem-example.xml")) as OemFile;
    expect(xml.segments[0]!.first).toEqual(kvn.segments[0]!.first);
    expect(xml.segments[0]!.last).toEqual(kvn.segments[0]!.last);
    expect(xml.segments[0]!.metadata).toEqual(kvn.segments[0]!.metadata);
  });
  it("keeps a bounded sample of a long segment, first and last included", () => {
    const head = fixture("ccsds-oem-example.kvn").split("\n").slice(0, 18).join("\n").replace("1996-12-28T21:28:00.331", "1996-12-30T00:00:00.000");
    const lines: string[] = [];
    for (let i = 0; i < 3000; i += 1)
      lines.push(`${new Date(Date.UTC(1996, 11, 18, 12, 0, 1) + i * 60_000).toISOString().replace("Z", "")} 7000 ${i} 0 0 7.5 0`);
    const f = ok(`${head}\n${lines.join("\n")}\n`) as OemFile;
    const seg = f.segments[0]!;
    expect(seg.stateCount).toBe(3000);
    expect(seg.sample.length).toBeLessThanOrEqual(LIMITS.oemSampleStates);
    expect(seg.sample[0]).toEqual(seg.first);
    expect(seg.sample[seg.sample.length - 1]).toEqual(seg.last);
    expect(seg.last.r[1]).toBe(2999);
  });
});

/** An element set for the invented satellite 99001 ("VV-TEST"); checksums computed. */
function makeTle(incl: number, raan: number, ecc: number, argp: number, ma: number, n: number, day = "001.50000000"): [string, string] {
  const f = (x: number, w: number, d: number) => x.toFixed(d).padStart(w, " ");
  const l1 = `1 99001U 24001A   24${day}  .00000000  00000-0  00000-0 0  999`;
  const e = Math.round(ecc * 1e7)
    .toString()
    .padStart(7, "0");
  const l2 = `2 99001 ${f(incl, 8, 4)} ${f(raan, 8, 4)} ${e} ${f(argp, 8, 4)} ${f(ma, 8, 4)} ${f(n, 11, 8)}    1`;
  return [l1 + tleChecksum(l1), l2 + tleChecksum(l2)];
}

describe("two-line element sets", () => {
  it("reads the SGP4 verification set 00005 (Vallado et al. 2006) as satellite.js does", () => {
    const text = fixture("sgp4-verification-00005.tle");
    const f = ok(text) as TleFile;
    const s = f.sets[0]!;
    const [l1, l2] = text.trim().split("\n") as [string, string];
    const satrec = twoline2satrec(l1, l2);
    expect(s.catalogNumber).toBe("00005");
    expect(s.eccentricity).toBe(satrec.ecco);
    expect(s.inclination).toBeCloseTo((satrec.inclo * 180) / Math.PI, 10);
    expect(s.bstar).toBeCloseTo(satrec.bstar, 15);
    // Julian date of the epoch (satellite.js) against our epoch in ms since 1970 (JD 2440587.5).
    expect(s.epoch.ms / 86_400_000 + 2_440_587.5).toBeCloseTo(satrec.jdsatepoch, 7);
    expect(s.epoch.iso).toBe("2000-06-27T18:50:19.734");
  });

  it("agrees with satellite.js field by field over 500 generated element sets", () => {
    let seed = 11;
    const rand = () => (seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 4294967296;
    for (let k = 0; k < 500; k += 1) {
      const n = 1 + rand() * 15;
      const [l1, l2] = makeTle(rand() * 180, rand() * 359.9, rand() * (n > 10 ? 0.02 : 0.3), rand() * 359.9, rand() * 359.9, n);
      const s = (ok(`${l1}\n${l2}\n`) as TleFile).sets[0]!;
      const satrec = twoline2satrec(l1, l2);
      expect(s.eccentricity).toBeCloseTo(satrec.ecco, 12);
      expect(s.inclination).toBeCloseTo((satrec.inclo * 180) / Math.PI, 9);
      expect(s.raan).toBeCloseTo((satrec.nodeo * 180) / Math.PI, 9);
      expect(s.argPerigee).toBeCloseTo((satrec.argpo * 180) / Math.PI, 9);
      expect(s.meanAnomaly).toBeCloseTo((satrec.mo * 180) / Math.PI, 9);
    }
  });

  it("reads several named sets from one file", () => {
    const a = makeTle(97.6, 10, 0.001, 90, 0, 15.2);
    const b = makeTle(51.6, 200, 0.0005, 45, 120, 15.5);
    const f = ok(`VV-TEST A\n${a.join("\n")}\n0 VV-TEST B\n${b.join("\n")}\n`) as TleFile;
    expect(f.sets.map((s) => [s.name, s.line, s.inclination])).toEqual([
      ["VV-TEST A", 2, 97.6],
      ["VV-TEST B", 5, 51.6],
    ]);
  });

  it("names the line and both checksums when one is wrong", () => {
    const [l1, l2] = makeTle(97.6, 10, 0.001, 90, 0, 15.2);
    const good = Number(l2[68]);
    const bad = (good + 4) % 10;
    expect(refused(`${l1}\n${l2.slice(0, 68)}${bad}\n`).message).toBe(`line 2: checksum ${bad} expected ${good}`);
  });

  it("refuses wrong line lengths, truncation and broken columns at their line", () => {
    const [l1, l2] = makeTle(97.6, 10, 0.001, 90, 0, 15.2);
    expect(refused(`${l1}\n${l2.slice(0, 60)}\n`).message).toBe("line 2: element-set line 2 has 60 characters; it must have 69 (it is cut short)");
    expect(refused(`${l1} 12\n${l2}\n`).message).toBe("line 1: element-set line 1 has 72 characters; it must have 69 (it is too long)");
    expect(refused(`${l1}\n`).message).toBe("line 1: line 1 of an element set is not followed by its line 2 (the file is cut short)");
    expect(refused(`NAME ONLY\n`).message).toMatch(/^line 1: /);
    const shifted = l2.slice(0, 8) + "X" + l2.slice(9, 68);
    expect(refused(`${l1}\n${shifted}${tleChecksum(shifted)}\n`).message).toBe(
      'line 2: columns 9–16 (inclination) hold "X97.6000", which is not a valid inclination',
    );
  });

  it("refuses non-ASCII bytes naming line and column", () => {
    const [l1, l2] = makeTle(97.6, 10, 0.001, 90, 0, 15.2);
    expect(refused(`SATÉLITE\n${l1}\n${l2}\n`).message).toBe("line 1: column 4: character U+00C9 is not plain ASCII; element-set files hold ASCII text only");
  });

  it("refuses 100,000 element sets (and any count over the cap) without reading them one by one", () => {
    const [l1, l2] = makeTle(97.6, 10, 0.001, 90, 0, 15.2);
    const pair = `${l1}\n${l2}\n`;
    const huge = pair.repeat(100_000);
    expect(refused(huge).message).toMatch(/^the file has \d+ characters; element-set files are read up to 8388608 characters$/);
    const many = pair.repeat(LIMITS.maxElementSets + 1);
    expect(refused(many).message).toBe(
      `the file holds about ${LIMITS.maxElementSets + 1} element sets; at most ${LIMITS.maxElementSets} are read from one file`,
    );
  });
});

describe("CCSDS refusals point at the line", () => {
  const opm = fixture("ccsds-opm-example-1.kvn").replace("ITRF-97", "EME2000");

  it("a missing keyword is reported where its section is", () => {
    const e = refused(opm.replace("EPOCH = 1998-12-18T14:28:15.1172\n", ""));
    expect(e.message).toBe("line 10: EPOCH missing in the state vector");
    const oem = fixture("ccsds-oem-example.kvn").replace("START_TIME = 1996-12-18T12:00:00.331\n", "");
    expect(refused(oem).message).toBe("line 5: START_TIME missing in the metadata");
  });

  it("time systems and frames outside the accepted ones are named", () => {
    expect(refused(opm.replace("TIME_SYSTEM = UTC", "TIME_SYSTEM = GPS")).message).toBe("line 9: TIME_SYSTEM GPS is not accepted; use UTC, TAI or TT");
    expect(refused(opm.replace("EME2000", "TEME")).message).toBe(
      "line 8: REF_FRAME TEME is not accepted; use EME2000 (J2000) or GCRF (TEME only for element sets)",
    );
    expect(ok(opm.replace("EME2000", "GCRF")).format).toBe("opm");
    expect(ok(opm.replace("TIME_SYSTEM = UTC", "TIME_SYSTEM = TT")).format).toBe("opm");
  });

  it("units in brackets must be the standard's", () => {
    expect(refused(opm.replace("X = 6503.514000", "X = 6503514.000 [m]")).message).toBe("line 11: X is given in [m]; a CCSDS OPM gives it in [km]");
    expect(ok(opm.replace("X = 6503.514000", "X = 6503.514000 [km]")).format).toBe("opm");
  });

  it("bad numbers, unknown keywords, duplicates, order and over-long lines", () => {
    expect(refused(opm.replace("Y = 1239.647000", "Y = 1,239.647")).message).toBe('line 12: Y "1,239.647" is not a number');
    expect(refused(opm.replace("MASS = ", "MASSE = ")).message).toBe("line 17: MASSE is not a keyword of a CCSDS OPM");
    expect(refused(`${opm}X = 1\n`).message).toBe("line 22: X belongs in the state vector, which comes before the spacecraft parameters");
    expect(refused(opm.replace("Y = 1239.647000", "X = 1239.647000")).message).toBe("line 12: X appears twice (first on line 11)");
    expect(refused(opm.replace("GODZILLA 5", "G".repeat(300))).message).toBe(
      "line 5: 314 characters; a CCSDS KVN line has at most 254 (recalled from the standard)",
    );
  });

  it("a truncated OEM is refused where it stops", () => {
    const lines = fixture("ccsds-oem-example.kvn").split("\n");
    expect(refused(lines.slice(0, 10).join("\n")).message).toBe("line 10: the metadata block opened on line 5 has no META_STOP (the file is cut short)");
    expect(refused(lines.slice(0, 18).join("\n")).message).toBe("line 17: the segment has no ephemeris lines after its metadata (the file may be cut short)");
    const broken = fixture("ccsds-oem-example.kvn").replace("2783.419 -308.143 -1877.071  5.18604", "2783.419 -308.143 -1877.071");
    expect(refused(broken).message).toBe("line 21: an ephemeris line holds an epoch and 6 numbers (or 9 with accelerations); this one has 6 items");
  });

  it("XML: entities are refused before parsing, never expanded or fetched", () => {
    const xml = fixture("ccsds-opm-example.xml");
    const external = xml
      .replace('<?xml version="1.0" encoding="UTF-8"?>', '<?xml version="1.0"?>\n<!DOCTYPE opm [<!ENTITY x SYSTEM "file:///etc/passwd">]>')
      .replace("GEO SAT W4", "&x;");
    expect(refused(external).message).toBe(
      "line 2: XML DOCTYPE declarations are refused: entities are never fetched or expanded. Remove the declaration and write the values out",
    );
    const laughs = `<?xml version="1.0"?>\n<!DOCTYPE lolz [\n <!ENTITY lol "lol">\n <!ENTITY lol2 "&lol;&lol;&lol;&lol;">\n]>\n<opm id="CCSDS_OPM_VERS" version="2.0"><header/></opm>`;
    expect(refused(laughs).line).toBe(2);
  });

  it("XML: malformed, truncated, wrong units and missing elements", () => {
    const xml = fixture("ccsds-opm-example.xml");
    expect(refused(xml.slice(0, 900)).message).toMatch(/^(line \d+: )?the XML is not well formed/);
    expect(refused(xml.replace('<X units="km">', '<X units="m">')).message).toBe("line 20: X is given in [m]; a CCSDS OPM gives it in [km]");
    expect(refused(xml.replace("<EPOCH>2006-06-03T00:00:00.000</EPOCH>", "")).message).toMatch(/^line \d+: EPOCH missing in the state vector$/);
    expect(refused(xml.replace("<TIME_SYSTEM>UTC</TIME_SYSTEM>", "<TIME_SYSTEM>UT1</TIME_SYSTEM>")).message).toBe(
      "line 15: TIME_SYSTEM UT1 is not accepted; use UTC, TAI or TT",
    );
  });

  it("detects formats from content", () => {
    expect(detectOrbitFormat(fixture("ccsds-oem-example.kvn"))).toEqual({ format: "oem", encoding: "kvn" });
    expect(detectOrbitFormat(fixture("ccsds-omm-example.xml"))).toEqual({ format: "omm", encoding: "xml" });
    expect(detectOrbitFormat(fixture("sgp4-verification-00005.tle"))).toEqual({ format: "tle", encoding: "tle" });
    expect(detectOrbitFormat("Mission notes\nnothing orbital here")).toBeNull();
    expect(refused("Mission notes").message).toMatch(/^line 1: not an orbit file this product reads/);
  });
});
