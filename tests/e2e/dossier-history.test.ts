// Leaving the dossier editor never loses typing: Back pressed before the autosave delay runs
// out sends the pending save at once, and coming back (Forward, or a link) shows the text,
// saved, with no false conflict on the next edit.
import { describe, expect, it } from "vitest";
import { asSessionUser, TEST_PASSWORD } from "../support/factories";
import { browserSession, signInThroughPage } from "../support/browser";
import { getDraft } from "@/lib/dal/proposals";
import { makeProposal } from "../integration/matrix/dossiers";

describe("the dossier editor and the browser history", () => {
  const { page: openPage } = browserSession();

  it("keeps what was typed when Back is pressed at once, through Forward and links", async () => {
    const { cast, proposal } = await makeProposal();
    const page = await openPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    try {
      await signInThroughPage(page, cast.proposer.email, TEST_PASSWORD);
      await page.goto("/boards");
      await page.getByRole("link", { name: cast.board.name }).click();
      await page.getByRole("link", { name: proposal.title }).first().click();
      const editor = page.getByRole("textbox", { name: "Dossier text" });
      await editor.waitFor();
      await editor.click();
      await page.keyboard.press("Control+End");
      await page.keyboard.type("Typed just before leaving.");
      // Still inside the autosave delay: nothing has been sent yet.
      expect(await page.locator("[data-save-state]").getAttribute("data-save-state")).toBe("dirty");
      await page.goBack();
      await page.getByRole("link", { name: proposal.title }).first().waitFor();

      // Forward: the router's cached page is brought up to the saved revision.
      await page.goForward();
      await editor.waitFor();
      await expect.poll(() => editor.innerText(), { timeout: 20_000 }).toContain("Typed just before leaving.");
      const proposer = asSessionUser(cast.proposer);
      expect(JSON.stringify((await getDraft(proposer, cast.board.id, proposal.id)).document)).toContain("Typed just before leaving.");

      // A second edit saves on top of it, without a conflict.
      await editor.click();
      await page.keyboard.press("Control+End");
      await page.keyboard.type(" And more after coming back.");
      await page.goBack();
      await page.getByRole("link", { name: proposal.title }).first().click();
      await editor.waitFor();
      await expect.poll(() => editor.innerText(), { timeout: 20_000 }).toContain("Typed just before leaving. And more after coming back.");
      expect(await page.getByRole("alert").filter({ hasText: "changed elsewhere" }).count()).toBe(0);
      await editor.click();
      await page.keyboard.press("Control+End");
      await page.keyboard.type(" Third.");
      await page.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });
      expect(await page.getByRole("alert").filter({ hasText: "changed elsewhere" }).count()).toBe(0);
      expect(JSON.stringify((await getDraft(proposer, cast.board.id, proposal.id)).document)).toContain(
        "Typed just before leaving. And more after coming back. Third.",
      );
      expect(errors).toEqual([]);
    } finally {
      await page.close();
    }
  });

  it("asks before a reload drops unsaved text", async () => {
    const { cast, proposal } = await makeProposal();
    const page = await openPage();
    try {
      await signInThroughPage(page, cast.proposer.email, TEST_PASSWORD);
      await page.goto("/boards");
      await page.getByRole("link", { name: cast.board.name }).click();
      await page.getByRole("link", { name: proposal.title }).first().click();
      const editor = page.getByRole("textbox", { name: "Dossier text" });
      await editor.waitFor();
      await editor.click();
      await page.keyboard.type("Unsaved words.");
      const dialogs: string[] = [];
      page.on("dialog", (dialog) => {
        dialogs.push(dialog.type());
        void dialog.accept();
      });
      await page.reload();
      await editor.waitFor();
      expect(dialogs).toEqual(["beforeunload"]);
      // Leaving anyway still sent the save on the way out.
      const proposer = asSessionUser(cast.proposer);
      await expect
        .poll(async () => JSON.stringify((await getDraft(proposer, cast.board.id, proposal.id)).document), { timeout: 20_000 })
        .toContain("Unsaved words.");
    } finally {
      await page.close();
    }
  });
});
