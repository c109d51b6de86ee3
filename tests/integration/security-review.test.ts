// Issue 17, finding 5 and the version item of 6: blind review hides proposer names in every
// read a reviewer makes, and a reviewer reads only the versions assigned to them unless the
// board lets reviewers read every version.
import crypto from "node:crypto";
import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { attachments, boards, proposals, proposalVersions } from "@/db/schema";
import { assignReviewers } from "@/lib/dal/assignments";
import { attachmentDownloadUrl, listAttachments } from "@/lib/dal/attachments";
import { getProposal, getVersion, listVersions } from "@/lib/dal/proposals";
import { AppError } from "@/lib/errors";
import { writeObject } from "@/storage/object-store";
import { asSessionUser, createUser } from "../support/factories";
import { addCoauthor, createReviewRound, dossierDocument, inFuture } from "./review-fixtures";

async function failure(promise: Promise<unknown>): Promise<AppError> {
  try {
    await promise;
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
  throw new Error("expected an AppError");
}

async function assign(round: Awaited<ReturnType<typeof createReviewRound>>) {
  await assignReviewers(asSessionUser(round.chair), round.board.id, {
    proposalIds: [round.proposal.id],
    reviewerIds: [round.reviewer.id],
    dueAt: inFuture(),
    confirmLikelyConflicts: true,
  });
}

describe("blind review", () => {
  it("leaves owner and co-authors out of the proposal a reviewer reads, and keeps them for chairs and authors", async () => {
    const round = await createReviewRound({ hideProposerNames: true });
    const coauthor = await createUser({ name: "Ysolde Marrack" });
    await addCoauthor(round.proposal.id, coauthor.id);
    await assign(round);
    const seen = await getProposal(asSessionUser(round.reviewer), round.board.id, round.proposal.id);
    expect(seen.owner).toBeNull();
    expect(seen.ownerId).toBeNull();
    expect(seen.coauthors).toEqual([]);
    expect(seen.proposerNamesHidden).toBe(true);
    expect(JSON.stringify(seen)).not.toContain(round.proposer.id);
    expect(JSON.stringify(seen)).not.toContain("Ysolde Marrack");

    const chair = await getProposal(asSessionUser(round.chair), round.board.id, round.proposal.id);
    expect(chair.owner?.id).toBe(round.proposer.id);
    expect(chair.coauthors.map((c) => c.name)).toEqual(["Ysolde Marrack"]);
    expect((await getProposal(asSessionUser(round.proposer), round.board.id, round.proposal.id)).owner?.id).toBe(round.proposer.id);

    await db().update(boards).set({ hideProposerNames: false }).where(eq(boards.id, round.board.id));
    expect((await getProposal(asSessionUser(round.reviewer), round.board.id, round.proposal.id)).owner?.id).toBe(round.proposer.id);
  });
});

describe("reviewers read the versions assigned to them", () => {
  it("hides a later version (and its files) from a reviewer assigned to version 1, unless the board opts in", async () => {
    const round = await createReviewRound();
    await assign(round);
    // The proposer revises: version 2 with a file version 1 does not list.
    const fileId = crypto.randomUUID();
    const key = `boards/${round.board.id}/proposals/${round.proposal.id}/attachments/${fileId}`;
    await writeObject(key, "revised plan\n", "text/plain");
    await db().insert(attachments).values({
      id: fileId,
      proposalId: round.proposal.id,
      boardId: round.board.id,
      objectKey: key,
      filename: "revised.txt",
      declaredType: "text/plain",
      detectedType: "text/plain",
      declaredSize: 13,
      size: 13,
      status: "confirmed",
      confirmedAt: new Date(),
    });
    await db()
      .insert(proposalVersions)
      .values({
        proposalId: round.proposal.id,
        boardId: round.board.id,
        number: 2,
        title: "Revised",
        document: dossierDocument("Revised"),
        documentKey: `test/${round.proposal.id}/2.json`,
        htmlKey: `test/${round.proposal.id}/2.html`,
        attachments: [{ attachmentId: fileId, filename: "revised.txt", contentType: "text/plain", size: 13, sha256: "0".repeat(64) }],
      });
    await db().update(proposals).set({ latestVersion: 2 }).where(eq(proposals.id, round.proposal.id));

    const reviewer = asSessionUser(round.reviewer);
    expect((await listVersions(reviewer, round.board.id, round.proposal.id)).map((v) => v.number)).toEqual([1]);
    expect((await getVersion(reviewer, round.board.id, round.proposal.id, 1)).number).toBe(1);
    expect((await failure(getVersion(reviewer, round.board.id, round.proposal.id, 2))).status).toBe(404);
    expect((await listAttachments(reviewer, round.board.id, round.proposal.id)).map((a) => a.id)).not.toContain(fileId);
    expect((await failure(attachmentDownloadUrl(reviewer, round.board.id, fileId))).status).toBe(404);
    // Chairs read everything.
    expect((await listVersions(asSessionUser(round.chair), round.board.id, round.proposal.id)).map((v) => v.number)).toEqual([2, 1]);

    await db().update(boards).set({ reviewersSeeAllVersions: true }).where(eq(boards.id, round.board.id));
    expect((await getVersion(reviewer, round.board.id, round.proposal.id, 2)).number).toBe(2);
    expect(await attachmentDownloadUrl(reviewer, round.board.id, fileId)).toMatch(/^http/);
  });
});
