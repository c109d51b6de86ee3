// What a proposer sees around the text: the editor shows where the focus is, limited fields
// count their characters, and a submitted version draws each orbit-check block with the
// same to-scale plot the editor shows.
import { describe, expect, it } from "vitest";
import { asSessionUser, TEST_PASSWORD } from "../support/factories";
import { browserSession, signInThroughPage } from "../support/browser";
import { saveDraft, submitProposal } from "@/lib/dal/proposals";
import { dossierDoc, makeProposal, orbitBlock } from "../integration/matrix/dossiers";

describe("the dossier as the proposer sees it", () => {
  const { page: openPage } = browserSession();

  it("rings the focused editor, counts title characters, and plots submitted blocks", async () => {
    const { cast, proposal } = await makeProposal();
    const page = await openPage();
    try {
      await signInThroughPage(page, cast.proposer.email, TEST_PASSWORD);
      await page.goto("/boards");
      await page.getByRole("link", { name: cast.board.name }).click();

      // The new-proposal title counts what was typed against its limit.
      await page.getByRole("link", { name: "All your proposals, or start one" }).click();
      const title = page.locator("#new-proposal").getByLabel("Title");
      await title.click();
      await page.keyboard.type("Lantern relay");
      await expect
        .poll(async () => title.evaluate((el) => document.getElementById(el.getAttribute("aria-describedby")!.split(" ").at(-1)!)?.textContent))
        .toBe("13 of 200 characters");
      await page.goBack();

      // The editor shows a focus ring when it has the focus, and none when it has not.
      await page.getByRole("link", { name: proposal.title }).first().click();
      const editor = page.getByRole("textbox", { name: "Dossier text" });
      await editor.waitFor();
      const outline = () => editor.evaluate((el) => `${getComputedStyle(el).outlineStyle} ${getComputedStyle(el).outlineWidth}`);
      expect(await outline()).toMatch(/^none/);
      await editor.click();
      await expect.poll(outline).toBe("solid 2px");
      await page.keyboard.press("Shift+Tab");
      await expect.poll(outline).toMatch(/^none/);
      await page.close();
    } catch (error) {
      await page.close();
      throw error;
    }

    // A submitted version with two blocks: each is plotted beside its server verdict.
    const proposer = asSessionUser(cast.proposer);
    await saveDraft(proposer, cast.board.id, proposal.id, {
      revision: 1,
      document: dossierDoc([
        { type: "paragraph", content: [{ type: "text", text: "Two orbits." }] },
        orbitBlock("the parking orbit", { kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: 5677 } }),
        orbitBlock("the science orbit", { kind: "orbit", body: "earth", given: { altitude: 800 }, claimed: { period: 6052 } }),
      ]),
    });
    await submitProposal(proposer, cast.board.id, proposal.id);
    const reader = await openPage();
    try {
      await signInThroughPage(reader, cast.proposer.email, TEST_PASSWORD);
      await reader.goto("/boards");
      await reader.getByRole("link", { name: cast.board.name }).click();
      await reader.getByRole("link", { name: proposal.title }).first().click();
      await reader.getByRole("link", { name: "Version 1" }).first().click();
      const plotted = reader.locator("[data-orbit-check-with-plot]");
      await expect.poll(() => plotted.count()).toBe(2);
      await plotted
        .nth(0)
        .getByRole("img", { name: /^Plot of the parking orbit\. Drawn to scale .* circular/ })
        .waitFor();
      await plotted
        .nth(1)
        .getByRole("img", { name: /^Plot of the science orbit\./ })
        .waitFor();
      expect(await plotted.nth(0).locator("figure.orbit-check figcaption").innerText()).toContain("the parking orbit");
    } finally {
      await reader.close();
    }
  });
});
