// A proposer in a real browser attaches an element set, reads what the server made of it,
// makes an orbit-check block from it, names that block as the orbit the text describes, and
// sees the file disagree with the text; the block's orbit downloads as an OPM; the block names
// its file, and says so once that file is removed.
import crypto from "node:crypto";
import { describe, expect, it } from "vitest";
import { tleChecksum } from "@/lib/orbit-files";
import { saveDraft } from "@/lib/dal/proposals";
import { browserSession, signInThroughPage } from "../support/browser";
import { asSessionUser, createBoardWithCast, TEST_PASSWORD } from "../support/factories";
import { dossierDoc, makeProposal } from "../integration/matrix/dossiers";

/** Invented satellite 99006 "VV-LANTERN" at about 548 km and 97.6° (mean elements). */
function lanternTle(): string {
  const l1 = "1 99006U 26005A   26060.50000000  .00000000  00000-0  00000-0 0  999";
  const l2 = "2 99006  97.6000  10.0000 0001000  90.0000   0.0000 15.06000000    1";
  return `VV-LANTERN\n${l1}${tleChecksum(l1)}\n${l2}${tleChecksum(l2)}\n`;
}

describe("orbit files in the browser", () => {
  const { page: openPage } = browserSession();

  it("attaches an element set, makes a block from it and sees the comparison with the text", async () => {
    const cast = await createBoardWithCast();
    const { proposal } = await makeProposal({ cast });
    await saveDraft(asSessionUser(cast.proposer), cast.board.id, proposal.id, {
      revision: 1,
      document: dossierDoc([
        { type: "paragraph", content: [{ type: "text", text: "The operational orbit is 540 km sun-synchronous." }] },
        {
          type: "orbitCheck",
          attrs: {
            blockId: crypto.randomUUID(),
            label: "the operational orbit",
            claim: { kind: "sunSynchronous", body: "earth", given: { altitude: 540 }, claimed: {} },
            initialFrom: null,
          },
        },
      ]),
    });
    const page = await openPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await signInThroughPage(page, cast.proposer.email, TEST_PASSWORD);
    await page.goto("/boards");
    await page.getByRole("link", { name: cast.board.name }).click();
    await page.getByRole("link", { name: proposal.title }).click();
    await page.waitForURL(new RegExp(`/proposals/${proposal.id}$`));
    await page.getByRole("textbox", { name: "Dossier text" }).waitFor();

    await page.locator('input[type="file"]').setInputFiles({ name: "lantern.tle", mimeType: "", buffer: Buffer.from(lanternTle()) });
    const card = page.locator("[data-orbit-file]");
    await card.waitFor({ timeout: 30_000 });
    await expect(card.getByRole("heading", { level: 3 }).textContent()).resolves.toBe("lantern.tle· Two-line element sets");
    await card.getByText("Sun-synchronous").waitFor();
    const orbit = card.locator("dl").first();
    await expect(orbit.textContent()).resolves.toMatch(/Altitude range \(mean\)54\d\.\d – 5\d\d\.\d km/);
    await expect(card.textContent()).resolves.toContain("Mean (SGP4) and osculating elements differ");

    await card.getByRole("button", { name: "Make a claim from this file" }).click();
    const blocks = page.locator("[data-orbit-check-block]");
    await expect.poll(() => blocks.count()).toBe(2);
    const made = blocks.nth(1);
    const name = made.getByLabel("Name in the text");
    await expect(name.inputValue()).resolves.toBe("VV-LANTERN");
    // The block names the file it was made from.
    const madeFrom = made.locator("[data-orbit-check-source]");
    await expect(madeFrom.textContent()).resolves.toBe("Made from lantern.tle, orbit 1");
    await expect(madeFrom.getAttribute("data-orbit-check-source")).resolves.toBe("same");
    // Focus went to the new block's name; the proposer names it as the orbit of the text, key by key.
    await expect.poll(() => name.evaluate((el) => el === document.activeElement)).toBe(true);
    await page.keyboard.press("Control+A");
    await page.keyboard.type("the operational orbit");
    await expect(name.inputValue()).resolves.toBe("the operational orbit");

    const disagreement = page.locator('[data-comparison-status="inconsistent"]');
    await disagreement.waitFor();
    await expect(disagreement.textContent()).resolves.toMatch(
      /^the operational orbit against lantern\.tle: disagreesthe attached element set gives 54\d\.\d km altitude, the text claims 540 km \(the operational orbit; tolerance ±5 km\)/,
    );
    await page.locator('[data-comparison-status="consistent"]').waitFor();

    // The block's orbit as an OPM once the draft is saved.
    await page.locator('[data-save-state="saved"]').waitFor({ timeout: 30_000 });
    // Back to the board and Forward again: the name typed and the comparison it drives are still there.
    await page.goBack();
    await page.getByRole("link", { name: proposal.title }).waitFor();
    await page.goForward();
    await page.getByRole("textbox", { name: "Dossier text" }).waitFor();
    await expect.poll(() => blocks.nth(1).getByLabel("Name in the text").inputValue()).toBe("the operational orbit");
    await page.locator('[data-comparison-status="inconsistent"]').waitFor();
    await expect(page.locator("[data-file-tolerance]").textContent()).resolves.toBe(
      "This call compares orbit files with the text within: altitudes ±5 km, inclination ±0.1°, eccentricity ±0.002, period ±60 s.",
    );
    const link = page.getByRole("link", { name: "OPM of the operational orbit" }).last();
    const href = await link.getAttribute("href");
    expect(href).toMatch(/\/draft\/orbit-checks\/[0-9a-f-]{36}\/opm$/);
    const opm = await page.evaluate(async (url) => (await fetch(url!)).text(), href);
    expect(opm.split("\n")[0]).toBe("CCSDS_OPM_VERS = 2.0");
    expect(opm).toContain("EPOCH = 2026-03-01T12:00:00.000");

    // The proposer removes the file: the block made from it says so and what to do.
    await page.getByRole("button", { name: "Remove lantern.tle" }).click();
    await made.locator('[data-orbit-check-source="removed"]').waitFor();
    await expect(madeFrom.getByRole("status").textContent()).resolves.toBe(
      "lantern.tle is no longer attached to the dossier. Attach it again, or make the claim from another orbit file.",
    );
    await expect(madeFrom.textContent()).resolves.toMatch(/^Made from lantern\.tle, orbit 1/);
    expect(errors).toEqual([]);
  });
});
