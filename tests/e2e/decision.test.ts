// The decision round in a real browser: the chair reads the scores and flags, decides
// "revise" with the board's letter, the letter e-mail with its PDF reaches the mail catcher,
// the proposer revises the dossier in the editor and submits version 2, the chair compares
// the two versions and asks the same reviewers again, and an admin sees the mail as sent.
import { createRequire } from "node:module";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { assignments, proposalVersions } from "@/db/schema";
import { browserSession } from "../support/browser";
import { decisionScenario } from "../integration/decision-fixtures";
import { caughtMessages, waitFor } from "../integration/outbox-support";

const pdfParse = createRequire(import.meta.url)("pdf-parse/lib/pdf-parse.js") as (data: Buffer) => Promise<{ text: string }>;

describe("deciding, resubmitting and comparing in the browser", () => {
  const { as } = browserSession();

  it("runs a revise-and-resubmit round end to end", async () => {
    const s = await decisionScenario();
    const decisionPath = `/boards/${s.board.id}/proposals/${s.proposal.id}/decision`;

    // The chair decides.
    const chair = await as(s.chair.email);
    // By links from /boards: the board, the call's overview, the proposal's decision.
    await chair.goto("/boards");
    await chair.getByRole("link", { name: s.board.name }).click();
    await chair.getByRole("link", { name: "Overview, reviews and decisions" }).first().click();
    await chair.getByRole("link", { name: `Decision on ${s.proposal.title}` }).click();
    await chair.waitForURL((url) => url.pathname === decisionPath);
    await chair.getByRole("heading", { name: s.proposal.title }).waitFor();
    expect(await chair.getByTestId("weighted-mean").textContent()).toBe("4.00");
    await chair.getByText("1 of 2 claims flagged by the server").waitFor();
    await chair.getByText("Drift orbit period").first().waitFor();
    await chair.getByRole("radio", { name: /Revise and resubmit/ }).check();
    await chair.getByRole("textbox", { name: "Letter text" }).waitFor();
    await chair.getByRole("button", { name: "Preview the letter" }).click();
    const preview = chair.getByRole("region", { name: "Letter preview" });
    await preview.getByText(`Dear ${s.proposer.name},`).waitFor();
    await preview.getByText("[major] Drift orbit period", { exact: false }).waitFor();
    // Sending shows the letter as it goes out and asks to confirm before anything is stored.
    await chair.getByRole("button", { name: "Send the decision…" }).click();
    await chair.getByRole("region", { name: "Check the letter, then confirm" }).getByText(`Dear ${s.proposer.name},`).waitFor();
    await chair.getByRole("button", { name: "Confirm and send the decision" }).click();
    await chair.getByRole("heading", { name: "Decision issued" }).waitFor({ timeout: 60_000 });
    await chair.getByRole("link", { name: "Download the letter (PDF)" }).waitFor();

    // The letter e-mail with the PDF reaches the catcher (sent by the app's own worker), once.
    const mail = await waitFor(
      async () => (await caughtMessages()).find((m) => m.to.includes(s.proposer.email) && m.subject.includes("revise and resubmit")),
      60_000,
      "the decision letter e-mail",
    );
    expect(mail.attachments).toHaveLength(1);
    expect(mail.attachments[0]!.contentType).toBe("application/pdf");
    const attached = await pdfParse(Buffer.from(mail.attachments[0]!.contentBase64, "base64"));
    expect(attached.text).toContain(s.proposal.title);
    expect(attached.text.replace(/\s+/g, " ")).toMatch(/two-body screening estimates, not flight-qualified analysis/i);
    // The decision page reads the outbox status when rendered: reload until it shows "sent".
    await waitFor(
      async () => {
        await chair.reload();
        return /Sent: the mail server accepted it/.test((await chair.getByTestId("letter-mail-status").textContent()) ?? "") || undefined;
      },
      30_000,
      "the decision page showing the letter as sent",
    );
    expect((await caughtMessages()).filter((m) => m.to.includes(s.proposer.email) && m.subject.includes("revise and resubmit"))).toHaveLength(1);

    // The proposer reads the decision, downloads the PDF, revises the dossier and submits version 2.
    const proposer = await as(s.proposer.email);
    await proposer.goto("/boards");
    await proposer.getByRole("link", { name: s.board.name }).click();
    await proposer.getByRole("link", { name: "the decision" }).click();
    await proposer.waitForURL((url) => url.pathname === decisionPath);
    const pdfLink = proposer.getByRole("link", { name: "Download the letter (PDF)" });
    const download = await proposer.request.get(`${await pdfLink.getAttribute("href")}`);
    expect(download.status()).toBe(200);
    expect((await download.body()).subarray(0, 5).toString()).toBe("%PDF-");
    await proposer.getByRole("link", { name: "revise the dossier and submit version 2" }).click();
    await proposer.waitForURL(new RegExp(`/boards/${s.board.id}/proposals/${s.proposal.id}$`));
    const text = proposer.getByRole("textbox", { name: "Dossier text" });
    await text.waitFor();
    await text.locator("p", { hasText: "The relay rides a low parking orbit" }).click();
    await proposer.keyboard.press("End");
    await proposer.keyboard.type(" The transfer burn now includes a ten percent margin.");
    await proposer.locator("[data-save-state=saved]").waitFor({ timeout: 30_000 });
    await proposer.getByRole("button", { name: "Submit version 2" }).click();
    await proposer.getByRole("link", { name: "Version 2" }).waitFor({ timeout: 60_000 });
    const [v2] = await db()
      .select({ id: proposalVersions.id })
      .from(proposalVersions)
      .where(eq(proposalVersions.proposalId, s.proposal.id))
      .orderBy(proposalVersions.number)
      .offset(1);
    expect(v2).toBeDefined();

    // The chair compares the versions and asks the same reviewers again.
    await chair.goto(`/boards/${s.board.id}/proposals/${s.proposal.id}/compare?from=1&to=2`);
    await chair.getByRole("heading", { name: "Orbit claims side by side" }).waitFor();
    const rows = chair.getByTestId("claim-row");
    expect(await rows.count()).toBe(2);
    await rows.filter({ hasText: "the parking orbit" }).getByText("claimed 5827", { exact: false }).first().waitFor();
    await rows.filter({ hasText: "the drift orbit" }).getByText("claimed 6100", { exact: false }).first().waitFor();
    const diff = chair.getByTestId("text-diff");
    expect(await diff.locator("ins").allTextContents()).toEqual(expect.arrayContaining([expect.stringContaining("ten percent margin")]));
    await chair.getByRole("button", { name: "Ask the same reviewers to review version 2" }).click();
    await chair.getByText("2 reviewers asked to review version 2").waitFor();
    await chair.reload();
    await chair.getByText("Every reviewer still on the board is assigned to version 2.").waitFor();
    expect(await chair.getByRole("button", { name: "Ask the same reviewers to review version 2" }).count()).toBe(0);
    const onV2 = await db().select({ reviewerId: assignments.reviewerId }).from(assignments).where(eq(assignments.versionId, v2!.id));
    expect(onV2.map((a) => a.reviewerId).sort()).toEqual([s.reviewer.id, s.reviewer2.id].sort());

    // An admin finds the letter in the outbox as sent.
    const admin = await as(s.admin.email);
    await admin.goto("/admin/outbox?status=sent");
    await admin.getByRole("heading", { name: "Outbox" }).waitFor();
    await admin.getByRole("cell", { name: new RegExp(`Decision on “${s.proposal.title}”`) }).waitFor();
  });
});
