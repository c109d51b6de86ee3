// A call ready for its panel meeting: three proposals in review with submitted reviews whose
// weighted totals are set directly (invented demo numbers), and a third reviewer who has
// declared a conflict with the first proposal.
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { assignments, calls, reviews } from "@/db/schema";
import { declareConflict } from "@/lib/dal/conflicts";
import { asSessionUser, unique } from "../support/factories";
import { createProposalWithVersion, createReviewRound, inFuture } from "./review-fixtures";

export async function meetingScenario() {
  const round = await createReviewRound();
  const [call] = await db().select({ rubricTemplateId: calls.rubricTemplateId }).from(calls).where(eq(calls.id, round.call.id));
  const p1 = await createProposalWithVersion({
    boardId: round.board.id,
    callId: round.call.id,
    ownerId: round.proposer.id,
    title: unique("Aurora relay"),
    status: "in_review",
  });
  const p2 = await createProposalWithVersion({
    boardId: round.board.id,
    callId: round.call.id,
    ownerId: round.proposer.id,
    title: unique("Boreal sounder"),
    status: "in_review",
  });
  const p3 = await createProposalWithVersion({
    boardId: round.board.id,
    callId: round.call.id,
    ownerId: round.proposer.id,
    title: unique("Cirrus imager"),
    status: "in_review",
  });
  const [r1, r2, r3] = [round.reviewer, round.reviewer2, round.reviewer3];
  // Totals on the 1..5 scale: reviewer 1 is lenient on P1 and P2 and far below the others on P3.
  const scores: [typeof p1, typeof r1, number][] = [
    [p1, r1, 4.5],
    [p2, r1, 4.0],
    [p2, r2, 3.0],
    [p2, r3, 3.5],
    [p3, r2, 3.5],
    [p3, r3, 3.5],
    [p3, r1, 1.0],
  ];
  for (const [p, r, total] of scores) {
    const [a] = await db()
      .insert(assignments)
      .values({ boardId: round.board.id, proposalId: p.proposal.id, versionId: p.version.id, reviewerId: r.id, dueAt: inFuture(), assignedBy: round.chair.id })
      .returning();
    await db().insert(reviews).values({
      assignmentId: a!.id,
      boardId: round.board.id,
      proposalId: p.proposal.id,
      versionId: p.version.id,
      reviewerId: r.id,
      rubricTemplateId: call!.rubricTemplateId!,
      scores: {},
      weightedTotal: total,
      status: "submitted",
      submittedAt: new Date(),
    });
  }
  await declareConflict(asSessionUser(r3), round.board.id, { proposalId: p1.proposal.id, reason: "Advised the Aurora relay team last year." });
  return { ...round, p1: p1.proposal, p2: p2.proposal, p3: p3.proposal, scores };
}
