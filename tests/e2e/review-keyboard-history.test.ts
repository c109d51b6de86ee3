// The review screen used as a reviewer uses it: reached by links from /boards, scored and
// commented with the keyboard alone (focus stays on the control after every change, text
// typed key by key stays whole), then Back and Forward show the saved review and the next
// edit neither reports a false conflict nor overwrites what was saved.
import { eq } from "drizzle-orm";
import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { reviews } from "@/db/schema";
import { assignReviewers } from "@/lib/dal/assignments";
import { browserSession } from "../support/browser";
import { asSessionUser } from "../support/factories";
import { createReviewRound, inFuture } from "../integration/review-fixtures";

/** What has focus: its accessible name (aria-label or label text) and its value. */
const focused = (page: Page) =>
  page.evaluate(() => {
    const el = document.activeElement as HTMLInputElement | HTMLTextAreaElement | null;
    return {
      tag: el?.tagName ?? "",
      label: el?.getAttribute("aria-label") ?? "",
      value: el?.value ?? "",
      checked: (el as HTMLInputElement | null)?.checked ?? false,
    };
  });

/** Presses Tab until the control whose aria-label starts with `label` has focus (keyboard only). */
async function tabTo(page: Page, label: string, limit = 200) {
  for (let i = 0; i < limit; i++) {
    if ((await focused(page)).label.startsWith(label)) return;
    await page.keyboard.press("Tab");
  }
  throw new Error(`Tab never reached "${label}"`);
}

async function openMyReview(page: Page, boardName: string, proposalTitle: string) {
  await page.goto("/boards");
  await page.getByRole("link", { name: boardName }).click();
  await page.getByRole("link", { name: /My reviews/ }).click();
  await page.getByRole("link", { name: proposalTitle }).click();
  await page.getByRole("heading", { name: proposalTitle }).waitFor();
  await page.getByRole("textbox", { name: "Comment on Science return" }).waitFor();
}

const savedReview = async (assignmentId: string) => (await db().select().from(reviews).where(eq(reviews.assignmentId, assignmentId)))[0];

describe("the review screen by keyboard and through history", () => {
  const { as } = browserSession();

  it("a reviewer scores and comments with the keyboard alone and focus stays on each control", async () => {
    const round = await createReviewRound();
    const { created } = await assignReviewers(asSessionUser(round.chair), round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id],
      dueAt: inFuture(10),
      confirmLikelyConflicts: false,
    });
    const page = await as(round.reviewer2.email);
    await openMyReview(page, round.board.name, round.proposal.title);
    await page.locator("body").click({ position: { x: 5, y: 5 } });

    // Tab into the first score group, then change the score with the arrow keys.
    await tabTo(page, "Science return: 1");
    await page.keyboard.press("Space");
    expect(await focused(page)).toMatchObject({ label: expect.stringContaining("Science return: 1"), checked: true });
    for (const level of [2, 3, 4]) {
      await page.keyboard.press("ArrowRight");
      await expect.poll(async () => (await focused(page)).label).toContain(`Science return: ${level}`);
      // Focus stays on the score after the re-render, not on the page body.
      await page.getByText("Saving…").or(page.getByText("All changes saved")).or(page.getByText("Unsaved changes…")).first().waitFor();
      expect(await focused(page)).toMatchObject({ tag: "INPUT", checked: true, label: expect.stringContaining(`Science return: ${level}`) });
    }
    // The selected score has a second cue besides its fill: a bold outline (2 px border) and a check mark.
    const chosen = page.locator('tr[data-criterion="science"] label[data-selected]');
    await expect.poll(async () => chosen.textContent()).toBe("4");
    expect(await chosen.evaluate((el) => getComputedStyle(el).borderTopWidth)).toBe("2px");
    expect(await chosen.evaluate((el) => getComputedStyle(el, "::before").content)).toContain("✓");

    // Tab on to the comment box and type key by key: every character stays and focus stays.
    await tabTo(page, "Comment on Science return");
    const words = "Hello, the science case holds up well.";
    await page.keyboard.type(words);
    expect(await focused(page)).toEqual({ tag: "TEXTAREA", label: "Comment on Science return", value: words, checked: false });
    await page.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });
    expect(await focused(page)).toMatchObject({ label: "Comment on Science return", value: words });

    // The next criterion by keyboard too.
    await tabTo(page, "Technical feasibility: 1");
    await page.keyboard.press("Space");
    await page.keyboard.press("ArrowRight");
    await page.keyboard.press("ArrowRight");
    await expect.poll(async () => (await focused(page)).label).toContain("Technical feasibility: 3");
    await tabTo(page, "Comment on Technical feasibility");
    await page.keyboard.type("Margins are thin.");
    expect(await focused(page)).toMatchObject({ label: "Comment on Technical feasibility", value: "Margins are thin." });
    await page.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });
    await expect
      .poll(async () => (await savedReview(created[0]!.assignmentId))?.scores)
      .toEqual({ science: { score: 4, comment: words }, feasibility: { score: 3, comment: "Margins are thin." } });
  });

  it("Back and Forward show the saved review; the next edit saves without a false conflict and loses nothing", async () => {
    const round = await createReviewRound();
    const { created } = await assignReviewers(asSessionUser(round.chair), round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id],
      dueAt: inFuture(10),
      confirmLikelyConflicts: false,
    });
    const assignmentId = created[0]!.assignmentId;
    const page = await as(round.reviewer2.email);
    await openMyReview(page, round.board.name, round.proposal.title);

    const science = page.getByRole("textbox", { name: "Comment on Science return" });
    await science.click();
    await page.keyboard.type("First thoughts on the science.");
    await page.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });

    // Leave by a link, come back with Back: the page must show what was saved, not the first load.
    await page.getByRole("link", { name: "My reviews" }).first().click();
    await page.getByRole("heading", { name: "My reviews" }).waitFor();
    await page.goBack();
    await page.getByRole("heading", { name: round.proposal.title }).waitFor();
    await expect.poll(async () => science.inputValue()).toBe("First thoughts on the science.");

    // Edit again: it saves (no "changed elsewhere"), and the saved text is extended, not replaced.
    await science.click();
    await page.keyboard.press("End");
    await page.keyboard.type(" More after Back.");
    await page.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });
    expect(await page.getByTestId("save-conflict").count()).toBe(0);
    await expect.poll(async () => (await savedReview(assignmentId))?.scores.science?.comment).toBe("First thoughts on the science. More after Back.");

    // Back to the queue, Forward to the review: still the saved text.
    await page.goBack();
    await page.getByRole("heading", { name: "My reviews" }).waitFor();
    await page.goForward();
    await page.getByRole("heading", { name: round.proposal.title }).waitFor();
    await expect.poll(async () => science.inputValue()).toBe("First thoughts on the science. More after Back.");

    // A change saved elsewhere meanwhile (another tab) is merged in, not overwritten.
    const other = await page.context().newPage();
    await other.goto(page.url());
    const summaryElsewhere = other.getByRole("textbox", { name: "Summary for the chair" });
    await summaryElsewhere.click();
    await other.keyboard.type("Summary typed in another tab.");
    await other.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });
    await other.close();
    await science.click();
    await page.keyboard.press("End");
    await page.keyboard.type(" Last words.");
    await page.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });
    const saved = await savedReview(assignmentId);
    expect(saved?.summary).toBe("Summary typed in another tab.");
    expect(saved?.scores.science?.comment).toBe("First thoughts on the science. More after Back. Last words.");
    expect(await page.getByRole("textbox", { name: "Summary for the chair" }).inputValue()).toBe("Summary typed in another tab.");
  });
});
