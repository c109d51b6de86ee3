// A refused submission lists what to fix; each "Fix …" link moves focus into the block it
// names (not only the scroll position), so a keyboard user lands where the work is.
import { describe, expect, it } from "vitest";
import { signInThroughPage, browserSession, typeInto } from "../support/browser";
import { createBoardWithCast, TEST_PASSWORD } from "../support/factories";
import { makeCall } from "../integration/matrix/dossiers";

describe("the Fix links after a refused submission", () => {
  const { page: openPage } = browserSession();

  it("focus the named orbit-check block", async () => {
    const cast = await createBoardWithCast();
    const call = await makeCall(cast, { requiredSections: [] });
    const page = await openPage();
    await signInThroughPage(page, cast.proposer.email, TEST_PASSWORD);
    await page.goto("/boards");
    await page.getByRole("link", { name: cast.board.name }).click();
    await page.getByRole("link", { name: "All your proposals, or start one" }).click();
    const form = page.locator("#new-proposal");
    await typeInto(form.getByLabel("Title"), "Wren relay study");
    await form.getByLabel("Call").selectOption(call.id);
    await form.getByRole("button", { name: "Start proposal" }).click();
    await page.waitForURL(/\/proposals\/[0-9a-f-]{36}$/);

    const editor = page.getByRole("textbox", { name: "Dossier text" });
    await editor.click();
    await page.keyboard.press("Control+End");
    await page.keyboard.type("The relay holds a circular orbit.");
    // A block with a name and nothing else cannot be evaluated: the submission is refused.
    await page.getByRole("button", { name: "Insert orbit check" }).click();
    const block = page.locator("[data-orbit-check-block]").first();
    await typeInto(block.getByLabel("Name in the text"), "the relay orbit");
    await page.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });
    await page.getByRole("button", { name: "Submit version 1" }).click();

    const fix = page.getByRole("alert").getByRole("link", { name: /^Fix "the relay orbit"/ });
    await fix.waitFor({ timeout: 30_000 });
    await fix.click();
    // Focus is inside the named block, not on the page body.
    await expect.poll(() => block.evaluate((el) => el.contains(document.activeElement) && document.activeElement !== document.body)).toBe(true);
  });
});
