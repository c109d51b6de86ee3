// Every page a role uses is reachable by links from /boards. For the proposer, a reviewer and
// the chair the test starts at /boards (the only goto), follows the visible links on each page
// by clicking them, comes back with the browser's Back button, and fails naming every page it
// expected that no link led to.
import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { browserSession } from "../support/browser";
import { decisionScenario } from "../integration/decision-fixtures";
import { setResponseWindow } from "@/lib/dal/responses";
import { asSessionUser } from "../support/factories";

interface Crawl {
  reached: Set<string>;
  /** For each page reached, the page whose link led there. */
  via: Map<string, string>;
}

/** The same-board links a person can see and click on the current page, as pathnames. */
async function visibleLinks(page: Page, scope: string): Promise<string[]> {
  const hrefs = await page.evaluate(() =>
    [...document.querySelectorAll<HTMLAnchorElement>("main a[href], header a[href]")]
      .filter((a) => a.getClientRects().length > 0 && !a.hasAttribute("download") && !a.target)
      .map((a) => a.getAttribute("href") ?? ""),
  );
  const out = new Set<string>();
  for (const href of hrefs) {
    if (!href.startsWith("/") || href.startsWith("/api/")) continue;
    const path = new URL(href, "http://x").pathname;
    if (path === "/boards" || path.startsWith(scope)) out.add(path);
  }
  return [...out];
}

async function settle(page: Page) {
  await page.waitForLoadState("load");
  await page.locator("main h1").first().waitFor();
}

/** Depth-first: click each new link, look around, press Back. No goto beyond the start. */
async function crawl(page: Page, scope: string, limit = 60): Promise<Crawl> {
  const reached = new Set<string>(["/boards"]);
  const via = new Map<string, string>();
  await page.goto("/boards");
  await settle(page);
  const visit = async (here: string, depth: number) => {
    if (depth > 6) return;
    // Back is a client-side navigation: the URL changes before the page does, so after
    // Back we wait for this page's own heading before looking for its links again.
    const heading = await page.locator("main h1").first().textContent();
    for (const target of await visibleLinks(page, scope)) {
      if (reached.has(target) || reached.size >= limit) continue;
      const link = page
        .locator(
          [`a[href="${target}"]`, `a[href^="${target}?"]`, `a[href^="${target}#"]`].flatMap((a) => [`main ${a}:visible`, `header ${a}:visible`]).join(", "),
        )
        .first();
      if ((await link.count()) === 0) continue;
      reached.add(target);
      via.set(target, here);
      await link.click();
      await page.waitForURL((url) => url.pathname === target);
      await settle(page);
      await visit(target, depth + 1);
      await page.goBack();
      await page.waitForURL((url) => url.pathname === here);
      await settle(page);
      await page.waitForFunction((text) => document.querySelector("main h1")?.textContent === text, heading);
    }
  };
  await visit("/boards", 0);
  return { reached, via };
}

const unreached = (crawl: Crawl, expected: string[]) => expected.filter((p) => !crawl.reached.has(p));

describe("every page a role uses is reachable by links from /boards", () => {
  const { as } = browserSession();

  it("for the proposer, a reviewer and the chair", { timeout: 600_000 }, async () => {
    const s = await decisionScenario();
    const b = `/boards/${s.board.id}`;
    const p = `${b}/proposals/${s.proposal.id}`;
    const c = `${b}/calls/${s.call.id}`;
    // An open response round: its page is reached from the proposal, the review screen and the decision page.
    await setResponseWindow(asSessionUser(s.chair), s.board.id, s.call.id, {
      opensAt: new Date(Date.now() - 3_600_000),
      closesAt: new Date(Date.now() + 5 * 86_400_000),
    });
    const expected = {
      proposer: [b, `${b}/proposals`, p, `${p}/versions/1`, c, `${p}/responses`],
      reviewer: [b, `${b}/reviews`, `${b}/conflicts`, `${p}/review`, c, `${p}/responses`, `${c}/meeting`],
      chair: [
        b,
        c,
        `${b}/calls`,
        `${c}/rubric`,
        `${c}/assignments`,
        `${c}/overview`,
        `${c}/meeting`,
        p,
        `${p}/review`,
        `${p}/decision`,
        `${p}/responses`,
        `${p}/versions/1`,
        `${p}/versions/1/report`,
        `${b}/members`,
        `${b}/settings`,
        `${b}/settings/letter`,
        `${b}/conflicts`,
      ],
    };
    const missing: string[] = [];
    for (const [role, user] of [
      ["proposer", s.proposer],
      ["reviewer", s.reviewer],
      ["chair", s.chair],
    ] as const) {
      const page = await as(user.email);
      const result = await crawl(page, b);
      for (const path of unreached(result, expected[role])) missing.push(`${role}: no link leads to ${path}`);
      await page.close();
    }
    expect(missing).toEqual([]);
  });
});
