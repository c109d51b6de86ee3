// Two tabs edit the same draft: the stale one is refused (409), keeps its text, and the
// author reloads the latest revision and reapplies their changes; nothing typed is lost.
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
});
