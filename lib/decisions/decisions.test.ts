// Pure parts of decisions: the letter block model, merge fields, and version comparison.
import { describe, expect, it } from "vitest";
import { compareClaims, diffText, type VersionCheck } from "./compare";
import { letterBlocks, renderLetterHtml, renderLetterText } from "./letter";
import { applyMergeFields, mergeFieldsIn, unknownMergeFields } from "./merge-fields";
import { DEFAULT_LETTER_TEMPLATE, mergeValues } from "./template";

const doc = (...content: unknown[]) => ({ type: "doc", content });
const para = (...content: unknown[]) => ({ type: "paragraph", content });
const text = (t: string, marks?: { type: string; attrs?: Record<string, unknown> }[]) => ({ type: "text", text: t, ...(marks ? { marks } : {}) });

describe("letter blocks", () => {
  it("keeps paragraphs, headings, lists and safe marks, drops everything else and escapes text", () => {
    const blocks = letterBlocks(
      doc(
        { type: "heading", attrs: { level: 2 }, content: [text("Outcome")] },
        para(text("<b>bold?</b> "), text("yes", [{ type: "bold" }]), text(" see "), text("here", [{ type: "link", attrs: { href: "javascript:alert(1)" } }])),
        {
          type: "bulletList",
          content: [
            { type: "listItem", content: [para(text("one"))] },
            { type: "listItem", content: [para(text("two"))] },
          ],
        },
        { type: "image", attrs: { src: "http://example.org/x.png" } },
        { type: "script", content: [text("nope")] },
      ),
    );
    expect(blocks.map((b) => b.type)).toEqual(["heading", "paragraph", "list"]);
    const html = renderLetterHtml(blocks);
    expect(html).toContain("<h3>Outcome</h3>");
    expect(html).toContain("&lt;b&gt;bold?&lt;/b&gt; <strong>yes</strong> see here");
    expect(html).not.toContain("javascript");
    expect(html).toContain("<ul><li>one</li><li>two</li></ul>");
    expect(renderLetterText(blocks)).toBe("Outcome\n\n<b>bold?</b> yes see here\n\n- one\n- two");
  });

  it("never throws on nonsense", () => {
    for (const bad of [null, 1, "x", [], { content: "x" }, { content: [null, 3, { type: "paragraph", content: [{ type: "text" }] }] }]) {
      expect(() => renderLetterText(letterBlocks(bad))).not.toThrow();
    }
  });
});

describe("merge fields", () => {
  it("finds fields in order, including ones split across marks, and names the unknown ones", () => {
    const blocks = letterBlocks(doc(para(text("Dear {{proposer."), text("name}}", [])), para(text("{{ score.weighted }} and {{score.median}} and {{}}"))));
    expect(mergeFieldsIn(blocks)).toEqual(["proposer.name", "score.weighted", "score.median", ""]);
    expect(unknownMergeFields(blocks)).toEqual(["score.median", ""]);
  });

  it("fills the default template, turning a lone list field into a bulleted list", () => {
    const values = mergeValues({
      proposalTitle: "Tern Cubesat",
      missionType: "",
      proposerName: "Ada Okafor",
      boardName: "Harbour Board",
      callTitle: "Call 7",
      versionNumber: 3,
      versionSubmittedAt: new Date("2031-04-02T10:00:00Z"),
      outcome: "accept",
      decidedAt: new Date("2031-05-01T09:00:00Z"),
      weightedMean: 3.14159,
      spread: null,
      reviewsSubmitted: 2,
      reviewsRequired: 2,
      selectedItems: ["[minor] Units", "[comment] Typo"],
      openItemCount: 1,
      checksTotal: 5,
      checksFlagged: 0,
      chairName: "Ravi Lund",
    });
    const blocks = letterBlocks(DEFAULT_LETTER_TEMPLATE);
    expect(unknownMergeFields(blocks)).toEqual([]);
    const out = renderLetterText(applyMergeFields(blocks, values));
    expect(out).toContain("Dear Ada Okafor,");
    expect(out).toContain("version 3 of “Tern Cubesat”, submitted on 2 Apr 2031 (UTC) to Call 7.");
    expect(out).toContain("Outcome: accepted.");
    expect(out).toContain("The panel returned 2 reviews; the mean of their weighted totals is 3.14.");
    expect(out).toContain("The server recomputed all 5 orbit claims of this version and found them consistent.");
    expect(out).toContain("The full reviews and review items are open to you on VisViva.");
    expect(out).toContain("- [minor] Units\n- [comment] Typo");
    expect(out).toContain("Ravi Lund\nChair, Harbour Board");
  });

  it("words a decision taken without reviews, and counts claims with their flags", () => {
    const facts = {
      proposalTitle: "Tern Cubesat",
      missionType: "",
      proposerName: "Ada Okafor",
      boardName: "Harbour Board",
      callTitle: "Call 7",
      versionNumber: 1,
      versionSubmittedAt: new Date("2031-04-02T10:00:00Z"),
      outcome: "decline" as const,
      decidedAt: new Date("2031-05-01T09:00:00Z"),
      weightedMean: null,
      spread: null,
      reviewsSubmitted: 0,
      reviewsRequired: 2,
      selectedItems: [],
      openItemCount: 0,
      checksTotal: 3,
      checksFlagged: 2,
      checksInconsistent: 2,
      checksInvalid: 0,
      chairName: "Ravi Lund",
    };
    const out = renderLetterText(applyMergeFields(letterBlocks(DEFAULT_LETTER_TEMPLATE), mergeValues(facts)));
    expect(out).toContain("The board took this decision without written reviews from the panel.");
    expect(out).toContain("The server checked the 3 orbit claims of this version and flagged 2 as inconsistent.");
    expect(out).toContain("No written reviews accompany this decision.");
    expect(out).not.toContain("0 reviews");
    expect(out).not.toContain("full reviews");
    const mixed = renderLetterText(
      applyMergeFields(
        letterBlocks(DEFAULT_LETTER_TEMPLATE),
        mergeValues({ ...facts, reviewsSubmitted: 1, weightedMean: 3.6, checksInvalid: 1, checksInconsistent: 1 }),
      ),
    );
    expect(mixed).toContain("The panel returned one review; its weighted total is 3.60.");
    expect(mixed).toContain("flagged 2: 1 inconsistent and 1 that could not be evaluated.");
  });

  it("writes a list field inline with semicolons, and 'none' when empty", () => {
    const blocks = letterBlocks(doc(para(text("Items: {{reviewItems.selected}}.")), para(text("{{reviewItems.selected}}"))));
    expect(renderLetterText(applyMergeFields(blocks, { "reviewItems.selected": ["a", "b"] }))).toBe("Items: a; b.\n\n- a\n- b");
    expect(renderLetterText(applyMergeFields(blocks, { "reviewItems.selected": [] }))).toBe("Items: none.\n\nnone");
  });
});

describe("version comparison", () => {
  it("diffs word by word", () => {
    const d = diffText("The relay rides a low orbit.", "The relay rides a circular orbit.");
    expect(d.changes.filter((c) => c.kind !== "same").map((c) => [c.kind, c.text])).toEqual([
      ["removed", "low"],
      ["added", "circular"],
    ]);
    expect([d.wordsAdded, d.wordsRemoved]).toEqual([1, 1]);
  });

  const check = (blockId: string, label: string, status: VersionCheck["status"], claimed: number, computed = 5863.69): VersionCheck => ({
    blockId,
    label,
    kind: "orbit",
    status,
    claim: { kind: "orbit", given: { altitude: 500 }, claimed: { period: claimed } },
    result: { computed: { period: computed }, checks: [{ quantity: "period", unit: "s", claimed, computed, ok: status === "consistent" }], messages: [] },
  });

  it("pairs claims by block id, then by label, and lists the rest as added or removed", () => {
    const before = [check("a", "parking", "consistent", 5860), check("b", "Drift orbit", "inconsistent", 6100), check("c", "disposal", "consistent", 7000)];
    const after = [check("x", "drift orbit ", "consistent", 5864), check("a", "parking", "consistent", 5860), check("n", "new", "invalid", 1)];
    const out = compareClaims(before, after);
    expect(out.map((c) => [c.label, c.matchedBy, c.change])).toEqual([
      ["drift orbit ", "label", "verdict-changed"],
      ["parking", "blockId", "unchanged"],
      ["new", "none", "added"],
      ["disposal", "none", "removed"],
    ]);
    expect(out[0]!.quantities[0]).toEqual({
      quantity: "period",
      unit: "s",
      before: { claimed: 6100, computed: 5863.69, ok: false },
      after: { claimed: 5864, computed: 5863.69, ok: true },
    });
    expect(compareClaims([check("a", "p", "consistent", 1)], [check("a", "p", "consistent", 2)])[0]!.change).toBe("values-changed");
  });
});
