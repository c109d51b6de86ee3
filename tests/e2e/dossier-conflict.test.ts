// Two tabs edit the same draft: the stale one is refused (409), keeps its text, and the
// author reloads the latest revision and reapplies their changes; nothing typed is lost.
// Changes to different blocks merge; changes to the same block keep this tab's text and
// leave the other revision readable and restorable.
import { describe, expect, it } from "vitest";
import { asSessionUser } from "../support/factories";
import { signInThroughPage, browserSession } from "../support/browser";
import { TEST_PASSWORD } from "../support/factories";
import { getDraft } from "@/lib/dal/proposals";
import { makeProposal } from "../integration/matrix/dossiers";

describe("autosave conflicts in the browser", () => {
  const { page: openPage } = browserSession();

  it("refuses the stale tab's save and recovers without losing its text", async () => {
    const { cast, proposal } = await makeProposal();
    const first = await openPage();
    const second = await openPage();
    try {
      for (const page of [first, second]) {
        await signInThroughPage(page, cast.proposer.email, TEST_PASSWORD);
        await page.goto(`/boards/${cast.board.id}/proposals/${proposal.id}`);
        await page.getByRole("textbox", { name: "Dossier text" }).waitFor();
      }
      const type = async (page: typeof first, text: string) => {
        await page.getByRole("textbox", { name: "Dossier text" }).click();
        await page.keyboard.press("Control+End");
        await page.keyboard.type(text);
      };
      await type(first, "Text from the first tab.");
      await first.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });

      await type(second, "Text from the second tab.");
      const alert = second.getByRole("alert").filter({ hasText: "changed elsewhere" });
      await alert.waitFor({ timeout: 20_000 });
      expect(await second.getByRole("textbox", { name: "Dossier text" }).innerText()).toContain("Text from the second tab.");

      await alert.getByRole("button", { name: "Reload the latest and reapply my changes" }).click();
      await second.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });
      const stored = JSON.stringify((await getDraft(asSessionUser(cast.proposer), cast.board.id, proposal.id)).document);
      expect(stored).toContain("Text from the second tab.");
      // The revision it replaced stays readable in the page, with the first tab's text.
      await second.getByText(/Your text replaced revision \d+/).click();
      await second.getByText("Text from the first tab.").waitFor();
    } finally {
      await first.close();
      await second.close();
    }
  });

  it("merges edits of different sections, keeping both", async () => {
    const { cast, proposal } = await makeProposal({ requiredSections: ["Mission design", "Propulsion"] });
    const first = await openPage();
    const second = await openPage();
    try {
      for (const page of [first, second]) {
        await signInThroughPage(page, cast.proposer.email, TEST_PASSWORD);
        await page.goto(`/boards/${cast.board.id}/proposals/${proposal.id}`);
        await page.getByRole("textbox", { name: "Dossier text" }).waitFor();
      }
      // The first tab writes under the first heading, the second under the last one.
      await first.getByRole("textbox", { name: "Dossier text" }).locator("p").first().click();
      await first.keyboard.type("We park at 500 km.");
      await first.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });

      await second.getByRole("textbox", { name: "Dossier text" }).click();
      await second.keyboard.press("Control+End");
      await second.keyboard.type("Cold gas, 40 m/s.");
      const alert = second.getByRole("alert").filter({ hasText: "changed elsewhere" });
      await alert.waitFor({ timeout: 20_000 });
      await alert.getByRole("button", { name: "Reload the latest and reapply my changes" }).click();
      await second.getByText(/Merged with revision \d+/).waitFor();
      await second.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });

      const text = await second.getByRole("textbox", { name: "Dossier text" }).innerText();
      expect(text).toMatch(/Mission design\s+We park at 500 km\.\s+Propulsion\s+Cold gas, 40 m\/s\./);
      const stored = JSON.stringify((await getDraft(asSessionUser(cast.proposer), cast.board.id, proposal.id)).document);
      expect(stored).toContain("We park at 500 km.");
      expect(stored).toContain("Cold gas, 40 m/s.");
      expect(await second.getByText(/Your text replaced revision/).count()).toBe(0);
    } finally {
      await first.close();
      await second.close();
    }
  });
});
