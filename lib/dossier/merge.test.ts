import { describe, expect, it } from "vitest";
import { mergeDocuments, type DossierDocument } from "./merge";

const p = (text: string) => ({ type: "paragraph", content: [{ type: "text", text }] });
const h = (text: string) => ({ type: "heading", attrs: { level: 2 }, content: [{ type: "text", text }] });
const doc = (...content: unknown[]): DossierDocument => ({ type: "doc", content });

const base = doc(h("Mission design"), p("We park at 500 km."), h("Propulsion"), p("Cold gas."));

describe("mergeDocuments", () => {
  it("keeps both edits when they changed different blocks", () => {
    const ours = doc(h("Mission design"), p("We park at 500 km."), h("Propulsion"), p("Cold gas, 40 m/s."));
    const theirs = doc(h("Mission design"), p("We park at 550 km."), h("Propulsion"), p("Cold gas."));
    expect(mergeDocuments(base, ours, theirs)).toEqual({
      ok: true,
      document: doc(h("Mission design"), p("We park at 550 km."), h("Propulsion"), p("Cold gas, 40 m/s.")),
    });
  });

  it("keeps an insertion on one side and a deletion on the other", () => {
    const ours = doc(h("Mission design"), p("We park at 500 km."), p("A new paragraph."), h("Propulsion"), p("Cold gas."));
    const theirs = doc(h("Mission design"), p("We park at 500 km."), h("Propulsion"));
    expect(mergeDocuments(base, ours, theirs)).toEqual({
      ok: true,
      document: doc(h("Mission design"), p("We park at 500 km."), p("A new paragraph."), h("Propulsion")),
    });
  });

  it("treats the same change on both sides as no conflict", () => {
    const same = doc(h("Mission design"), p("We park at 600 km."), h("Propulsion"), p("Cold gas."));
    expect(mergeDocuments(base, same, same)).toEqual({ ok: true, document: same });
  });

  it("refuses when both changed the same block", () => {
    const ours = doc(h("Mission design"), p("We park at 500 km, then raise."), h("Propulsion"), p("Cold gas."));
    const theirs = doc(h("Mission design"), p("We park at 450 km."), h("Propulsion"), p("Cold gas."));
    expect(mergeDocuments(base, ours, theirs)).toEqual({ ok: false, conflicts: 1 });
  });

  it("sees through the editor's key order and default attributes", () => {
    // As the editor might write the unchanged heading: other key order, an unknown attribute.
    const editorHeading = { content: [{ text: "Mission design", type: "text" }], attrs: { level: 2, textAlign: null }, type: "heading" };
    const ours = doc(editorHeading, p("We park at 500 km."), h("Propulsion"), p("Cold gas, 40 m/s."));
    const theirs = doc(h("Mission design"), p("We park at 550 km."), h("Propulsion"), p("Cold gas."));
    const merged = mergeDocuments(base, ours, theirs);
    expect(merged.ok).toBe(true);
    expect(merged.ok && merged.document.content).toEqual([h("Mission design"), p("We park at 550 km."), h("Propulsion"), p("Cold gas, 40 m/s.")]);
  });

  it("copes with documents without content", () => {
    expect(mergeDocuments({ type: "doc" }, doc(p("a")), { type: "doc" })).toEqual({ ok: true, document: { type: "doc", content: [p("a")] } });
  });
});
