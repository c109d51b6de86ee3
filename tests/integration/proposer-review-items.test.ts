// Proposers read the review items on their proposal page once the decision is issued, with
// reviewers numbered, never named.
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { decisions } from "@/db/schema";
import { assignReviewers } from "@/lib/dal/assignments";
import { createReviewItem } from "@/lib/dal/review-items";
import { dossierPlainText } from "@/lib/dossier";
import { makeAnchor } from "@/lib/review/anchors";
import { appUrl } from "../support/app";
import { asSessionUser } from "../support/factories";
import { signedIn } from "../support/http";
import { createReviewRound, dossierDocument, inFuture } from "./review-fixtures";

describe("the proposal page shows review items to the proposer after the decision", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("hides them before the decision and shows them, anonymised, after", async () => {
    const round = await createReviewRound();
    await assignReviewers(asSessionUser(round.chair), round.board.id, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id],
      dueAt: inFuture(),
      confirmLikelyConflicts: false,
    });
    const text = dossierPlainText(dossierDocument(round.proposal.title));
    const from = text.indexOf("95.6 minutes");
    await createReviewItem(asSessionUser(round.reviewer2), round.board.id, {
      proposalId: round.proposal.id,
      severity: "major",
      title: "Period disagrees with the stated altitude",
      body: "Recompute the period from the orbit radius, not the altitude.",
      anchor: makeAnchor(text, from, from + 12),
    });
    const proposer = await signedIn(round.proposer.email);
    const path = `/boards/${round.board.id}/proposals/${round.proposal.id}`;

    const before = await (await proposer.get(path)).text();
    expect(before).not.toContain("Period disagrees with the stated altitude");

    await db().insert(decisions).values({
      boardId: round.board.id,
      proposalId: round.proposal.id,
      versionId: round.version.id,
      outcome: "revise",
      letter: {},
      letterHtml: "",
      letterText: "",
    });
    const response = await proposer.get(path);
    expect(response.status).toBe(200);
    const after = await response.text();
    expect(after).toContain("Period disagrees with the stated altitude");
    expect(after).toContain("Reviewer 1");
    expect(after).not.toContain(round.reviewer2.name);
  });
});
