// A block made from an orbit file against the draft's attachments now. Invented demo data
// (file names and digests are made up; no outside source is needed for this bookkeeping).
import { describe, expect, it } from "vitest";
import { sourceNote, sourceOf, sourceState } from "./source";
import { renderDossierHtml } from "@/lib/dossier/render";

const SHA_A = "a".repeat(64);
const SHA_B = "b".repeat(64);
const source = { attachmentId: "11111111-1111-4111-8111-111111111111", sha256: SHA_A, filename: "lantern.tle", index: 0 };

describe("sourceState", () => {
  it("is the same file when the id is there with the same SHA-256", () => {
    expect(sourceState(source, [{ id: source.attachmentId, filename: "lantern.tle", sha256: SHA_A.toUpperCase() }])).toEqual({ state: "same" });
  });
  it("says the file changed when the SHA-256 differs", () => {
    expect(sourceState(source, [{ id: source.attachmentId, filename: "lantern.tle", sha256: SHA_B }])).toEqual({ state: "changed", sha256: SHA_B });
  });
  it("takes the newest upload of the same name as the file's new version when the id is gone", () => {
    const older = { id: "2", filename: "lantern.tle", sha256: SHA_B };
    const newer = { id: "3", filename: "lantern.tle", sha256: SHA_A };
    expect(sourceState(source, [older, { id: "4", filename: "other.tle", sha256: SHA_A }, newer])).toEqual({ state: "replaced", by: newer });
  });
  it("says the file is gone when neither the id nor the name is attached", () => {
    expect(sourceState(source, [{ id: "4", filename: "other.tle", sha256: SHA_A }])).toEqual({ state: "removed" });
    expect(sourceState(source, [])).toEqual({ state: "removed" });
  });
  it("does not guess when the attachments are not known", () => {
    expect(sourceState(source, null)).toEqual({ state: "unknown" });
  });
});

describe("sourceNote", () => {
  it("names the file and the orbit (1-based) and has no problem when unchanged", () => {
    expect(sourceNote({ ...source, index: 2 }, [{ id: source.attachmentId, filename: "lantern.tle", sha256: SHA_A }])).toEqual({
      madeFrom: "Made from lantern.tle, orbit 3",
      state: "same",
      problem: null,
    });
  });
  it("says what happened and what to do", () => {
    expect(sourceNote(source, [{ id: source.attachmentId, filename: "lantern.tle", sha256: SHA_B }]).problem).toBe(
      "lantern.tle has changed since this block was made from it (SHA-256 now bbbbbbbbbbbb…, was aaaaaaaaaaaa…); the values below are still the earlier file's. Make the claim again from the file, or check these values against it.",
    );
    expect(sourceNote(source, [{ id: "9", filename: "lantern.tle", sha256: SHA_B }]).problem).toMatch(
      /^lantern\.tle was replaced by a new upload .* Make the claim again from the new lantern\.tle/,
    );
    expect(sourceNote(source, []).problem).toBe(
      "lantern.tle is no longer attached to the dossier. Attach it again, or make the claim from another orbit file.",
    );
  });
  it("reads only a well-formed source attribute", () => {
    expect(sourceOf(null)).toBeNull();
    expect(sourceOf({ attachmentId: 1, sha256: SHA_A, filename: "x" })).toBeNull();
    expect(sourceOf({ ...source, index: -1 })).toEqual({ ...source, index: 0 });
  });
});

describe("the read-only render", () => {
  const doc = {
    type: "doc",
    content: [
      {
        type: "orbitCheck",
        attrs: {
          blockId: "22222222-2222-4222-8222-222222222222",
          label: "VV-LANTERN",
          claim: { kind: "orbit", body: "earth", given: { altitude: 548 }, claimed: {} },
          initialFrom: null,
          source,
        },
      },
    ],
  };
  it("says which file the block was made from", () => {
    const html = renderDossierHtml(doc);
    expect(html).toContain('data-orbit-check-source="unknown">Made from lantern.tle, orbit 1</div>');
  });
  it("says the file is gone when the attachments are given", () => {
    const html = renderDossierHtml(doc, { attachments: [] });
    expect(html).toContain("lantern.tle is no longer attached to the dossier.");
  });
});
