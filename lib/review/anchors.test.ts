import { describe, expect, it } from "vitest";
import { anchorForTypedQuote, anchorInBounds, makeAnchor, resolveAnchor } from "./anchors";
import { indexDocument, plainText, type DocNode } from "./plain-text";

const text = "The transfer burn at perigee raises apogee to 35786 km. The second burn at apogee circularises the orbit.";

describe("review-item anchors", () => {
  it("makes an anchor with quote and context", () => {
    const from = text.indexOf("35786 km");
    const anchor = makeAnchor(text, from, from + 8, 10);
    expect(anchor).toEqual({ from, to: from + 8, quote: "35786 km", prefix: "apogee to ", suffix: ". The seco" });
  });

  it("keeps the offsets when they still hold the quote", () => {
    const from = text.indexOf("perigee");
    expect(resolveAnchor(text, makeAnchor(text, from, from + 7))).toEqual({ from, to: from + 7, match: "exact" });
  });

  it("finds the quote again after text was inserted before it", () => {
    const from = text.indexOf("circularises");
    const anchor = makeAnchor(text, from, from + 12);
    const edited = `Summary: a two-burn transfer.\n${text}`;
    expect(resolveAnchor(edited, anchor)).toEqual({ from: from + 30, to: from + 42, match: "moved" });
  });

  it("picks the occurrence whose context matches when the quote appears twice", () => {
    // "at apogee" appears once; "apogee" appears twice: the second is after "burn at ".
    const second = text.lastIndexOf("apogee");
    const anchor = makeAnchor(text, second, second + 6);
    const shifted = `  ${text}`;
    expect(resolveAnchor(shifted, anchor)).toEqual({ from: second + 2, to: second + 8, match: "moved" });
  });

  it("survives whitespace changes inside the quote", () => {
    const from = text.indexOf("raises apogee");
    const anchor = makeAnchor(text, from, from + 13);
    const rerendered = text.replace("raises apogee", "raises\n  apogee");
    const resolved = resolveAnchor(rerendered, anchor)!;
    expect(resolved.match).toBe("fuzzy");
    expect(rerendered.slice(resolved.from, resolved.to)).toBe("raises\n  apogee");
  });

  it("gives null when the quote is gone", () => {
    const from = text.indexOf("35786 km");
    expect(resolveAnchor(text.replace("35786 km", "42164 km radius"), makeAnchor(text, from, from + 8))).toBeNull();
  });

  it("checks bounds: empty, reversed and past-the-end ranges are outside the text", () => {
    expect(anchorInBounds({ from: 0, to: 3 }, 3)).toBe(true);
    expect(anchorInBounds({ from: 2, to: 2 }, 3)).toBe(false);
    expect(anchorInBounds({ from: 2, to: 1 }, 3)).toBe(false);
    expect(anchorInBounds({ from: 0, to: 4 }, 3)).toBe(false);
    expect(anchorInBounds({ from: -1, to: 2 }, 3)).toBe(false);
  });
});

describe("dossier plain text", () => {
  const doc: DocNode = {
    type: "doc",
    content: [
      { type: "heading", attrs: { level: 2 }, content: [{ type: "text", text: "Orbit" }] },
      {
        type: "paragraph",
        content: [
          { type: "text", text: "Circular at " },
          { type: "text", text: "500 km", marks: [{ type: "bold" }] },
          { type: "hardBreak" },
          { type: "text", text: "sun-synchronous." },
        ],
      },
      { type: "orbitCheck", attrs: { blockId: "b1", label: "Period", claim: {} } },
      { type: "bulletList", content: [{ type: "listItem", content: [{ type: "paragraph", content: [{ type: "text", text: "Δv 120 m/s" }] }] }] },
    ],
  };

  it("joins text runs, ends each block with a newline and skips orbit-check blocks", () => {
    expect(plainText(doc)).toBe("Orbit\nCircular at 500 km\nsun-synchronous.\nΔv 120 m/s\n");
  });

  it("records where every text run starts, by path", () => {
    const { starts, text: t } = indexDocument(doc);
    expect(starts.get("1.1")).toBe(t.indexOf("500 km"));
    expect(starts.get("3.0.0.0")).toBe(t.indexOf("Δv"));
  });
});

describe("anchorForTypedQuote", () => {
  const text = "The relay parks at 500 km.\nIts period is 95.6 minutes, and the Period of the drift orbit is longer.";

  it("anchors words that occur once, as typed or ignoring case and spacing", () => {
    const exact = anchorForTypedQuote(text, "95.6 minutes");
    expect(exact).toMatchObject({ ok: true, anchor: { quote: "95.6 minutes", from: text.indexOf("95.6") } });
    const loose = anchorForTypedQuote(text, "  parks   AT 500 km ");
    expect(loose).toMatchObject({ ok: true, anchor: { quote: "parks at 500 km" } });
    const acrossLines = anchorForTypedQuote(text, "500 km. Its period");
    expect(acrossLines).toMatchObject({ ok: true, anchor: { quote: "500 km.\nIts period" } });
  });

  it("says when the words are ambiguous, missing or too short", () => {
    // "period" occurs once as typed in lower case, twice ignoring case: the exact match wins.
    expect(anchorForTypedQuote(text, "period")).toMatchObject({ ok: true });
    expect(anchorForTypedQuote(text, "the")).toEqual({ ok: false, message: expect.stringMatching(/occur 2 times/) });
    expect(anchorForTypedQuote(text, "apoapsis")).toEqual({ ok: false, message: expect.stringMatching(/do not occur/) });
    expect(anchorForTypedQuote(text, " a ")).toEqual({ ok: false, message: expect.stringMatching(/at least three/) });
    expect(anchorForTypedQuote(text, "(km")).toEqual({ ok: false, message: expect.stringMatching(/do not occur/) });
  });
});
