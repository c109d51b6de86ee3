// A link budget's minimum elevation copied from a board station keeps the station's name with
// the typed value: kept by the sanitizer, shown in the read-only dossier.
import { describe, expect, it } from "vitest";
import { cleanWritten } from "./schema";
import { renderDossierHtml } from "./render";

describe("a written value copied from a board station", () => {
  it("keeps the station name (trimmed, at most 80 characters) and drops anything that is not text", () => {
    expect(cleanWritten({ given: { minimumElevation: { text: "10", unit: "deg", station: "  North site " } } })).toEqual({
      given: { minimumElevation: { text: "10", unit: "deg", station: "North site" } },
    });
    expect(cleanWritten({ given: { minimumElevation: { text: "10", unit: "deg", station: 5 } } })).toEqual({
      given: { minimumElevation: { text: "10", unit: "deg" } },
    });
    expect(cleanWritten({ given: { minimumElevation: { text: "10", unit: "deg", station: "   " } } })).toEqual({
      given: { minimumElevation: { text: "10", unit: "deg" } },
    });
    expect(cleanWritten({ given: { minimumElevation: { text: "10", unit: "deg", station: "x".repeat(200) } } })?.given?.minimumElevation?.station).toHaveLength(
      80,
    );
  });

  it("the read-only dossier says which station the elevation came from, escaped", () => {
    const doc = {
      type: "doc",
      content: [
        {
          type: "orbitCheck",
          attrs: {
            blockId: "l1",
            label: "X-band downlink",
            claim: { kind: "linkBudget", body: "earth", given: { altitude: 550, minimumElevation: 10 } },
            written: { given: { minimumElevation: { text: "10", unit: "deg", station: "North <site>" } } },
          },
        },
      ],
    };
    const html = renderDossierHtml(doc);
    expect(html).toContain("10 deg, from the board station North &lt;site&gt;");
    expect(html).not.toContain("North <site>");
  });
});
