// A call's requirement from the chair's form to the reviewer's screen, in a real browser:
// the chair adds a 25-year disposal deadline; the proposer sees "not met" in the rail for a
// spacecraft left to decay, lowers the perigee with a disposal burn typed key by key, and
// sees it met; after the board's revise decision the new version is submitted, and the
// reviewer assigned to it sees the requirement met where version 1 had it not met.
import { describe, expect, it } from "vitest";
import { asSessionUser, createBoardWithCast } from "../support/factories";
import { dossierDoc, makeCall, orbitBlock } from "../integration/matrix/dossiers";
import { browserSession } from "../support/browser";
import { createProposal, getVersion, saveDraft } from "@/lib/dal/proposals";
import { createDecision } from "@/lib/decisions";
import { assignReviewers } from "@/lib/dal/assignments";
import { DEFAULT_LETTER_TEMPLATE } from "@/lib/decisions/template";

describe("call requirements in the browser", () => {
  const { as } = browserSession();

  it("chair sets a disposal deadline, the proposer meets it with a burn, the reviewer sees the flag clear", { timeout: 240_000 }, async () => {
    const cast = await createBoardWithCast();
    const call = await makeCall(cast);
    const proposer = asSessionUser(cast.proposer);
    const proposal = await createProposal(proposer, cast.board.id, {
      title: "Dunlin drag-decay pathfinder",
      missionType: "science",
      callId: call.id,
      coauthorIds: [],
    });
    await saveDraft(proposer, cast.board.id, proposal.id, {
      revision: 1,
      document: dossierDoc([
        { type: "heading", attrs: { level: 2 }, content: [{ type: "text", text: "End of life" }] },
        orbitBlock("end of life", { kind: "disposal", body: "earth", given: { altitude: 700, ballisticCoefficient: 50 } }),
      ]),
    });

    // The chair: board → call → add the requirement, typing the deadline.
    const chair = await as(cast.chair.email);
    await chair.goto("/boards");
    await chair.getByRole("link", { name: cast.board.name }).click();
    await chair.getByRole("link", { name: call.title }).first().click();
    await chair.getByRole("heading", { name: "Add a requirement" }).waitFor();
    await chair.getByLabel("Requirement", { exact: true }).selectOption("disposalDeadline");
    await chair.getByLabel("Deadline after the end of the mission (years)").click();
    await chair.keyboard.type("-5");
    await chair.getByRole("button", { name: "Add requirement" }).click();
    // The server refuses it, naming the field; nothing is listed.
    await chair.getByText("Not added: correct the marked values.").waitFor();
    await chair.getByText(/the deadline must be more than 0 years/i).waitFor();
    await chair.getByLabel("Deadline after the end of the mission (years)").press("Control+A");
    await chair.keyboard.type("25");
    await chair.getByRole("button", { name: "Add requirement" }).click();
    await chair.getByText("Added: Re-entry within 25 years after the end of the mission.").waitFor();
    await expect.poll(() => chair.getByRole("list", { name: "Requirements of this call" }).textContent()).toContain("Re-entry within 25 years");

    // The proposer: board → dossier; the rail judges the natural decay against the deadline.
    const author = await as(cast.proposer.email);
    await author.goto("/boards");
    await author.getByRole("link", { name: cast.board.name }).click();
    await author.getByRole("link", { name: "Dunlin drag-decay pathfinder" }).click();
    const rail = author.locator('[data-rail-requirement="disposalDeadline"]');
    await rail.locator('[data-rail-outcome="notMet"]').waitFor();
    await expect(rail.textContent()).resolves.toMatch(/Requirement not met.*re-entry takes 5\d\.\d years by natural decay; the call asks at most 25 years/);
    await author.locator('[data-chart="decay-curve"]').waitFor();

    // Submit version 1 as it stands; the board asks for a revision.
    await author.getByRole("button", { name: "Submit version 1" }).click();
    await author.getByText("Version 1", { exact: false }).first().waitFor();
    await expect
      .poll(async () => (await getVersion(proposer, cast.board.id, proposal.id, 1).catch(() => null))?.checkResults[0]?.requirements[0]?.status)
      .toBe("notMet");
    await createDecision(asSessionUser(cast.chair), cast.board.id, proposal.id, {
      outcome: "revise",
      letter: DEFAULT_LETTER_TEMPLATE,
      overrideReason: "The disposal plan must be fixed before any review is worth the panel's time.",
    });

    // The proposer adds the disposal burn, typing the target perigee.
    await author.reload();
    const block = author.locator("[data-orbit-check-block]").first();
    await block.waitFor();
    await block.getByLabel("Target perigee altitude h_p (km) (optional)").click();
    await author.keyboard.type("250");
    await rail.locator('[data-rail-outcome="met"]').waitFor();
    await expect(rail.textContent()).resolves.toMatch(/Requirement met.*re-entry in \d+\.\d years after the disposal burn/);
    await author.getByRole("button", { name: "Submit version 2" }).click();
    await expect
      .poll(async () => (await getVersion(proposer, cast.board.id, proposal.id, 2).catch(() => null))?.checkResults[0]?.requirements[0]?.status, {
        timeout: 30_000,
      })
      .toBe("met");

    // The reviewer assigned to version 2: board → reviews → the dossier; the flag is clear.
    await assignReviewers(asSessionUser(cast.chair), cast.board.id, {
      proposalIds: [proposal.id],
      reviewerIds: [cast.reviewer.id],
      dueAt: new Date(Date.now() + 7 * 86_400_000),
      confirmLikelyConflicts: true,
    });
    const reviewer = await as(cast.reviewer.email);
    await reviewer.goto("/boards");
    await reviewer.getByRole("link", { name: cast.board.name }).click();
    await reviewer.locator(`a[href="/boards/${cast.board.id}/reviews"]`).first().click();
    await reviewer.getByRole("link", { name: "Dunlin drag-decay pathfinder" }).click();
    const checks = reviewer.locator("section[aria-labelledby=checks-heading]");
    await checks.locator('[data-requirement-outcome="met"]').waitFor();
    await expect(checks.locator('[data-requirement-outcome="notMet"]').count()).resolves.toBe(0);
    await expect(checks.textContent()).resolves.toMatch(/Requirement met.*Re-entry within 25 years after the end of the mission/);
    // Back keeps the reviewer on the queue they came from.
    await reviewer.goBack();
    await reviewer.getByRole("link", { name: "Dunlin drag-decay pathfinder" }).waitFor();
  });
});
