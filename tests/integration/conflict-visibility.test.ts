// A reviewer from an author's organisation cannot open the dossier, even when assigned
// before the conflict came to light: the proposal pages and the review rules agree.
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { assignments, users } from "@/db/schema";
import { getProposal } from "@/lib/dal/proposals";
import { asSessionUser } from "../support/factories";
import { createReviewRound } from "./review-fixtures";

describe("conflicts hide the proposal", () => {
  it("answers 404 to an assigned reviewer who shares the owner's organisation, and lets an unconflicted one in", async () => {
    const round = await createReviewRound();
    await db().update(users).set({ organisation: "Corvid Orbital Works" }).where(eq(users.id, round.proposer.id));
    await db().update(users).set({ organisation: "corvid orbital works" }).where(eq(users.id, round.reviewer3.id));
    // Assigned directly in the database, as if the organisation were recorded only afterwards.
    for (const reviewer of [round.reviewer2, round.reviewer3]) {
      await db()
        .insert(assignments)
        .values({
          boardId: round.board.id,
          proposalId: round.proposal.id,
          versionId: round.version.id,
          reviewerId: reviewer.id,
          dueAt: new Date(Date.now() + 7 * 86_400_000),
        });
    }
    await expect(getProposal(asSessionUser(round.reviewer2), round.board.id, round.proposal.id)).resolves.toMatchObject({ id: round.proposal.id });
    await expect(getProposal(asSessionUser(round.reviewer3), round.board.id, round.proposal.id)).rejects.toMatchObject({ status: 404 });
  });
});
