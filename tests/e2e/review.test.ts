// A review round in a real browser: a reviewer opens their queue, scores the rubric (autosaved),
// raises a review item on text selected in the dossier and submits; the chair then sees the
// aggregate on the call overview. Board, call, rubric, proposal, version and assignments are
// made in the database first.
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { assignments, reviewItems, reviews } from "@/db/schema";
import { assignReviewers } from "@/lib/dal/assignments";
import { saveReviewDraft, submitReview } from "@/lib/dal/reviews";
import { signInThroughPage, browserSession, typeInto } from "../support/browser";
import { asSessionUser, TEST_PASSWORD } from "../support/factories";
import { createReviewRound, inFuture } from "../integration/review-fixtures";

describe("reviewing in the browser", () => {
  const { as } = browserSession();

  it("scores a rubric, raises a review item on selected text, submits, and the chair sees the aggregate", async () => {
    const round = await createReviewRound();
    const { created } = await assignReviewers(asSessionUser(round.chair), round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id, round.reviewer3.id],
      dueAt: inFuture(10),
      confirmLikelyConflicts: false,
    });
    // The other reviewer has already submitted: 50·3 + 30·3 + 20·4 = 320 → 3.20.
    const other = asSessionUser(round.reviewer3);
    const draft = await saveReviewDraft(other, round.board.id, created[1]!.assignmentId, {
      revision: 0,
      scores: { science: { score: 3, comment: "" }, feasibility: { score: 3, comment: "" }, cost: { score: 4, comment: "" } },
      summary: "",
    });
    await submitReview(other, round.board.id, created[1]!.assignmentId, { revision: draft.revision });

    const page = await as(round.reviewer2.email);
    await page.goto(`/boards/${round.board.id}/reviews`);
    await page.getByRole("link", { name: round.proposal.title }).click();
    await page.getByRole("heading", { name: round.proposal.title }).waitFor();
    await page.getByTestId("dossier").getByText("95.6 minutes").waitFor();
    // The server's verdict is beside the flagged orbit-check block.
    await page.getByRole("heading", { name: "Orbit checks recomputed by the server" }).waitFor();
    await page.locator(`li[data-check-block]`, { hasText: "Raising transfer" }).getByText("Inconsistent").waitFor();

    // Score each criterion; the running total follows and the review autosaves.
    const score = async (criterion: string, level: number) =>
      page.locator(`tr[data-criterion="${criterion}"] label`).getByText(String(level), { exact: true }).click();
    await score("science", 4);
    await score("feasibility", 3);
    await expect.poll(async () => page.getByTestId("weighted-total").textContent()).toContain("3.63");
    await score("cost", 5);
    // 50·4 + 30·3 + 20·5 = 390 → 3.90
    await expect.poll(async () => page.getByTestId("weighted-total").textContent()).toContain("3.90");
    await page.locator('[data-save-state="saved"]').waitFor({ timeout: 20_000 });

    // Select text in the dossier and raise a review item on it.
    await page.evaluate(() => {
      const root = document.querySelector('[data-testid="dossier"]')!;
      const walker = document.createTreeWalker(root, NodeFilter.SHOW_TEXT);
      for (let node = walker.nextNode(); node; node = walker.nextNode()) {
        const at = node.nodeValue!.indexOf("95.6 minutes");
        if (at >= 0) {
          const range = document.createRange();
          range.setStart(node, at);
          range.setEnd(node, at + "95.6 minutes".length);
          const selection = window.getSelection()!;
          selection.removeAllRanges();
          selection.addRange(range);
          return;
        }
      }
      throw new Error("text not found");
    });
    await expect.poll(async () => page.getByTestId("selected-quote").textContent()).toBe("95.6 minutes");
    await page.getByLabel("Severity").selectOption("major");
    await typeInto(page.getByLabel("Title"), "Period does not match the altitude");
    await typeInto(page.getByLabel("What needs attention"), "At 550 km the two-body period is about 95.7 minutes; state the constants used.");
    await page.getByRole("button", { name: "Raise item" }).click();
    await page.locator("li[data-item]", { hasText: "Period does not match the altitude" }).waitFor();
    await expect.poll(async () => page.getByTestId("dossier").locator("mark[data-item-id]").first().textContent()).toBe("95.6 minutes");

    // Without a mouse: type the words instead of selecting them.
    const typed = page.getByLabel("Or type the words to anchor to");
    await typeInto(typed, "ninety-five minutes");
    await page.getByText("Those words do not occur in the dossier's text.").waitFor();
    expect(await page.getByRole("button", { name: "Raise item" }).isDisabled()).toBe(true);
    await typeInto(typed, "95.6   MINUTES");
    await expect.poll(async () => page.getByTestId("selected-quote").textContent()).toBe("95.6 minutes");
    await page.getByLabel("Severity").selectOption("comment");
    await typeInto(page.getByLabel("Title"), "Constants used");
    await typeInto(page.getByLabel("What needs attention"), "Name the gravitational parameter and radius behind this figure.");
    await page.getByRole("button", { name: "Raise item" }).click();
    await page.locator("li[data-item]", { hasText: "Constants used" }).waitFor();
    await expect.poll(() => typed.inputValue()).toBe("");

    await page.getByRole("button", { name: "Submit review" }).click();
    await expect.poll(async () => page.getByTestId("review-status").textContent(), { timeout: 20_000 }).toBe("submitted");

    const [saved] = await db().select().from(reviews).where(eq(reviews.assignmentId, created[0]!.assignmentId));
    expect(saved).toMatchObject({ status: "submitted", weightedTotal: 3.9 });
    const items = await db()
      .select()
      .from(reviewItems)
      .where(and(eq(reviewItems.proposalId, round.proposal.id), eq(reviewItems.authorId, round.reviewer2.id)));
    expect(items.map((i) => [i.severity, i.anchor.quote]).sort()).toEqual([
      ["comment", "95.6 minutes"],
      ["major", "95.6 minutes"],
    ]);

    // The chair's overview: mean (3.90 + 3.20) / 2 = 3.55; sample s.d. = 0.70 / √2 = 0.4950.
    const chair = await as(round.chair.email);
    await chair.goto(`/boards/${round.board.id}/calls/${round.call.id}/overview`);
    const row = chair.locator(`tr[data-proposal="${round.proposal.id}"]`);
    await row.waitFor();
    expect(await row.getByTestId("weighted-mean").textContent()).toBe("3.55");
    await row.getByText("0.49").waitFor();
    await row.getByText("2 of 2").waitFor();
    await row.getByText("1 major").waitFor();
    await row.getByText("1 inconsistent").waitFor();
    await row.getByRole("img", { name: /Weighted totals for/ }).waitFor();
    // The chair opens the proposal's reviews and sees the item with the reviewer named for them.
    await chair.goto(`/boards/${round.board.id}/proposals/${round.proposal.id}/review?assignment=${created[0]!.assignmentId}`);
    await chair
      .locator("li[data-item]", { hasText: "Period does not match the altitude" })
      .getByText(`Reviewer 1 · ${round.reviewer2.name}`, { exact: false })
      .waitFor();
    await chair.getByRole("button", { name: "Reopen" }).waitFor();
    // An unassigned reviewer cannot open the review screen at all.
    const stranger = await as(round.reviewer.email);
    const response = await stranger.goto(`/boards/${round.board.id}/proposals/${round.proposal.id}/review`);
    expect(response?.status()).toBe(404);

    const csv = await chair.request.get(`/api/v1/boards/${round.board.id}/calls/${round.call.id}/overview/csv`);
    expect(csv.headers()["content-type"]).toContain("text/csv");
    expect(await csv.text()).toContain(",3.550,0.495,");
  });
});

describe("chairing a review round in the browser", () => {
  const { page: openPage } = browserSession();

  it("edits the rubric (refused at 90 %), then bulk-assigns after confirming a likely conflict", async () => {
    const round = await createReviewRound({ rubric: false });
    const page = await openPage();
    await signInThroughPage(page, round.chair.email, TEST_PASSWORD);

    await page.goto(`/boards/${round.board.id}/calls/${round.call.id}/rubric`);
    await typeInto(page.getByLabel("Criterion 1"), "Science return");
    await typeInto(page.getByLabel("Weight (%)"), "90");
    await page.getByText("Weights add up to 90 % (must be 100 %)").waitFor();
    for (const [i, text] of ["Negligible", "Limited", "Useful", "Significant", "Outstanding"].entries())
      await typeInto(page.getByLabel(String(i + 1), { exact: true }), text);
    await page.getByRole("button", { name: "Save rubric" }).click();
    await page.getByRole("alert").getByText("The weights add up to 90 %; they must add up to 100 %.").waitFor();
    await typeInto(page.getByLabel("Weight (%)"), "100");
    await page.getByRole("button", { name: "Save rubric" }).click();
    await page.getByRole("status").getByText("Saved (version 1).").waitFor();

    await page.goto(`/boards/${round.board.id}/calls/${round.call.id}/assignments`);
    await page.getByRole("checkbox", { name: `Select ${round.proposal.title}` }).check();
    // The cast's reviewer shares the proposer's e-mail domain: a likely conflict to confirm.
    await page.locator("label", { hasText: round.reviewer.name }).getByText("Likely conflict", { exact: false }).first().waitFor({ state: "attached" });
    await page.getByRole("checkbox", { name: new RegExp(round.reviewer.name) }).check();
    await page.getByRole("checkbox", { name: new RegExp(round.reviewer2.name) }).check();
    await page.getByRole("button", { name: /Assign 2 reviewer\(s\) to 1 proposal\(s\)/ }).click();
    await page.getByText("Some pairs may have a conflict of interest:").waitFor();
    await page.getByRole("button", { name: "Assign anyway (recorded)" }).click();
    await page.getByText("2 assignment(s) made").waitFor();
    const row = page.locator("tr", { hasText: round.proposal.title });
    await row.getByText("2/2").waitFor();
    await row.getByText(round.reviewer2.name).waitFor();
    const rows = await db().select().from(assignments).where(eq(assignments.proposalId, round.proposal.id));
    expect(rows).toHaveLength(2);
  });
});
