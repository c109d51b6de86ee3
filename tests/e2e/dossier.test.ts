// A proposer in a real browser: writes a dossier with a consistent and an inconsistent
// orbit-check block (live verdicts), uploads a PDF (progress to 100 %), submits, and sees the
// server's own flag on the inconsistent claim.
import { describe, expect, it } from "vitest";
import type { Locator, Page } from "playwright-core";
import { signInThroughPage, browserSession, typeInto } from "../support/browser";
import { createBoardWithCast, TEST_PASSWORD } from "../support/factories";
import { makeCall } from "../integration/matrix/dossiers";

const PDF = Buffer.from(
  "%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[]/Count 0>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n" + "%".repeat(200_000),
  "latin1",
);

async function fillBlock(page: Page, block: Locator, name: string, altitude: string, period: string) {
  await typeInto(block.getByLabel("Name in the text"), name);
  await typeInto(block.getByLabel("Altitude h (km)", { exact: true }), altitude);
  await block.getByLabel("Add a claimed value").selectOption("period");
  await block.getByRole("button", { name: "Add claim" }).click();
  await typeInto(block.getByLabel("Claimed Orbital period T (s)", { exact: true }), period);
}

/** The label of the focused element when it lies inside `scope`, else null. */
function focusedLabelIn(scope: Locator): Promise<string | null> {
  return scope.evaluate((root) => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || !root.contains(el)) return null;
    const byFor = el.id ? document.querySelector(`label[for="${CSS.escape(el.id)}"]`)?.textContent : null;
    return (el.getAttribute("aria-label") ?? byFor ?? el.textContent ?? "").trim();
  });
}

/** Presses Tab, never leaving `scope`, until the focused element's label is `label`. */
async function tabTo(page: Page, scope: Locator, label: string) {
  for (let i = 0; i < 40; i++) {
    await page.keyboard.press("Tab");
    const focused = await focusedLabelIn(scope);
    if (focused === null) throw new Error(`Tab left the block before reaching "${label}"`);
    if (focused === label) return;
  }
  throw new Error(`Tab never reached "${label}"`);
}

describe("writing and submitting a dossier in the browser", () => {
  const { page: openPage } = browserSession();

  it("checks claims live, uploads a PDF, submits, and shows the server's verdicts", async () => {
    const cast = await createBoardWithCast();
    const call = await makeCall(cast, { requiredSections: ["Mission design"] });
    const page = await openPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    try {
      await signInThroughPage(page, cast.proposer.email, TEST_PASSWORD);
      await page.goto(`/boards/${cast.board.id}/proposals`);
      await page.getByText("No proposals yet.").waitFor();
      const form = page.locator("#new-proposal");
      await typeInto(form.getByLabel("Title"), "Lantern lunar pathfinder");
      await form.getByLabel("Call").selectOption(call.id);
      await form.getByRole("button", { name: "Start proposal" }).click();
      await page.waitForURL(/\/proposals\/[0-9a-f-]{36}$/);

      const editor = page.getByRole("textbox", { name: "Dossier text" });
      await editor.waitFor();
      await expect(editor.getByRole("heading", { name: "Mission design" }).count()).resolves.toBe(1);
      await editor.click();
      await page.keyboard.press("Control+End");
      await page.keyboard.type("We park in a 500 km circular orbit before the science phase.");

      await page.getByRole("button", { name: "Insert orbit check" }).click();
      const blocks = page.locator("[data-orbit-check-block]");
      await blocks.first().waitFor();
      await fillBlock(page, blocks.nth(0), "the parking orbit", "500", "5677");
      await blocks.nth(0).getByRole("status").filter({ hasText: "Consistent" }).waitFor();
      // Arrowing through the kinds and back keeps what was typed for the orbit.
      await blocks.nth(0).getByLabel("Kind").focus();
      await page.keyboard.press("ArrowDown");
      await expect.poll(() => blocks.nth(0).getByLabel("Kind").inputValue()).not.toBe("orbit");
      await page.keyboard.press("ArrowUp");
      await expect.poll(() => blocks.nth(0).getByLabel("Kind").inputValue()).toBe("orbit");
      expect(await blocks.nth(0).getByLabel("Altitude h (km)", { exact: true }).inputValue()).toBe("500");
      expect(await blocks.nth(0).getByLabel("Claimed Orbital period T (s)", { exact: true }).inputValue()).toBe("5677");
      await blocks.nth(0).getByRole("status").filter({ hasText: "Consistent" }).waitFor();

      // The second block by keyboard only: the button takes Enter, focus lands in the new
      // block's name, and every field is reached with Tab.
      await page.getByRole("button", { name: "Insert orbit check" }).focus();
      await page.keyboard.press("Enter");
      await expect.poll(() => blocks.count()).toBe(2);
      const name = blocks.nth(1).getByLabel("Name in the text");
      await expect.poll(() => name.evaluate((el) => el === document.activeElement)).toBe(true);
      await page.keyboard.type("the science orbit");
      const second = blocks.nth(1);
      await tabTo(page, second, "Altitude h (km)");
      await page.keyboard.type("500");
      await tabTo(page, second, "Add a claimed value");
      await page.keyboard.type("Orbital period"); // the select's type-ahead: only chooses
      await expect.poll(() => second.getByLabel("Claimed Orbital period T (s)").count()).toBe(0);
      await tabTo(page, second, "Add claim");
      await page.keyboard.press("Enter");
      await expect.poll(() => focusedLabelIn(second)).toBe("Claimed Orbital period T (s)");
      await page.keyboard.type("6100");
      await blocks.nth(1).getByRole("status").filter({ hasText: "Inconsistent" }).waitFor();
      // The plot has its text alternative.
      expect(
        await blocks
          .nth(1)
          .getByRole("img", { name: /Plot of the science orbit.*circular/ })
          .count(),
      ).toBe(1);
      // The summary beside the text lists both claims.
      const summary = page.getByRole("complementary").filter({ hasText: "Claims (live check)" });
      await summary.getByText("1 consistent, 1 inconsistent, 0 cannot be evaluated.").waitFor();

      // Upload a PDF straight to the store; once checked it shows as a file in the list, and
      // no progress bar is left behind.
      await page.locator('input[type="file"]').setInputFiles({ name: "lantern-plan.pdf", mimeType: "application/pdf", buffer: PDF });
      await page.getByRole("list", { name: "Attached files" }).getByRole("link", { name: "lantern-plan.pdf" }).waitFor();
      expect(await page.getByRole("progressbar").count()).toBe(0);

      await page.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });
      await page.getByRole("button", { name: "Submit version 1" }).click();

      // The page now shows version 1 as the server stored and checked it.
      await page.getByRole("heading", { name: "Version 1" }).waitFor({ timeout: 30_000 });
      const flagged = page.locator('figure[data-status="inconsistent"]');
      await flagged.waitFor();
      expect(await flagged.getAttribute("data-block-id")).toMatch(/^[0-9a-f-]{36}$/);
      expect(await flagged.locator("figcaption").innerText()).toContain("the science orbit");
      expect(await flagged.innerText()).toContain("Server check: Inconsistent");
      expect(await flagged.innerText()).toMatch(/Orbital period: claimed [\d.]+ s, recomputed [\d.]+ s, outside ±[\d.]+ s \(relative bound\) \([\d.]+ % off\)/);
      expect(await page.locator('figure[data-status="consistent"]').first().innerText()).toContain("within ±");
      expect(await page.locator('figure[data-status="consistent"] figcaption').innerText()).toContain("the parking orbit");
      await page.getByRole("complementary").filter({ hasText: "Claims (server check)" }).getByText("1 consistent, 1 inconsistent").waitFor();
      await page.getByRole("link", { name: "lantern-plan.pdf" }).waitFor();
      expect(errors).toEqual([]);
    } finally {
      await page.close();
    }
  });
});
