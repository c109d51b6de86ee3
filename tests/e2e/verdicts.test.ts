// Verdicts as a proposer and a chair meet them in the browser, typing key by key and moving
// by links: a period typed in minutes (with the unit left at seconds) shows the unit hint;
// the unit choice converts it; a chair tightens the call's policy and sees, on the
// submitted version, the difference under today's rules beside the unchanged record.
import { describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { assertAccessible } from "../support/axe";
import { browserSession } from "../support/browser";
import { asSessionUser, createBoardWithCast, unique } from "../support/factories";
import { makeCall } from "../integration/matrix/dossiers";
import { createProposal } from "@/lib/dal/proposals";

const SHOTS = process.env.VERDICTS_SCREENSHOTS;

async function shot(page: Page, name: string) {
  if (SHOTS) await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });
}

/** Types into a field key by key, after clearing it the way a person does. */
async function retype(page: Page, selector: ReturnType<Page["locator"]>, text: string) {
  await selector.click();
  await page.keyboard.press("Control+A");
  await page.keyboard.press("Backspace");
  await page.keyboard.type(text);
}

describe("verdicts in the browser", () => {
  const { as } = browserSession();

  it("hints at minutes typed for seconds, converts units, and shows today's rules beside the record", async () => {
    const cast = await createBoardWithCast();
    // 1 % relative: the policy before the chair tightens it.
    const call = await makeCall(cast, { tolerance: { relative: 0.01 } });
    const title = unique("Lantern science orbit");
    await createProposal(asSessionUser(cast.proposer), cast.board.id, { title, missionType: "science", callId: call.id, coauthorIds: [] });

    const proposer = await as(cast.proposer.email);
    const errors: string[] = [];
    proposer.on("pageerror", (e) => errors.push(e.message));
    try {
      await proposer.goto("/boards");
      await proposer.getByRole("link", { name: cast.board.name }).click();
      await proposer.getByRole("link", { name: title }).click();
      const editor = proposer.getByRole("textbox", { name: "Dossier text" });
      await editor.waitFor();
      await proposer.getByRole("button", { name: "Insert orbit check" }).click();
      const block = proposer.locator("[data-orbit-check-block]").first();
      await block.waitFor();
      const name = block.getByLabel("Name in the text");
      await expect.poll(() => name.evaluate((el) => el === document.activeElement)).toBe(true);
      await proposer.keyboard.type("the science orbit");

      // A value that is not a number says so on the field, not as a missing orbit shape.
      await block.getByLabel("Altitude h (km)", { exact: true }).click();
      await proposer.keyboard.type("500,5");
      await block.locator("[data-field-error]").filter({ hasText: "not a number; use a point for decimals" }).waitFor();
      await retype(proposer, block.getByLabel("Altitude h (km)", { exact: true }), "500");
      await expect.poll(() => block.locator("[data-field-error]").count()).toBe(0);
      expect(await block.getByLabel("Altitude h (km)", { exact: true }).inputValue()).toBe("500");

      // An altitude far beyond Earth's sphere of influence is warned about on the field.
      await block.getByLabel("Unit of altitude").selectOption("m");
      await expect.poll(() => block.getByLabel("Altitude h (m)", { exact: true }).inputValue()).toBe("500");
      await block.getByLabel("Unit of altitude").selectOption("km");
      await retype(proposer, block.getByLabel("Altitude h (km)", { exact: true }), "5000000");
      await block.locator("[data-field-warning]").filter({ hasText: "beyond Earth's sphere of influence" }).waitFor();
      await retype(proposer, block.getByLabel("Altitude h (km)", { exact: true }), "500");
      await expect.poll(() => block.locator("[data-field-warning]").count()).toBe(0);

      // The period, written in minutes while the unit still says seconds.
      await block.getByLabel("Add a claimed value").selectOption("period");
      await block.getByRole("button", { name: "Add claim" }).click();
      const claimed = block.getByLabel("Claimed Orbital period T (s)", { exact: true });
      await expect.poll(() => claimed.evaluate((el) => el === document.activeElement)).toBe(true);
      await proposer.keyboard.type("94.8");
      await block.getByRole("status").filter({ hasText: "Inconsistent" }).waitFor();
      const hint = block.locator('[data-hint="unit-scale"]');
      await hint.waitFor();
      expect(await hint.innerText()).toContain("It looks like minutes were written where seconds were meant.");
      expect(await block.locator("[data-consistent-means]").innerText()).toMatch(/does not say the mission is feasible or compliant.*checked at 1 %, angles/s);
      await shot(proposer, "verdicts-1-unit-hint");
      await assertAccessible(proposer, "orbit-check block with a unit hint");

      // Choosing minutes converts it (94.8 min = 5688 s, written to ±3 s) and the claim holds at 1 %.
      await block.getByLabel("Unit of claimed orbital period").selectOption("min");
      await block.getByRole("status").filter({ hasText: "Consistent" }).waitFor();
      expect(await block.locator("[data-converted]").innerText()).toContain("= 5688 s");
      expect(await block.getByLabel("Claimed Orbital period T (min)", { exact: true }).inputValue()).toBe("94.8");
      expect(await block.locator('[data-check-quantity="period"]').innerText()).toMatch(/within ±[\d.]+ s \(relative bound\)/);
      await shot(proposer, "verdicts-2-converted");

      await proposer.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });
      await proposer.getByRole("button", { name: "Submit version 1" }).click();
      await proposer.getByRole("heading", { name: "Version 1" }).waitFor({ timeout: 30_000 });
      const figure = proposer.locator('figure[data-status="consistent"]');
      await figure.waitFor();
      expect(await figure.innerText()).toContain("94.8 min (= 5688 s)");
      expect(errors).toEqual([]);
    } finally {
      await proposer.close();
    }

    const chair = await as(cast.chair.email);
    try {
      await chair.goto("/boards");
      await chair.getByRole("link", { name: cast.board.name }).click();
      await chair.getByRole("link", { name: call.title }).first().click();
      await chair.getByText("checked at 1 %, angles 0.05°").first().waitFor();
      // Tighten the relative bound to 0.1 %.
      await retype(chair, chair.getByLabel("Relative bound (%)"), "0.1");
      await chair.getByRole("button", { name: "Save call" }).click();
      await chair.getByRole("status").filter({ hasText: "Saved." }).waitFor();
      await chair.getByText("checked at 0.1 %, angles 0.05°").first().waitFor();
      await shot(chair, "verdicts-4-call-policy");

      await chair.getByRole("link", { name: `${title}: version 1` }).click();
      await chair.getByText(/recorded at submission under orbit-check contract version 2 \(checked at 1 %/).waitFor();
      await chair.getByRole("link", { name: "Run today's rules on this version" }).click();
      const panel = chair.locator("#todays-rules");
      await panel.waitFor();
      const row = panel.locator("[data-rerun-block]").first();
      expect(await row.locator("[data-rerun-stored]").getAttribute("data-rerun-stored")).toBe("consistent");
      expect(await row.locator("[data-rerun-today]").getAttribute("data-rerun-today")).toBe("inconsistent");
      expect(await row.locator('[data-rerun-change="period"]').innerText()).toMatch(/Orbital period: recorded within, today outside/);
      expect(await panel.locator("[data-todays-policy]").innerText()).toContain("checked at 0.1 %");
      // The record beside it is unchanged.
      expect(await chair.locator('figure[data-status="consistent"]').count()).toBe(1);
      await shot(chair, "verdicts-3-todays-rules");
      await assertAccessible(chair, "today's rules beside the record");
      // Back leaves today's rules; the record is still what it was.
      await chair.goBack();
      await expect.poll(() => chair.locator("#todays-rules").count()).toBe(0);
      expect(await chair.locator('figure[data-status="consistent"]').count()).toBe(1);
      await chair.goForward();
      await chair.locator("#todays-rules").waitFor();
    } finally {
      await chair.close();
    }
  });
});
