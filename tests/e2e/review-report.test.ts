// The review report in a real browser (issue 16 C): the chair goes from /boards to the
// decision page and on to the report by links, reads its sections, downloads the PDF (its
// text checked with pdf-parse), goes Back and Forward, then decides with the report attached
// and the letter e-mail reaches the mail catcher with both PDFs; the proposer then reads the
// report with the reviewers numbered, not named.
import { createRequire } from "node:module";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { users } from "@/db/schema";
import { REPORT_SECTIONS } from "@/lib/reports/review-report";
import { browserSession } from "../support/browser";
import { unique } from "../support/factories";
import { decisionScenario } from "../integration/decision-fixtures";
import { caughtMessages, waitFor } from "../integration/outbox-support";

const pdfParse = createRequire(import.meta.url)("pdf-parse/lib/pdf-parse.js") as (data: Buffer) => Promise<{ text: string }>;

describe("the review report in the browser", () => {
  const { as } = browserSession();

  it("the chair reaches it from /boards, reads its sections and the PDF, and sends it with the decision", { timeout: 300_000 }, async () => {
    const s = await decisionScenario();
    const reviewerName = `Ines Halvorsen ${unique("n").slice(-6)}`;
    await db().update(users).set({ name: reviewerName }).where(eq(users.id, s.reviewer.id));
    const p = `/boards/${s.board.id}/proposals/${s.proposal.id}`;

    const chair = await as(s.chair.email);
    await chair.goto("/boards");
    await chair.getByRole("link", { name: s.board.name }).click();
    await chair.getByRole("link", { name: "Overview, reviews and decisions" }).first().click();
    await chair.getByRole("link", { name: `Decision on ${s.proposal.title}` }).click();
    await chair.waitForURL((url) => url.pathname === `${p}/decision`);
    await chair.getByRole("link", { name: "review report", exact: true }).click();
    await chair.waitForURL((url) => url.pathname === `${p}/versions/1/report`);

    const report = chair.getByRole("article", { name: "Review report" });
    for (const title of Object.values(REPORT_SECTIONS)) await report.getByRole("heading", { name: title, level: 2 }).waitFor();
    const byCriterion = report.getByRole("table", { name: "Scores by criterion, raw and calibrated" });
    await byCriterion.getByRole("rowheader", { name: "Feasibility" }).waitFor();
    await byCriterion.getByRole("columnheader", { name: "Calibrated mean" }).waitFor();
    await report
      .getByRole("table", { name: "Raw scores per review" })
      .getByRole("rowheader", { name: `Reviewer 1 · ${reviewerName}` })
      .waitFor();
    await report.getByRole("heading", { name: "1. [major] Drift orbit period" }).waitFor();
    await report.getByText("Verdict: inconsistent. Answers: Are the numbers right?").waitFor();
    await report.getByRole("heading", { name: "Does the mission close? Requirement verdicts" }).waitFor();
    await report.getByRole("heading", { name: "Do the attached orbit files say what the text says? File comparisons" }).waitFor();
    await report
      .getByText(/Two-body screening estimates, not flight-qualified analysis/)
      .first()
      .waitFor();

    // The section links move within the page.
    await chair.getByRole("navigation", { name: "Sections of the report" }).getByRole("link", { name: REPORT_SECTIONS.checks }).click();
    await chair.waitForURL((url) => url.hash === "#report-checks");

    // The PDF the page links to carries the same sections.
    const href = await chair.getByRole("link", { name: "Download the report (PDF)" }).getAttribute("href");
    const download = await chair.request.get(href!);
    expect(download.status()).toBe(200);
    expect(download.headers()["content-type"]).toBe("application/pdf");
    const text = (await pdfParse(await download.body())).text.replace(/\s+/g, " ");
    for (const title of Object.values(REPORT_SECTIONS)) expect(text).toContain(title);
    expect(text).toContain(reviewerName);

    // Back to the decision page (twice: the section link added a history entry), Forward to the report again.
    await chair.goBack();
    await chair.goBack();
    await chair.waitForURL((url) => url.pathname === `${p}/decision`);
    await chair.getByRole("heading", { name: s.proposal.title }).waitFor();
    await chair.goForward();
    await chair.waitForURL((url) => url.pathname === `${p}/versions/1/report`);
    await chair.getByRole("article", { name: "Review report" }).getByRole("heading", { name: REPORT_SECTIONS.scores }).waitFor();
    await chair.goBack();
    await chair.waitForURL((url) => url.pathname === `${p}/decision`);

    // Decide with the report attached.
    await chair.getByRole("radio", { name: /Accept/ }).check();
    await chair.getByRole("checkbox", { name: /Attach the review report \(PDF\)/ }).check();
    await chair.getByRole("button", { name: "Send the decision…" }).click();
    await chair.getByText("with the review report attached", { exact: false }).waitFor();
    await chair.getByRole("button", { name: "Confirm and send the decision" }).click();
    await chair.getByRole("heading", { name: "Decision issued" }).waitFor({ timeout: 60_000 });

    const mail = await waitFor(
      async () => (await caughtMessages()).find((m) => m.to.includes(s.proposer.email) && m.subject.includes(s.proposal.title)),
      60_000,
      "the decision letter e-mail",
    );
    expect(mail.attachments.map((a) => a.contentType)).toEqual(["application/pdf", "application/pdf"]);
    const attached = (await pdfParse(Buffer.from(mail.attachments[1]!.contentBase64, "base64"))).text.replace(/\s+/g, " ");
    expect(attached).toContain(REPORT_SECTIONS.items);
    expect(attached).toContain("Reviewer 1");
    expect(attached).not.toContain(reviewerName);

    // The proposer reads the report of the decided version from the decision page, reviewers numbered.
    const proposer = await as(s.proposer.email);
    await proposer.goto("/boards");
    await proposer.getByRole("link", { name: s.board.name }).click();
    await proposer.getByRole("link", { name: "the decision" }).click();
    await proposer.waitForURL((url) => url.pathname === `${p}/decision`);
    await proposer.getByRole("link", { name: "Review report, version 1" }).click();
    await proposer.waitForURL((url) => url.pathname === `${p}/versions/1/report`);
    const theirs = proposer.getByRole("article", { name: "Review report" });
    await theirs.getByRole("table", { name: "Raw scores per review" }).getByRole("rowheader", { name: "Reviewer 1", exact: true }).waitFor();
    expect(await theirs.textContent()).not.toContain(reviewerName);
  });
});
