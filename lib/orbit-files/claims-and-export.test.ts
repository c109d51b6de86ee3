/**
 * Claims made from files, the file-against-text comparison, and the OPM export (round trip
 * through this product's own parser, the requirement).
 */
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { evaluateClaim } from "@/lib/orbit";
import { claimFromSummary } from "./claim";
import { compareFilesWithText, DEFAULT_FILE_TOLERANCE, fileTolerance, type ComparedBlock, type LinkedFile } from "./compare";
import { opmForBlock } from "./export-opm";
import { parseOpmKvn, parseOrbitFile, tleChecksum, type OpmFile } from "./index";
import { summarizeOrbitFile } from "./summary";

const fixture = (name: string) => fs.readFileSync(path.join(__dirname, "fixtures", name), "utf8");

/** Invented satellite 99003 "VV-LANTERN" at about 548 km, 97.6°. */
function lanternTle(): string {
  const l1 = "1 99003U 26002A   26060.50000000  .00000000  00000-0  00000-0 0  999";
  const l2 = "2 99003  97.6000  10.0000 0001000  90.0000   0.0000 15.06000000    1";
  return `VV-LANTERN\n${l1}${tleChecksum(l1)}\n${l2}${tleChecksum(l2)}\n`;
}

function linked(text: string, attachmentId = "00000000-0000-4000-8000-000000000001", filename = "lantern.tle"): LinkedFile {
  const r = parseOrbitFile(text);
  if (!r.ok) throw new Error(r.error.message);
  return { attachmentId, filename, sha256: "a".repeat(64), format: r.file.format, status: "parsed", error: null, summaries: summarizeOrbitFile(r.file) };
}

describe("a claim made from a file", () => {
  it("takes the element set's mean elements as given values, linked by id and SHA-256, and the engine accepts it", () => {
    const file = linked(lanternTle());
    const made = claimFromSummary(file, file.summaries[0]!);
    if ("error" in made) throw new Error(made.error);
    expect(made.label).toBe("VV-LANTERN");
    expect(made.source).toEqual({ attachmentId: file.attachmentId, sha256: file.sha256, filename: "lantern.tle", index: 0 });
    expect(made.claim.given.inclination).toBe(97.6);
    expect(made.claim.given.semiMajorAxis).toBeCloseTo(file.summaries[0]!.mean!.semiMajorAxisKm, 3);
    expect(evaluateClaim({ id: "x", ...made.claim }).status).toBe("consistent");
  });

  it("is refused for a file about another body", () => {
    const file = linked(fixture("ccsds-oem-example.kvn"), undefined, "mgs.oem");
    expect(claimFromSummary(file, file.summaries[0]!)).toEqual({ error: "claims are made from Earth orbits; this one is about MARS BARYCENTER" });
  });
});

describe("the file against the text", () => {
  const file = linked(lanternTle());
  const made = claimFromSummary(file, file.summaries[0]!) as Exclude<ReturnType<typeof claimFromSummary>, { error: string }>;
  const fromFile: ComparedBlock = { blockId: "b1", label: "the operational orbit", claim: made.claim, source: made.source };
  const text: ComparedBlock = {
    blockId: "b2",
    label: "The operational orbit ",
    claim: { kind: "sunSynchronous", body: "earth", given: { altitude: 540 }, claimed: { inclination: 97.6 } },
  };
  const unnamed: ComparedBlock = { blockId: "b3", label: "", claim: { kind: "orbit", given: { altitude: 700 } } };

  it("flags the named orbit whose altitude disagrees beyond the tolerance, in the issue's words", () => {
    const results = compareFilesWithText([fromFile, text, unnamed], [file]);
    expect(results.map((r) => [r.blockId, r.status])).toEqual([
      ["b1", "consistent"],
      ["b2", "inconsistent"],
    ]);
    const alt = results[1]!.rows.find((r) => r.quantity === "altitude")!;
    expect(alt.ok).toBe(false);
    expect(alt.file).toBeGreaterThan(545);
    expect(results[1]!.messages[0]).toBe(
      `the attached element set gives ${Number(alt.file.toFixed(1))} km altitude, the text claims 540 km (The operational orbit ; tolerance ±5 km)`,
    );
    expect(results[1]!.rows.find((r) => r.quantity === "inclination")!.ok).toBe(true);
  });

  it("uses the call's per-unit tolerance when it has one", () => {
    expect(fileTolerance({ km: 20 })).toEqual({ ...DEFAULT_FILE_TOLERANCE, km: 20 });
    expect(compareFilesWithText([fromFile, text], [file], fileTolerance({ km: 20 }))[1]!.status).toBe("consistent");
  });

  it("says when the file changed, was replaced by a new version, or is gone", () => {
    const changed = { ...file, sha256: "b".repeat(64) };
    expect(compareFilesWithText([fromFile], [changed])[0]!.messages[0]).toMatch(
      /^lantern.tle changed since this block was made from it \(SHA-256 bbbbbbbbbbbb…, was aaaaaaaaaaaa…\)\.$/,
    );
    const replaced = { ...file, attachmentId: "00000000-0000-4000-8000-000000000002", sha256: "c".repeat(64) };
    expect(compareFilesWithText([fromFile], [replaced])[0]!.messages[0]).toBe(
      "lantern.tle was replaced by a new version since this block was made from it; the block still holds the earlier file's values.",
    );
    const gone = compareFilesWithText([fromFile], [])[0]!;
    expect(gone.status).toBe("invalid");
    expect(gone.messages[0]).toMatch(/is no longer attached/);
  });
});

describe("export as CCSDS OPM (KVN)", () => {
  it("round trip: a state-vector block exported and parsed back gives the same state", () => {
    const block = {
      blockId: "0f0e0d0c-0000-4000-8000-000000000000",
      label: "Lantern insertion state",
      claim: { kind: "stateVector", body: "earth", given: { position: [6878.137, -12.5, 3.25], velocity: [0.0012, 7.6127, 0.9] } },
    };
    const out = opmForBlock(block, { epochIso: "2026-03-01T12:00:00.000", creationDate: new Date("2026-12-02T00:00:00Z") });
    if (!out.ok) throw new Error(out.error);
    expect(out.filename).toBe("Lantern-insertion-state.opm");
    const back = parseOpmKvn(out.text);
    if (!back.ok) throw new Error(back.error.message);
    const f = back.file as OpmFile;
    expect(f.state.r).toEqual([6878.137, -12.5, 3.25]);
    expect(f.state.v).toEqual([0.0012, 7.6127, 0.9]);
    expect(f.state.epoch.iso).toBe("2026-03-01T12:00:00.000");
    expect(f.metadata).toMatchObject({ objectName: "Lantern insertion state", refFrame: "EME2000", timeSystem: "UTC", centerName: "EARTH" });
    expect(f.header.comments[0]).toMatch(/^Two-body screening estimate/);
  });

  it("round trip: a block made from an element set exports an orbit with the block's semi-major axis, eccentricity and inclination", () => {
    const file = linked(lanternTle());
    const made = claimFromSummary(file, file.summaries[0]!) as Exclude<ReturnType<typeof claimFromSummary>, { error: string }>;
    const out = opmForBlock({ blockId: "b1", label: made.label, claim: made.claim }, { epochIso: file.summaries[0]!.epoch });
    if (!out.ok) throw new Error(out.error);
    const back = parseOrbitFile(out.text);
    if (!back.ok) throw new Error(back.error.message);
    const s = summarizeOrbitFile(back.file)[0]!;
    expect(s.osculating!.semiMajorAxisKm).toBeCloseTo(made.claim.given.semiMajorAxis!, 6);
    expect(s.osculating!.eccentricity).toBeCloseTo(made.claim.given.eccentricity!, 9);
    // The block's inclination is against the equator of date; the OPM holds the EME2000 state, and reading it back
    // rotates it to the equator of date again (lib/orbit/frames.ts, checked in frames.test.ts).
    expect(s.compare!.inclinationDeg).toBeCloseTo(97.6, 9);
    expect(s.planes!.eme2000.inclinationDeg).toBeCloseTo(s.osculating!.inclinationDeg, 12);
    expect(Math.abs(s.osculating!.inclinationDeg - 97.6)).toBeGreaterThan(1e-4);
    expect(out.text).toContain("COMMENT The block leaves RAAN, argument of periapsis, true anomaly open; 0 deg is written for them.");
    expect(out.text).toContain("COMMENT The block's angles are against Earth's equator at the epoch; the state is rotated to EME2000 (IAU-76/FK5 reduction).");
  });

  it("refuses blocks that are no single orbit", () => {
    expect(opmForBlock({ blockId: "b", label: "transfer", claim: { kind: "hohmann", given: { initialAltitude: 300, finalAltitude: 35786 } } })).toEqual({
      ok: false,
      error: "a hohmann block does not describe one orbit; only blocks with an orbit shape or a state can be exported",
    });
  });
});

describe("a block's link to its file survives sanitizing, a forged one does not", () => {
  it("keeps a well-formed source and drops a malformed one", async () => {
    const { sanitizeDossier } = await import("@/lib/dossier/sanitize");
    const block = (source: unknown) => ({
      type: "doc",
      content: [
        {
          type: "orbitCheck",
          attrs: { blockId: "0f0e0d0c-0000-4000-8000-000000000000", label: "x", claim: { kind: "orbit", given: { altitude: 500 } }, source },
        },
      ],
    });
    const good = { attachmentId: "0F0E0D0C-0000-4000-8000-000000000001", sha256: "a".repeat(64), filename: "lantern.tle", index: 2 };
    const kept = sanitizeDossier(block(good)).doc.content[0]!.attrs!.source;
    expect(kept).toEqual({ ...good, attachmentId: good.attachmentId.toLowerCase() });
    const forged = sanitizeDossier(block({ ...good, sha256: "<script>" })).doc.content[0]!.attrs!;
    expect("source" in forged).toBe(false);
  });
});
