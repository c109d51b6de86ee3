import { describe, expect, it } from "vitest";
import {
  deltaVBudget,
  dossierPlainText,
  evaluateBlocks,
  extractOrbitChecks,
  missingSections,
  renderDossierHtml,
  sanitizeDossier,
  validateDossier,
} from "./index";

const BLOCK = "3f1c2b4a-5d6e-4f70-8a9b-0c1d2e3f4a5b";
const BOARD = "0b8a1f2e-3c4d-4e5f-9a6b-7c8d9e0f1a2b";
const ATTACHMENT = "9e8d7c6b-5a4f-4e3d-8c2b-1a0f9e8d7c6b";

const hostile = {
  type: "doc",
  content: [
    { type: "heading", attrs: { level: 2, style: "x" }, content: [{ type: "text", text: "Orbit <img src=x onerror=alert(1)>" }] },
    { type: "script", content: [{ type: "text", text: "alert(1)" }] },
    { type: "iframe", attrs: { src: "https://example.com" } },
    { type: "paragraph", content: [{ type: "text", text: "</p><script>alert(2)</script>", marks: [{ type: "bold" }, { type: "blink" }] }] },
    { type: "paragraph", content: [{ type: "text", text: "click", marks: [{ type: "link", attrs: { href: "javascript:alert(3)" } }] }] },
    {
      type: "paragraph",
      content: [{ type: "text", text: "site", marks: [{ type: "link", attrs: { href: 'https://example.org/a?b=1&c="2"', onclick: "x" } }] }],
    },
    { type: "image", attrs: { src: "data:image/png;base64,AAAA", alt: "x" } },
    { type: "image", attrs: { src: `/api/v1/boards/${BOARD}/attachments/${ATTACHMENT}/content`, alt: 'track "A"' } },
    {
      type: "orbitCheck",
      attrs: {
        blockId: BLOCK,
        label: "<b>parking</b>",
        claim: { kind: "orbit", body: "earth", given: { altitude: 500, "bad key": 1, evil: { a: { b: { c: { d: 1 } } } } }, claimed: { period: 5677 } },
        onload: "x",
      },
    },
  ],
};

describe("dossier sanitizer and renderer", () => {
  it("drops unknown nodes, marks and attributes and unsafe links and images", () => {
    const { doc, dropped } = sanitizeDossier(hostile, { boardId: BOARD });
    const text = JSON.stringify(doc);
    expect(text).not.toMatch(/script"|iframe|blink|javascript:|data:image|onload|onclick|style/);
    expect(dropped).toEqual(expect.arrayContaining(["node script", "node iframe", "mark blink", "attr heading.style", "attr orbitCheck.onload"]));
    expect(doc.content.filter((n) => n.type === "image")).toHaveLength(1);
    const block = doc.content.find((n) => n.type === "orbitCheck")!;
    expect(block.attrs!.claim).toEqual({ kind: "orbit", body: "earth", given: { altitude: 500, evil: { a: {} } }, claimed: { period: 5677 } });
    expect(validateDossier(hostile).ok).toBe(true);
  });

  it("escapes every text and attribute and marks orbit-check blocks with their id", () => {
    const html = renderDossierHtml(hostile, { boardId: BOARD, verdicts: { [BLOCK]: { status: "inconsistent", checks: [], messages: ["<i>off</i>"] } } });
    expect(html).not.toContain("<script");
    expect(html).not.toContain("<img src=x");
    expect(html).toContain("Orbit &lt;img src=x onerror=alert(1)&gt;");
    expect(html).toContain("&lt;/p&gt;&lt;script&gt;alert(2)&lt;/script&gt;");
    expect(html).toContain('href="https://example.org/a?b=1&amp;c=%222%22"');
    expect(html).toContain('alt="track &quot;A&quot;"');
    expect(html).toContain(`data-block-id="${BLOCK}"`);
    expect(html).toContain('data-status="inconsistent"');
    expect(html).toContain("&lt;b&gt;parking&lt;/b&gt;");
    expect(html).toContain("&lt;i&gt;off&lt;/i&gt;");
    expect(renderDossierHtml("not a document")).toBe("<p></p>");
  });

  it("states every recomputed quantity of a block, within or outside tolerance", () => {
    const html = renderDossierHtml(hostile, {
      boardId: BOARD,
      verdicts: {
        [BLOCK]: {
          status: "inconsistent",
          checks: [
            { quantity: "period", claimed: 5677, computed: 5676.98, unit: "s", relativeError: 4e-6, ok: true },
            { quantity: "apoapsisAltitude", claimed: 700, computed: 500, unit: "km", relativeError: 0.4, ok: false },
          ],
          messages: [],
        },
      },
    });
    expect(html).toContain('<div data-check-ok="true">Orbital period: claimed 5677 s, recomputed 5676.98 s, within tolerance (0.0004 % off)</div>');
    expect(html).toContain('<div data-check-ok="false">Apoapsis altitude: claimed 700 km, recomputed 500 km, outside tolerance (40 % off)</div>');
  });

  it("shows values as written with their unit, the bound and basis of each check, the hint as a sentence, and what consistent means", () => {
    const doc = {
      type: "doc",
      content: [
        {
          type: "orbitCheck",
          attrs: {
            blockId: BLOCK,
            label: "science orbit",
            claim: { kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: "5790" } },
            written: { given: { altitude: { text: "500000", unit: "m" } }, claimed: { period: { text: "96.5", unit: "min" } } },
          },
        },
      ],
    };
    const html = renderDossierHtml(doc, {
      tolerance: { relative: 0.001, absolute: { deg: 0.05 } },
      verdicts: {
        [BLOCK]: {
          status: "inconsistent",
          checks: [
            {
              quantity: "period",
              claimed: "5790",
              computed: 5676.98,
              unit: "s",
              relativeError: 0.98,
              ok: false,
              allowance: 5.68,
              basis: "relative",
              hint: { code: "unit-scale", message: "looks like minutes", factor: 60 },
            },
          ],
        },
      },
    });
    expect(html).toContain('<th scope="row">Altitude h</th><td>500000 m (= 500 km)</td>');
    expect(html).toContain('<th scope="row">Orbital period T</th><td>96.5 min (= 5790 s)</td>');
    expect(html).toContain("outside ±5.68 s (relative bound)");
    expect(html).toContain("Likely slip: It looks like minutes were written where seconds were meant.");
    expect(html).toContain("This call: checked at 0.1 %, angles 0.05°.");
    expect(html).toContain("does not say the mission is feasible or compliant");
  });

  it("refuses structures the editor cannot hold", () => {
    const result = validateDossier({ type: "doc", content: [{ type: "tableRow", content: [{ type: "paragraph" }] }] });
    expect(result.ok).toBe(false);
    expect(validateDossier({ type: "paragraph" }).ok).toBe(false);
  });

  it("extracts the orbit checks in order, gives plain text, and finds missing sections", () => {
    const blocks = extractOrbitChecks(hostile);
    expect(blocks).toEqual([{ blockId: BLOCK, label: "<b>parking</b>", claim: expect.objectContaining({ kind: "orbit" }), initialFrom: null }]);
    expect(dossierPlainText(hostile)).toContain("[orbit check: <b>parking</b> (Orbit shape)]");
    expect(missingSections(hostile, ["orbit <img src=x onerror=alert(1)>", "Propulsion"])).toEqual(["Propulsion"]);
  });

  it("totals the maneuver claims against the propulsion claim", () => {
    const doc = {
      type: "doc",
      content: [
        {
          type: "orbitCheck",
          attrs: { blockId: "00000000-0000-4000-8000-000000000001", label: "parking", claim: { kind: "orbit", body: "earth", given: { altitude: 500 } } },
        },
        {
          type: "orbitCheck",
          attrs: {
            blockId: "00000000-0000-4000-8000-000000000002",
            label: "raise",
            initialFrom: "00000000-0000-4000-8000-000000000001",
            claim: { kind: "hohmann", body: "earth", given: { finalAltitude: 35786 } },
          },
        },
        {
          type: "orbitCheck",
          attrs: {
            blockId: "00000000-0000-4000-8000-000000000003",
            label: "tilt",
            claim: { kind: "planeChange", body: "earth", given: { angle: 5, altitude: 35786 } },
          },
        },
        {
          type: "orbitCheck",
          attrs: {
            blockId: "00000000-0000-4000-8000-000000000004",
            label: "stage",
            claim: { kind: "rocket", given: { specificImpulse: 320, initialMass: 1000, finalMass: 250 } },
          },
        },
      ],
    };
    const budget = deltaVBudget(evaluateBlocks(extractOrbitChecks(doc)));
    expect(budget.maneuvers.map((m) => m.label)).toEqual(["raise", "tilt"]);
    // Rocket equation: 320 s × 9.80665 m/s² × ln(4) = 4.350 km/s (the engine's own rocket kind).
    expect(budget.available).toBeCloseTo(4.3505, 3);
    expect(budget.required).toBeCloseTo(budget.maneuvers[0]!.deltaV + budget.maneuvers[1]!.deltaV, 9);
    expect(budget.margin).toBeCloseTo((budget.available! - budget.required) / budget.required, 9);
  });

  it("counts only the burns a maneuver block claims, when it does not claim the total", () => {
    const disposal = (claimed: Record<string, number>) => ({
      type: "doc",
      content: [
        {
          type: "orbitCheck",
          attrs: {
            blockId: "00000000-0000-4000-8000-000000000005",
            label: "disposal",
            claim: { kind: "hohmann", body: "earth", given: { initialAltitude: 600, finalAltitude: 200 }, claimed },
          },
        },
      ],
    });
    const firstBurnOnly = deltaVBudget(evaluateBlocks(extractOrbitChecks(disposal({ deltaV1: 0.1 }))));
    const total = deltaVBudget(evaluateBlocks(extractOrbitChecks(disposal({ deltaVTotal: 0.2 }))));
    const both = deltaVBudget(evaluateBlocks(extractOrbitChecks(disposal({ deltaV1: 0.1, deltaVTotal: 0.2 }))));
    // A Hohmann transfer's two burns are never equal between different radii, so the first alone is less than the total.
    expect(firstBurnOnly.required).toBeLessThan(total.required);
    expect(firstBurnOnly.required).toBeGreaterThan(0);
    expect(firstBurnOnly.maneuvers[0]!.claimedDeltaV).toBe(0.1);
    expect(both.required).toBeCloseTo(total.required, 12);
  });
});
