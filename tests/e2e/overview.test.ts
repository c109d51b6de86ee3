// The chair's call overview in a real browser: the table's view (filter, sort, flags, page)
// lives in the URL and the server does the work; the typed filter keeps its text and focus;
// Back and Forward restore each view.
import { describe, expect, it } from "vitest";
import { browserSession, signInThroughPage } from "../support/browser";
import { TEST_PASSWORD } from "../support/factories";
import { seededCall } from "../integration/overview-fixtures";

// The server answers each change; on a shared machine that can take a few seconds.
const WAIT = { timeout: 20_000 };

describe("the call overview in the browser", () => {
  const { page: openPage } = browserSession();

  it("filters as the chair types, sorts and pages on the server, and Back/Forward restore each view", async () => {
    const { round, models } = await seededCall();
    const page = await openPage();
    await signInThroughPage(page, round.chair.email, TEST_PASSWORD);
    // By links from /boards: the board, then the call's overview.
    await page.goto("/boards");
    await page.getByRole("link", { name: round.board.name }).first().click();
    await page.getByRole("link", { name: "Overview, reviews and decisions" }).first().click();
    await page.getByRole("heading", { name: "Review overview" }).waitFor();
    const status = page.getByRole("navigation", { name: "Overview pages" }).getByRole("status");
    await expect.poll(() => status.textContent(), WAIT).toBe("Proposals 1–31 of 31");
    const rows = page.locator("tbody tr[data-proposal]");
    const titles = async () => rows.locator("td:first-child > div > a").evaluateAll((links) => links.map((a) => a.firstChild?.textContent ?? ""));
    // Default order: weighted mean, highest first; a chart only for rows on the page.
    expect(await page.getByRole("img", { name: /Weighted totals for/ }).count()).toBe(31);

    // Typed key by key: the server filters, the box keeps the text and the focus.
    const filter = page.getByRole("searchbox", { name: "Filter by title" });
    await filter.click();
    await page.keyboard.type("seeded 1");
    await expect.poll(() => status.textContent(), WAIT).toBe("Proposals 1–10 of 10");
    expect(await filter.inputValue()).toBe("seeded 1");
    expect(await filter.evaluate((el) => el === document.activeElement)).toBe(true);
    expect(new URL(page.url()).searchParams.get("q")).toBe("seeded 1");

    // Sort by title (ascending first for text), then only the flagged ones.
    await page.getByRole("button", { name: /^Proposal/ }).click();
    await expect.poll(titles, WAIT).toEqual(models.filter((m) => m.title.startsWith("Seeded 1")).map((m) => m.title));
    const flaggedTens = models.filter((m) => m.title.startsWith("Seeded 1") && m.flagged).map((m) => m.title);
    await page.getByRole("checkbox", { name: /Only proposals with flags/ }).check();
    await expect.poll(titles, WAIT).toEqual(flaggedTens);

    // Back: the flag filter goes, the sort by title stays; Back again: the default order, the filter kept.
    await page.goBack();
    await expect.poll(titles, WAIT).toEqual(models.filter((m) => m.title.startsWith("Seeded 1")).map((m) => m.title));
    expect(await page.getByRole("checkbox", { name: /Only proposals with flags/ }).isChecked()).toBe(false);
    await page.goBack();
    await expect.poll(() => new URL(page.url()).searchParams.get("sort"), WAIT).toBeNull();
    expect(await filter.inputValue()).toBe("seeded 1");
    // Forward again to the title order, then to the flagged view.
    await page.goForward();
    await expect.poll(() => new URL(page.url()).searchParams.get("sort"), WAIT).toBe("title");
    await page.goForward();
    await expect.poll(titles, WAIT).toEqual(flaggedTens);
    expect(await page.getByRole("checkbox", { name: /Only proposals with flags/ }).isChecked()).toBe(true);

    // Flags off, the filter cleared, 25 rows a page: page 2 holds the last 6 of 31 by title.
    await page.getByRole("checkbox", { name: /Only proposals with flags/ }).uncheck();
    await typeIntoSearch(page, filter, "");
    await expect.poll(() => status.textContent(), WAIT).toBe("Proposals 1–31 of 31");
    await page.getByRole("combobox", { name: /Rows per page/ }).selectOption("25");
    await expect.poll(() => status.textContent(), WAIT).toBe("Proposals 1–25 of 31");
    await page.getByRole("button", { name: "Next" }).click();
    await expect.poll(() => status.textContent(), WAIT).toBe("Proposals 26–31 of 31");
    const sortedTitles = [...models].map((m) => m.title).sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
    expect(await titles()).toEqual(sortedTitles.slice(25));
    // Only this page's rows get charts.
    expect(await page.getByRole("img", { name: /Weighted totals for/ }).count()).toBe(6);
    // Away to a proposal and Back: the same page of the same view.
    await page.getByRole("link", { name: /^Seeded 30/ }).click();
    await page.waitForURL(/\/proposals\/[0-9a-f-]+$/);
    await page.goBack();
    await expect.poll(() => status.textContent(), WAIT).toBe("Proposals 26–31 of 31");
  });
});

async function typeIntoSearch(page: import("playwright-core").Page, field: import("playwright-core").Locator, text: string) {
  await field.click();
  await field.press("ControlOrMeta+a");
  await field.press("Backspace");
  if (text) await page.keyboard.type(text);
}
