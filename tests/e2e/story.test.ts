// The whole board in one story, in Debian's Chromium: a proposer writes a dossier with two
// orbit-check blocks (one wrong), attaches a PDF, submits and sees the server's flag; the chair
// assigns two reviewers; each scores the rubric and one raises a review item on selected text;
// the chair decides; the letter e-mail with its PDF reaches the mail catcher; the proposer reads
// the decision and the review items. Every main page of the story is checked with axe-core.
// Fresh board, people and call, made through the data-access layer; invented names only.
import { createRequire } from "node:module";
import type { Browser, Locator, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createCall } from "@/lib/dal/calls";
import { saveCallRubric } from "@/lib/dal/rubrics";
import { callInputSchema } from "@/lib/validation/dossier";
import { claimed, consistent, periodFromAltitude } from "@/db/seed/claims";
import { summaryPdf } from "@/db/seed/files";
import { DEMO_RUBRIC } from "@/db/seed/scenario";
import { appUrl } from "../support/app";
import { describeViolations, seriousViolations } from "../support/axe";
import { launchBrowser, newPage, signInThroughPage, typeInto } from "../support/browser";
import { addMember, asSessionUser, createBoard, createUser, TEST_PASSWORD, unique } from "../support/factories";
import { waitForMail } from "../support/mail";

const pdfParse = createRequire(import.meta.url)("pdf-parse/lib/pdf-parse.js") as (data: Buffer) => Promise<{ text: string }>;

async function fillBlock(block: Locator, name: string, altitude: number, period: number) {
  await typeInto(block.getByLabel("Name in the text"), name);
  await typeInto(block.getByLabel("Altitude h (km)", { exact: true }), String(altitude));
  await block.getByLabel("Add a claimed value").selectOption("period");
  await block.getByRole("button", { name: "Add claim" }).click();
  await typeInto(block.getByRole("textbox", { name: "Claimed Orbital period T (s)", exact: true }), String(period));
}

/** Selects `quote` inside the element matching `rootSelector`, as a reader would with the mouse. */
async function selectText(page: Page, rootSelector: string, quote: string) {
  await page.evaluate(
    ({ rootSelector, quote }) => {
      const root = document.querySelector(rootSelector)!;
      const walker = document.createTreeWalker(root, NodeFilter.SHOW_TEXT);
      for (let node = walker.nextNode(); node; node = walker.nextNode()) {
        const at = node.nodeValue!.indexOf(quote);
        if (at >= 0) {
          const range = document.createRange();
          range.setStart(node, at);
          range.setEnd(node, at + quote.length);
          const selection = window.getSelection()!;
          selection.removeAllRanges();
          selection.addRange(range);
          return;
        }
      }
      throw new Error(`"${quote}" is not in ${rootSelector}`);
    },
    { rootSelector, quote },
  );
}

describe("the whole story of a review round", () => {
  let browser: Browser;

  beforeAll(async () => {
    await appUrl();
    browser = await launchBrowser();
  });

  afterAll(async () => {
    await browser?.close();
  });

  async function as(email: string): Promise<Page> {
    const page = await newPage(browser);
    page.on("pageerror", (e) => errors.push(`${email}: ${e.message}`));
    await signInThroughPage(page, email, TEST_PASSWORD);
    return page;
  }
  const errors: string[] = [];
  // Accessibility findings of every page of the story, reported together at the end.
  const a11y: string[] = [];
  async function assertAccessible(page: Page, where: string) {
    const violations = await seriousViolations(page);
    if (violations.length > 0) a11y.push(describeViolations(where, violations));
  }

  it("runs from a proposer's first draft to the decision letter in the proposer's inbox", { timeout: 600_000 }, async () => {
    // The board: distinct organisations and e-mail domains, so no conflict rule fires.
    const board = await createBoard({ name: unique("Osprey Rideshare Board") });
    const chair = await createUser({ name: "Hedda Sorensby", email: `${unique("hedda")}@osprey-board.example.org`, organisation: "Osprey Rideshare Board" });
    const proposer = await createUser({ name: "Emil Vantongeren", email: `${unique("emil")}@saltmarsh-space.example.com`, organisation: "Saltmarsh Space" });
    const reviewerA = await createUser({
      name: "Agnes Whitlock",
      email: `${unique("agnes")}@fellgate-dynamics.example.net`,
      organisation: "Fellgate Dynamics",
    });
    const reviewerB = await createUser({ name: "Rafael Iturbe", email: `${unique("rafael")}@cobalt-orbits.example.org`, organisation: "Cobalt Orbits" });
    await addMember(board.id, chair.id, "chair");
    await addMember(board.id, proposer.id, "proposer");
    await addMember(board.id, reviewerA.id, "reviewer");
    await addMember(board.id, reviewerB.id, "reviewer");
    const call = await createCall(
      asSessionUser(chair),
      board.id,
      callInputSchema.parse({
        title: unique("Osprey Round 1"),
        opensAt: new Date(Date.now() - 3_600_000).toISOString(),
        closesAt: new Date(Date.now() + 14 * 86_400_000).toISOString(),
        requiredSections: ["Orbit design"],
        reviewersPerProposal: 2,
      }),
    );
    await saveCallRubric(asSessionUser(chair), board.id, call.id, DEMO_RUBRIC);

    // The claims come from the engine: a consistent period, and the period worked out from the altitude.
    const parking = consistent({ label: "the parking orbit", kind: "orbit", body: "earth", given: { altitude: 500 }, claim: { period: 0 } });
    const wrong = periodFromAltitude({ label: "the science orbit", body: "earth", altitude: 500 });
    const goodPeriod = claimed(parking, "period");
    const badPeriod = claimed(wrong, "period");
    const title = unique("Heron Atmospheric Drag Probe");
    const wrongSentence = `The science orbit at 500 km goes round once every ${badPeriod} s.`;

    // 1. The proposer writes the dossier, attaches a PDF and submits.
    const proposerPage = await as(proposer.email);
    await proposerPage.goto(`/boards/${board.id}/proposals`);
    await proposerPage.getByText("No proposals yet.").waitFor();
    await assertAccessible(proposerPage, "proposer's proposals list");
    const form = proposerPage.locator("#new-proposal");
    await typeInto(form.getByLabel("Title"), title);
    await form.getByLabel("Call").selectOption(call.id);
    await form.getByRole("button", { name: "Start proposal" }).click();
    await proposerPage.waitForURL(/\/proposals\/[0-9a-f-]{36}$/);
    const proposalId = proposerPage.url().split("/").at(-1)!;

    const editor = proposerPage.getByRole("textbox", { name: "Dossier text" });
    await editor.waitFor();
    await editor.click();
    await proposerPage.keyboard.press("Control+End");
    await proposerPage.keyboard.type(`Heron first parks in a 500 km circular orbit, one orbit every ${goodPeriod} s. ${wrongSentence}`);
    const blocks = proposerPage.locator("[data-orbit-check-block]");
    await proposerPage.getByRole("button", { name: "Insert orbit check" }).click();
    await blocks.first().waitFor();
    await fillBlock(blocks.nth(0), "the parking orbit", 500, goodPeriod);
    await blocks.nth(0).getByRole("status").filter({ hasText: "Consistent" }).waitFor();
    await proposerPage.getByRole("button", { name: "Insert orbit check" }).click();
    await expect.poll(() => blocks.count()).toBe(2);
    await fillBlock(blocks.nth(1), "the science orbit", 500, badPeriod);
    await blocks.nth(1).getByRole("status").filter({ hasText: "Inconsistent" }).waitFor();
    await blocks
      .nth(1)
      .getByRole("img", { name: /Plot of the science orbit/ })
      .waitFor();

    const pdf = await summaryPdf("heron-concept-summary.pdf", title, "Saltmarsh Space", ["Drag probe in a 500 km circular orbit."]);
    await proposerPage.locator('input[type="file"]').setInputFiles({ name: pdf.filename, mimeType: pdf.contentType, buffer: pdf.body });
    await proposerPage.getByRole("list", { name: "Attached files" }).getByRole("link", { name: pdf.filename }).waitFor();
    await proposerPage.locator('[data-save-state="saved"]').waitFor({ timeout: 30_000 });
    await assertAccessible(proposerPage, "dossier editor");

    await proposerPage.getByRole("button", { name: "Submit version 1" }).click();
    await proposerPage.getByRole("heading", { name: "Version 1" }).waitFor({ timeout: 60_000 });
    const flagged = proposerPage.locator('figure[data-status="inconsistent"]');
    await flagged.waitFor();
    expect(await flagged.locator("figcaption").innerText()).toContain("the science orbit");
    expect(await flagged.innerText()).toContain("Server check: Inconsistent");
    await proposerPage.getByRole("complementary").filter({ hasText: "Claims (server check)" }).getByText("1 consistent, 1 inconsistent").waitFor();
    await assertAccessible(proposerPage, "submitted version (proposer)");

    // 2. The chair assigns two reviewers on the call's assignment page.
    const chairPage = await as(chair.email);
    await chairPage.goto(`/boards/${board.id}/calls/${call.id}/assignments`);
    await chairPage.getByRole("checkbox", { name: `Select ${title}` }).check();
    await chairPage.getByRole("checkbox", { name: new RegExp(reviewerA.name) }).check();
    await chairPage.getByRole("checkbox", { name: new RegExp(reviewerB.name) }).check();
    await chairPage.getByLabel("Due date (end of day, UTC)").fill(new Date(Date.now() + 10 * 86_400_000).toISOString().slice(0, 10));
    await assertAccessible(chairPage, "assignment page");
    await chairPage.getByRole("button", { name: "Assign 2 reviewer(s) to 1 proposal(s)" }).click();
    await chairPage
      .getByRole("status")
      .filter({ hasText: /assign/i })
      .waitFor({ timeout: 30_000 });
    await waitForMail(reviewerA.email, new RegExp(title), 60_000);

    // 3. Each reviewer scores the rubric; the first raises a review item on the wrong sentence.
    const review = async (email: string, scores: [number, number, number], comment: string, item?: { quote: string; title: string; body: string }) => {
      const page = await as(email);
      await page.goto(`/boards/${board.id}/reviews`);
      await page.getByRole("link", { name: title }).click();
      await page.getByRole("heading", { name: title }).waitFor();
      await page.locator("li[data-check-block]", { hasText: "the science orbit" }).getByText("Inconsistent").waitFor();
      const score = (criterion: string, level: number) =>
        page.locator(`tr[data-criterion="${criterion}"] label`).getByText(String(level), { exact: true }).click();
      await score("mission-return", scores[0]);
      await score("orbit-soundness", scores[1]);
      await score("programme-risk", scores[2]);
      await typeInto(page.getByLabel("Comment on Orbit and Δv soundness"), comment);
      await page.locator('[data-save-state="saved"]').waitFor({ timeout: 30_000 });
      if (item) {
        await selectText(page, '[data-testid="dossier"]', item.quote);
        await expect.poll(async () => page.getByTestId("selected-quote").textContent()).toBe(item.quote);
        await page.getByLabel("Severity").selectOption("major");
        await typeInto(page.getByLabel("Title"), item.title);
        await typeInto(page.getByLabel("What needs attention"), item.body);
        await page.getByRole("button", { name: "Raise item" }).click();
        await page.locator("li[data-item]", { hasText: item.title }).waitFor();
        await assertAccessible(page, "review screen");
      }
      await page.getByRole("button", { name: "Submit review" }).click();
      await expect.poll(async () => page.getByTestId("review-status").textContent(), { timeout: 30_000 }).toBe("submitted");
      await page.close();
    };
    const itemTitle = "Period worked out from the altitude";
    await review(reviewerA.email, [4, 2, 3], "The science orbit's period uses the altitude as the radius (server flag).", {
      quote: `once every ${badPeriod} s`,
      title: itemTitle,
      body: `Kepler's third law needs the orbit radius, 6878 km, not the 500 km altitude; the period is close to ${goodPeriod} s.`,
    });
    await review(reviewerB.email, [4, 3, 4], "Closes once the period is fixed.");

    // 4. The chair compares the scores and decides.
    // Weighted totals: 0.40·4 + 0.35·2 + 0.25·3 = 3.05 and 0.40·4 + 0.35·3 + 0.25·4 = 3.65; mean 3.35.
    await chairPage.goto(`/boards/${board.id}/calls/${call.id}/overview`);
    const row = chairPage.locator(`tr[data-proposal="${proposalId}"]`);
    await row.waitFor();
    expect(await row.getByTestId("weighted-mean").textContent()).toBe("3.35");
    await row.getByText("2 of 2").waitFor();
    await row.getByText("1 major").waitFor();
    await row.getByText("1 inconsistent").waitFor();
    await assertAccessible(chairPage, "call overview");

    await chairPage.goto(`/boards/${board.id}/proposals/${proposalId}/decision`);
    await chairPage.getByRole("heading", { name: title }).waitFor();
    expect(await chairPage.getByTestId("weighted-mean").textContent()).toBe("3.35");
    await chairPage.getByText("1 of 2 claims flagged by the server").waitFor();
    await chairPage.getByRole("radio", { name: /Revise and resubmit/ }).check();
    await chairPage.getByRole("textbox", { name: "Letter text" }).waitFor();
    await chairPage.getByRole("button", { name: "Preview the letter" }).click();
    const preview = chairPage.getByRole("region", { name: "Letter preview" });
    await preview.getByText(`Dear ${proposer.name},`).waitFor();
    await preview.getByText(`[major] ${itemTitle}`, { exact: false }).waitFor();
    await assertAccessible(chairPage, "decision page (chair)");
    // Sending shows the letter as it goes out and asks to confirm before anything is stored.
    await chairPage.getByRole("button", { name: "Send the decision…" }).click();
    await chairPage.getByRole("region", { name: "Check the letter, then confirm" }).getByText(`Dear ${proposer.name},`).waitFor();
    await chairPage.getByRole("button", { name: "Confirm and send the decision" }).click();
    await chairPage.getByRole("heading", { name: "Decision issued" }).waitFor({ timeout: 60_000 });

    // 5. The letter e-mail with its PDF reaches the proposer's inbox (sent by the app's outbox worker).
    const mail = await waitForMail(proposer.email, /revise and resubmit/, 90_000);
    expect(mail.subject).toContain(title);
    expect(mail.text).toContain(itemTitle);
    expect(mail.attachments).toHaveLength(1);
    expect(mail.attachments[0]!.contentType).toBe("application/pdf");
    const letter = await pdfParse(Buffer.from(mail.attachments[0]!.contentBase64!, "base64"));
    expect(letter.text.replace(/\s+/g, " ")).toContain(itemTitle);

    // 6. The proposer reads the decision and the review items (reviewers' names stay hidden).
    await proposerPage.goto(`/boards/${board.id}/proposals/${proposalId}/decision`);
    await proposerPage.getByRole("heading", { name: "Version 1: revise and resubmit" }).waitFor();
    await proposerPage.getByText(`[major] ${itemTitle}`, { exact: false }).first().waitFor();
    await proposerPage.getByRole("link", { name: "Download the letter (PDF)" }).waitFor();
    expect(await proposerPage.content()).not.toContain(reviewerA.name);
    await assertAccessible(proposerPage, "decision page (proposer)");
    const items = await proposerPage.request.get(`/api/v1/boards/${board.id}/review-items?proposalId=${proposalId}`);
    expect(items.status()).toBe(200);
    const { items: listed } = (await items.json()) as { items: { title: string; authorLabel: string; anchor: { quote: string } }[] };
    expect(listed).toEqual([
      expect.objectContaining({ title: itemTitle, authorLabel: "Reviewer 1", anchor: expect.objectContaining({ quote: `once every ${badPeriod} s` }) }),
    ]);

    expect(errors).toEqual([]);
    expect(a11y.join("\n\n")).toBe("");
  });
});
