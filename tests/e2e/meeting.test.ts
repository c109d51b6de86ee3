// The panel meeting in two browsers (two contexts): the chair starts the meeting and steps
// through the proposals; the reviewer's page follows live (server-sent events) without a
// reload; the chair records the panel's view key by key, a score off the scale is refused
// with a sentence, and the minutes PDF carries its sections.
import { createRequire } from "node:module";
import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { browserSession, typeInto } from "../support/browser";
import { meetingScenario } from "../integration/meeting-fixtures";

const pdfParse = createRequire(import.meta.url)("pdf-parse/lib/pdf-parse.js") as (data: Buffer) => Promise<{ text: string }>;

describe("the panel meeting in two browsers", () => {
  const { as } = browserSession();

  it("the chair steps through the proposals and the reviewer's page follows without reloading", { timeout: 300_000 }, async () => {
    const s = await meetingScenario();
    const reviewer = await as(s.reviewer.email);
    const chair = await as(s.chair.email);
    const meetingPath = `/boards/${s.board.id}/calls/${s.call.id}/meeting`;

    // Both reach the meeting by links from /boards: the board, the call, "Panel meeting".
    const openMeeting = async (page: Page) => {
      await page.goto("/boards");
      await page.getByRole("link", { name: s.board.name }).click();
      await page.getByRole("link", { name: s.call.title }).first().click();
      await page.getByRole("link", { name: "Panel meeting" }).click();
      await page.waitForURL((url) => url.pathname === meetingPath);
      await page.getByRole("heading", { name: "Panel meeting", level: 1 }).waitFor();
    };
    await openMeeting(reviewer);
    await reviewer.getByText("The chair has not started the panel meeting yet.").waitFor();
    await reviewer.getByText("Following live").waitFor();
    // A mark on the reviewer's window: it survives only if the page is never reloaded.
    await reviewer.evaluate(() => {
      (window as unknown as { stillThisPage: boolean }).stillThisPage = true;
    });
    const notReloaded = () => reviewer.evaluate(() => (window as unknown as { stillThisPage?: boolean }).stillThisPage === true);

    await openMeeting(chair);
    // The order starts as the overview ranks (raw means: P1 4.5, P2 3.5, P3 2.67); the chair moves Cirrus up one.
    await chair.getByRole("button", { name: `Move ${s.p3.title} up` }).click();
    await chair.getByRole("button", { name: "Start the meeting" }).click();
    await chair.getByRole("heading", { name: `Now discussing: ${s.p1.title}` }).waitFor();

    // The reviewer's page follows the start without a reload.
    await reviewer.getByRole("heading", { name: `Now discussing: ${s.p1.title}` }).waitFor();
    await reviewer.locator("[data-raw-mean]").waitFor();
    expect(await reviewer.locator("[data-raw-mean]").textContent()).toContain("4.50");
    expect(await notReloaded()).toBe(true);

    // Presence: the reviewer marks themselves present; the chair's panel list shows it.
    await reviewer.getByRole("button", { name: "Mark me present" }).click();
    await reviewer.getByRole("button", { name: "Mark me away" }).waitFor();
    const chairPanel = chair.getByRole("region", { name: "Panel", exact: true });
    await chairPanel.getByRole("listitem").filter({ hasText: s.reviewer.name }).getByText("Present", { exact: true }).waitFor();
    // The third reviewer declared a conflict with this proposal: shown as stepping out.
    await chairPanel.getByRole("listitem").filter({ hasText: s.reviewer3.name }).getByText("Stepping out (conflict)").waitFor();

    // The chair records the panel's view, typing as a person does.
    const score = chair.getByLabel(/Consensus score/);
    await typeInto(score, "7");
    await chair.getByRole("button", { name: "Save the record" }).click();
    await chair.getByText("The consensus score must lie within the rubric's scale, 1 to 5.").waitFor();
    await typeInto(score, "4.5");
    await chair.getByLabel("Recommendation").selectOption("recommend");
    await typeInto(chair.getByLabel("Notes"), "Relay budget closes with margin.");
    await chair.getByRole("button", { name: "Save the record" }).click();
    await chair.getByText("Record saved.").waitFor();
    expect(await score.inputValue()).toBe("4.5");
    await reviewer.getByText("Relay budget closes with margin.").waitFor();
    await reviewer.getByText("Consensus score 4.50; recommendation: recommend.").waitFor();

    // Next: Cirrus (moved up), then Boreal chosen from the order.
    await chair.getByRole("button", { name: "Next proposal" }).click();
    await reviewer.getByRole("heading", { name: `Now discussing: ${s.p3.title}` }).waitFor();
    await reviewer.getByText("Outlying: 5.0 standard deviations below the others").waitFor();
    await chair.getByRole("button", { name: `Discuss ${s.p2.title}` }).click();
    await reviewer.getByRole("heading", { name: `Now discussing: ${s.p2.title}` }).waitFor();
    expect(await notReloaded()).toBe(true);

    // Back to the call and Forward again: the meeting page shows where the meeting is.
    await reviewer.goBack();
    await reviewer.getByRole("link", { name: "Panel meeting" }).waitFor();
    await reviewer.goForward();
    await reviewer.getByRole("heading", { name: `Now discussing: ${s.p2.title}` }).waitFor();

    // The minutes, as the chair downloads them.
    const href = await chair.getByRole("link", { name: "Minutes (PDF)" }).getAttribute("href");
    const response = await chair.request.get(href!);
    expect(response.status()).toBe(200);
    expect(response.headers()["content-type"]).toBe("application/pdf");
    const { text } = await pdfParse(Buffer.from(await response.body()));
    for (const section of ["Minutes of the panel meeting", "Attendance", "Proposals discussed", "Scores", "Consensus score", "Recommendation", "Notes"])
      expect(text).toContain(section);
    expect(text).toContain(s.reviewer.name);
    expect(text).toContain("Relay budget closes with margin.");
    expect(text.indexOf(s.p1.title)).toBeLessThan(text.indexOf(s.p3.title));
    expect(text.indexOf(s.p3.title)).toBeLessThan(text.indexOf(s.p2.title));
  });
});
