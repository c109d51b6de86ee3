// The response round in a real browser: the chair opens the window from the call page
// (reached by links from /boards), the proposer reads the item with the reviewer anonymous and
// answers it typing key by key, the reviewer sees the answer on the review screen, states
// confidence and expertise, and records a disposition whose history then shows; the chair
// sees answers, dispositions and the stated levels on the decision page.
import { describe, expect, it } from "vitest";
import { browserSession, typeInto } from "../support/browser";
import { decisionScenario } from "../integration/decision-fixtures";
import { caughtMessages, waitFor } from "../integration/outbox-support";

describe("the response round in the browser", () => {
  const { as } = browserSession();

  it("chair opens, proposer answers, reviewer disposes, history shows", { timeout: 600_000 }, async () => {
    const s = await decisionScenario({ submitted: 1 });
    const b = `/boards/${s.board.id}`;
    const p = `${b}/proposals/${s.proposal.id}`;

    // The chair: /boards → the board → the call → the response round panel.
    const chair = await as(s.chair.email);
    await chair.goto("/boards");
    await chair.getByRole("link", { name: s.board.name }).click();
    await chair.getByRole("link", { name: s.call.title }).first().click();
    await chair.waitForURL((url) => url.pathname === `${b}/calls/${s.call.id}`);
    const round = chair.getByRole("region", { name: "Response round" });
    const now = new Date();
    const end = new Date(now.getTime() + 10 * 86_400_000);
    const months = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
    await typeInto(round.getByRole("textbox", { name: "Start (UTC)" }), `${now.getUTCFullYear()}-${now.getUTCMonth() + 1}-${now.getUTCDate()}`);
    await typeInto(round.getByRole("textbox", { name: "End (UTC)" }), `${end.getUTCDate()} ${months[end.getUTCMonth()]} ${end.getUTCFullYear()}`);
    await round.getByRole("button", { name: "Open the response round" }).click();
    await round.getByRole("status").filter({ hasText: "The response round is open." }).waitFor();
    await round.locator('[data-response-window="open"]').waitFor();
    expect(await round.getByRole("button", { name: "Change the dates" }).count()).toBe(1);

    // The opening e-mail reaches the proposer through the outbox (the app's own worker sends it).
    const opening = await waitFor(
      async () => (await caughtMessages()).find((m) => m.to.includes(s.proposer.email) && m.subject.startsWith("Answer the review items on")),
      60_000,
      "the opening e-mail",
    );
    expect(opening.text).toContain(`${p}/responses`);

    // The proposer: /boards → the board → the proposal → the response round.
    const proposer = await as(s.proposer.email);
    await proposer.goto("/boards");
    await proposer.getByRole("link", { name: s.board.name }).click();
    await proposer.getByRole("link", { name: s.proposal.title }).first().click();
    await proposer.waitForURL((url) => url.pathname === p);
    await proposer.getByRole("link", { name: "Response round" }).click();
    await proposer.waitForURL((url) => url.pathname === `${p}/responses`);
    const item = proposer.locator("li[data-item]").filter({ hasText: "Drift orbit period" });
    await item.waitFor();
    // The second reviewer has not submitted: their item is not shown yet. Reviewers are numbered, never named.
    expect(await proposer.getByText("Eclipse season").count()).toBe(0);
    expect(await item.textContent()).toContain("Reviewer 1");
    expect(await proposer.locator("main").textContent()).not.toContain(s.reviewer.name);
    const answerText = "The drift orbit period now follows from the altitudes; see the transfer section.";
    const answerBox = item.getByRole("textbox", { name: "Your answer to “Drift orbit period”" });
    await typeInto(answerBox, answerText);
    await item.getByRole("button", { name: "Save the answer" }).click();
    await item.getByRole("status").filter({ hasText: "Answer saved." }).waitFor();
    await item.getByText(answerText).waitFor();
    expect(await item.getByRole("button", { name: "Change the answer" }).count()).toBe(1);
    // Back to the proposal and Forward again: the saved answer is what the page shows.
    await proposer.goBack();
    await proposer.waitForURL((url) => url.pathname === p);
    await proposer.goForward();
    await proposer.waitForURL((url) => url.pathname === `${p}/responses`);
    await proposer.locator("li[data-item]").filter({ hasText: "Drift orbit period" }).getByText(answerText).waitFor();

    // The reviewer: /boards → the board → My reviews → the review screen.
    const reviewer = await as(s.reviewer.email);
    await reviewer.goto("/boards");
    await reviewer.getByRole("link", { name: s.board.name }).click();
    await reviewer.getByRole("link", { name: "My reviews" }).first().click();
    await reviewer.waitForURL((url) => url.pathname === `${b}/reviews`);
    await reviewer.locator(`a[href*="/proposals/${s.proposal.id}/review"]`).first().click();
    await reviewer.waitForURL((url) => url.pathname === `${p}/review`);
    const card = reviewer.locator("li[data-item]").filter({ hasText: "Drift orbit period" });
    await card.getByText(answerText).waitFor();
    const form = card.getByRole("form", { name: "Disposition of Drift orbit period" });
    // Keyboard: focus the first choice and move with the arrow keys to "Will be fixed in the next version".
    await form.getByRole("radio", { name: "Agreed" }).focus();
    await reviewer.keyboard.press("ArrowDown");
    expect(await form.getByRole("radio", { name: "Will be fixed in the next version" }).isChecked()).toBe(true);
    await typeInto(form.getByRole("textbox", { name: /^Why/ }), "Accepted; the next version must show the new period.");
    await form.getByRole("button", { name: "Record the disposition" }).click();
    await card.locator('[data-disposition="fix-next-version"]').waitFor();
    await card.getByText("History of dispositions (1)").click();
    const history = card.getByRole("list", { name: "History of dispositions of Drift orbit period" });
    await history.getByText("Why: Accepted; the next version must show the new period.").waitFor();
    expect(await history.textContent()).toContain("Will be fixed in the next version");
    expect(await history.textContent()).toContain("(reviewer)");

    // The second reviewer (review still a draft) states confidence and expertise with the keyboard.
    const second = await as(s.reviewer2.email);
    await second.goto("/boards");
    await second.getByRole("link", { name: s.board.name }).click();
    await second.getByRole("link", { name: "My reviews" }).first().click();
    await second.locator(`a[href*="/proposals/${s.proposal.id}/review"]`).first().click();
    await second.waitForURL((url) => url.pathname === `${p}/review`);
    const confidence = second.getByRole("group", { name: "Your confidence in this review" });
    await confidence.getByRole("radio", { name: /^Low/ }).focus();
    await second.keyboard.press("ArrowDown");
    await second.keyboard.press("ArrowDown");
    expect(await confidence.getByRole("radio", { name: /^High/ }).isChecked()).toBe(true);
    const expertise = second.getByRole("group", { name: "Your expertise in the subject" });
    await expertise.getByRole("radio", { name: "Outside my field" }).focus();
    await second.keyboard.press("Space");
    await second.getByText("All changes saved").waitFor();

    // The chair records a second disposition from the response round page; both stay in the history.
    await chair.goto("/boards");
    await chair.getByRole("link", { name: s.board.name }).click();
    await chair.getByRole("link", { name: "Overview, reviews and decisions" }).first().click();
    await chair.getByRole("link", { name: `Decision on ${s.proposal.title}` }).click();
    await chair.waitForURL((url) => url.pathname === `${p}/decision`);
    const answers = chair.getByRole("region", { name: "Answers and dispositions" });
    await answers.getByText(`Answer: ${answerText}`).waitFor();
    await answers.getByText("Will be fixed in the next version").first().waitFor();
    const levels = chair.getByRole("region", { name: "Reviewer confidence and expertise" });
    await levels.getByText(s.reviewer.name).waitFor();
    expect(await levels.locator("li").filter({ hasText: s.reviewer2.name }).textContent()).toContain("confidence high · expertise: outside my field");
    await answers.getByRole("link", { name: "Response round page" }).click();
    await chair.waitForURL((url) => url.pathname === `${p}/responses`);
    const chairCard = chair.locator("li[data-item]").filter({ hasText: "Drift orbit period" });
    const chairForm = chairCard.getByRole("form", { name: "Disposition of Drift orbit period" });
    await chairForm.getByRole("radio", { name: "Not accepted" }).check();
    await chairForm.getByRole("button", { name: "Record the disposition" }).click();
    // Without a reason the browser's own check stops it; nothing is recorded.
    expect(await chairCard.locator('[data-disposition="not-accepted"]').count()).toBe(0);
    await typeInto(chairForm.getByRole("textbox", { name: /^Why/ }), "The table still uses the altitude.");
    await chairForm.getByRole("button", { name: "Record the disposition" }).click();
    await chairCard.locator('[data-disposition="not-accepted"]').waitFor();
    await chairCard.getByText("History of dispositions (2)").click();
    const entries = chairCard.locator("[data-disposition-entry]");
    expect(await entries.count()).toBe(2);
    expect(await entries.nth(1).textContent()).toContain("Why: The table still uses the altitude.");

    // The proposer sees both dispositions, with the blind labels, after a reload of the page.
    await proposer.reload();
    const proposerCard = proposer.locator("li[data-item]").filter({ hasText: "Drift orbit period" });
    await proposerCard.getByText("History of dispositions (2)").click();
    const seen = await proposerCard.locator("[data-disposition-entry]").allTextContents();
    expect(seen.map((t) => t.split(" · ")[1])).toEqual(["Reviewer 1 (reviewer)", "Chair (chair)"]);
  });
});
