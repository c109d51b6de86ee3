// The demo board's main screens in the browser, on the demo scenario seeded into a fresh
// board: the dossier editor with its plots, a review in progress, the chair's overview of the
// open call and the decision page. Each must render its content and pass axe-core (no
// serious or critical violations). With VISVIVA_SCREENSHOTS=1 the screens are also saved at
// the fixed viewport to docs/screenshots/ (the README shows them); without it nothing is
// written, so ordinary runs never rewrite the committed images.
import path from "node:path";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { DEMO_ACCOUNTS } from "@/db/seed/accounts";
import { seedDemo } from "@/db/seed/index";
import { DEMO_CAST_PASSWORD, DEMO_PEOPLE, type PersonKey } from "@/db/seed/people";
import type { ScenarioResult } from "@/db/seed/scenario";
import { appUrl } from "../support/app";
import { describeViolations, seriousViolations } from "../support/axe";
import { launchBrowser, newPage, signInThroughPage } from "../support/browser";
import { unique } from "../support/factories";

const SHOTS = path.resolve(__dirname, "..", "..", "docs", "screenshots");

async function shot(page: Page, name: string) {
  if (process.env.VISVIVA_SCREENSHOTS !== "1") return;
  // Let fonts and charts settle before the capture.
  await page.evaluate(() => document.fonts.ready);
  await page.screenshot({ path: path.join(SHOTS, name), fullPage: false });
}

function passwordOf(key: PersonKey): string {
  const person = DEMO_PEOPLE.find((p) => p.key === key)!;
  return DEMO_ACCOUNTS.find((a) => a.email === person.email)?.password ?? DEMO_CAST_PASSWORD;
}

describe("the demo board's main screens", () => {
  let browser: Browser;
  let s: ScenarioResult;

  beforeAll(async () => {
    const slug = unique("kestrel-screens");
    ({ scenario: s } = await seedDemo(db(), {
      mode: "demo",
      board: { slug, name: "Kestrel Small Missions Board", description: "The demo scenario for the screen checks." },
    }));
    await appUrl();
    browser = await launchBrowser();
  });

  afterAll(async () => {
    await browser?.close();
  });

  // Accessibility findings of every screen, reported together at the end.
  const a11y: string[] = [];
  async function assertAccessible(page: Page, where: string) {
    const violations = await seriousViolations(page);
    if (violations.length > 0) a11y.push(describeViolations(where, violations));
  }

  async function as(key: PersonKey): Promise<Page> {
    const page = await newPage(browser);
    await signInThroughPage(page, s.people[key].email, passwordOf(key));
    return page;
  }

  it("renders the editor, a review, the chair's overview and the decision page accessibly", { timeout: 300_000 }, async () => {
    const b = s.boardId;

    // The proposer's draft: live orbit-check blocks with their plots.
    const nadia = await as("nadia");
    await nadia.goto(`/boards/${b}/proposals/${s.proposals.kite}`);
    await nadia.getByRole("textbox", { name: "Dossier text" }).waitFor();
    const blocks = nadia.locator("[data-orbit-check-block]");
    await blocks.nth(3).waitFor();
    await blocks
      .nth(0)
      .getByRole("img", { name: /Plot of the operational orbit/ })
      .waitFor();
    await blocks.nth(0).getByRole("status").filter({ hasText: "Consistent" }).waitFor();
    await nadia
      .getByRole("complementary")
      .filter({ hasText: "Claims (live check)" })
      .getByText("6 consistent, 0 inconsistent, 0 cannot be evaluated.")
      .waitFor();
    await assertAccessible(nadia, "dossier editor (demo draft)");
    // The text of the orbit section above its first block, clear of the sticky toolbar.
    await nadia
      .getByRole("textbox", { name: "Dossier text" })
      .getByRole("heading", { name: "Orbit design" })
      .evaluate((h) => window.scrollTo(0, h.getBoundingClientRect().top + window.scrollY - 140));
    await shot(nadia, "dossier-editor.png");

    // A review in progress: the flagged inclination with the reviewer's note and a review item.
    const piet = await as("piet");
    await piet.goto(`/boards/${b}/proposals/${s.proposals.harrow}/review`);
    await piet.getByRole("heading", { name: "Harrow Sea-Ice Radar Satellite" }).waitFor();
    await piet.locator("li[data-check-block]", { hasText: "the sun-synchronous inclination" }).getByText("Inconsistent").waitFor();
    await piet.locator("li[data-item]", { hasText: "Inclination for the old altitude" }).waitFor();
    await piet.getByTestId("dossier").locator("mark[data-item-id]").first().waitFor();
    await assertAccessible(piet, "review screen (demo)");
    await shot(piet, "review-screen.png");

    // The chair's overview of the open call.
    const chair = await as("chair");
    await chair.goto(`/boards/${b}/calls/${s.calls.open}/overview`);
    const lantern = chair.locator(`tr[data-proposal="${s.proposals.lantern}"]`);
    await lantern.getByText("2 of 2").waitFor();
    await chair.locator(`tr[data-proposal="${s.proposals.sable}"]`).getByText("1 major").waitFor();
    await assertAccessible(chair, "call overview (demo)");
    await shot(chair, "chair-overview.png");

    // The decision page: scores, flags and the letter preview for a proposal ready to decide.
    await chair.goto(`/boards/${b}/proposals/${s.proposals.sable}/decision`);
    await chair.getByRole("heading", { name: "Sable Lunar Ice Prospector" }).waitFor();
    // Claims are counted per claimed value, not per block: the demo's Sable states 7 claims in
    // 4 blocks, and 2 of the 3 values in its Δv-budget block are off (db/seed/dossiers.ts).
    await chair.getByText("2 of 7 claims flagged by the server, in 4 orbit-check blocks").waitFor();
    await chair.getByRole("radio", { name: /Revise and resubmit/ }).check();
    await chair.evaluate(() => window.scrollTo(0, 0));
    await shot(chair, "decision-page.png");
    await chair.getByRole("button", { name: "Preview the letter" }).click();
    await chair.getByRole("region", { name: "Letter preview" }).getByText("Dear Ayla Brandvik,").waitFor();
    await assertAccessible(chair, "decision page (demo)");
    expect(a11y.join("\n\n")).toBe("");
  });
});
