import { describe, expect, it } from "vitest";
import { compareFilesWithText, type ComparedBlock, type LinkedFile } from "./compare";
import { DEFAULT_FILE_TOLERANCE, effectiveFileTolerance, fileToleranceSummary, parseFileToleranceValue } from "./tolerance";
import { fileToleranceInputSchema } from "@/lib/validation/dossier";

// Unit factors: 1 km = 1000 m, 1° = 60 arcmin = 3600 arcsec, 1 min = 60 s (SI Brochure, 9th ed., Table 8 for the non-SI units accepted with SI).
describe("file-comparison tolerance typed as people write it", () => {
  it("reads each unit's bound in the units people write", () => {
    expect(parseFileToleranceValue("km", "5 km")).toEqual({ ok: true, value: 5 });
    expect(parseFileToleranceValue("km", "500 m")).toEqual({ ok: true, value: 0.5 });
    expect(parseFileToleranceValue("km", "2.5")).toEqual({ ok: true, value: 2.5 });
    expect(parseFileToleranceValue("deg", "0.05°")).toEqual({ ok: true, value: 0.05 });
    expect(parseFileToleranceValue("deg", "6 arcmin")).toEqual({ ok: true, value: 0.1 });
    expect(parseFileToleranceValue("deg", "36 arcsec")).toEqual({ ok: true, value: 0.01 });
    expect(parseFileToleranceValue("1", "0.001")).toEqual({ ok: true, value: 0.001 });
    expect(parseFileToleranceValue("s", "1 min")).toEqual({ ok: true, value: 60 });
    expect(parseFileToleranceValue("s", 30)).toEqual({ ok: true, value: 30 });
  });

  it("refuses what is not a bound, saying what to type", () => {
    expect(parseFileToleranceValue("km", "5 miles")).toEqual({ ok: false, message: '"miles" is not a unit for altitudes: use km, m' });
    expect(parseFileToleranceValue("km", "five")).toMatchObject({
      ok: false,
      message: expect.stringContaining("type a bound for altitudes such as 5 km or 500 m"),
    });
    expect(parseFileToleranceValue("km", "-1 km")).toMatchObject({ ok: false, message: expect.stringMatching(/^cannot be negative/) });
    expect(parseFileToleranceValue("deg", "20°")).toEqual({ ok: false, message: "can be at most 10°; a wider bound checks nothing" });
    expect(parseFileToleranceValue("1", "0.1 km")).toEqual({ ok: false, message: "eccentricity has no unit: type a plain number such as 0.002" });
    expect(parseFileToleranceValue("s", "")).toMatchObject({ ok: false, message: expect.stringMatching(/^is empty/) });
  });

  it("validates a call's setting through the shared schema, naming the field", () => {
    expect(fileToleranceInputSchema.parse({ km: "1 km", deg: "0.05°", "1": 0.001, s: "30 s" })).toEqual({ km: 1, deg: 0.05, "1": 0.001, s: 30 });
    expect(fileToleranceInputSchema.parse(null)).toBeNull();
    const bad = fileToleranceInputSchema.safeParse({ km: "1 parsec", deg: 0.1, "1": 0.002, s: 60 });
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0]!.path).toEqual(["km"]);
    expect(fileToleranceInputSchema.safeParse({ km: 1, deg: 0.1, "1": 0.002, s: 60, kg: 1 }).success).toBe(false);
  });

  it("falls back to the defaults where the call set nothing, and summarises the bounds", () => {
    expect(effectiveFileTolerance(null)).toEqual(DEFAULT_FILE_TOLERANCE);
    expect(effectiveFileTolerance({ km: 1 })).toEqual({ ...DEFAULT_FILE_TOLERANCE, km: 1 });
    expect(fileToleranceSummary({ km: 5, deg: 0.1, "1": 0.002, s: 60 })).toBe("altitudes ±5 km, inclination ±0.1°, eccentricity ±0.002, period ±60 s");
  });

  it("a tighter bound turns an agreement into a flag (invented orbit: 548.2 km in the file, 545 km in the text)", () => {
    const file: LinkedFile = {
      attachmentId: "a1",
      filename: "orbit.tle",
      sha256: "0".repeat(64),
      format: "tle",
      status: "parsed",
      error: null,
      summaries: [
        {
          index: 0,
          label: "X",
          epoch: "2026-03-01T12:00:00.000",
          timeSystem: "UTC",
          frame: "TEME",
          center: "EARTH",
          basis: "SGP4 mean elements",
          osculating: null,
          mean: null,
          meanVsOsculating: null,
          compare: {
            altitudeKm: 548.2,
            periapsisAltitudeKm: 548.2,
            apoapsisAltitudeKm: 548.2,
            inclinationDeg: 97.6,
            eccentricity: 0.0001,
            periodMin: 95.6,
            basis: "mean",
          },
          sunSynchronous: null,
          state: null,
          notes: [],
        },
      ],
    };
    const blocks: ComparedBlock[] = [
      {
        blockId: "b1",
        label: "the orbit",
        claim: { kind: "circularOrbit", body: "earth", given: { altitude: 545 } },
        source: { attachmentId: "a1", sha256: "0".repeat(64), filename: "orbit.tle", index: 0 },
      },
    ];
    expect(compareFilesWithText(blocks, [file], effectiveFileTolerance(null))[0]!.status).toBe("consistent");
    const tight = compareFilesWithText(blocks, [file], effectiveFileTolerance({ km: 1, deg: 0.1, "1": 0.002, s: 60 }))[0]!;
    expect(tight.status).toBe("inconsistent");
    expect(tight.messages[0]).toBe("the attached element set gives 548.2 km altitude, the text claims 545 km (the orbit; tolerance ±1 km)");
  });
});
