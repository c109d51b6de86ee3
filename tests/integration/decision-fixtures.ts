// A proposal ready for a decision, made straight in the database: a board with its cast, an
// open call with a rubric, a submitted version with recomputed orbit claims, assignments,
// reviews with scores and review items. All names are invented for the tests.
import crypto from "node:crypto";
import { db } from "@/db/client";
import { assignments, calls, checkResults, proposals, proposalVersions, reviewItems, reviews, rubricTemplates, type RubricCriterion } from "@/db/schema";
import { addMember, createBoardWithCast, createUser, unique } from "../support/factories";

export const criteria: RubricCriterion[] = [
  {
    id: "science",
    title: "Mission return",
    description: "What the mission delivers",
    weight: 60,
    scaleMin: 1,
    scaleMax: 5,
    levels: ["1", "2", "3", "4", "5"],
    commentRequiredBelow: null,
  },
  {
    id: "feasibility",
    title: "Feasibility",
    description: "Orbit, Δv and schedule",
    weight: 40,
    scaleMin: 1,
    scaleMax: 5,
    levels: ["1", "2", "3", "4", "5"],
    commentRequiredBelow: null,
  },
];

export function parkingOrbitBlock(blockId: string, label: string, period: number) {
  return {
    type: "orbitCheck",
    attrs: { blockId, label, claim: { kind: "orbit", body: "earth", given: { periapsisAltitude: 500, apoapsisAltitude: 800 }, claimed: { period } } },
  };
}

export function dossierDoc(paragraph: string, blocks: Record<string, unknown>[]) {
  return {
    type: "doc",
    content: [
      { type: "heading", attrs: { level: 2 }, content: [{ type: "text", text: "Mission design" }] },
      { type: "paragraph", content: [{ type: "text", text: paragraph }] },
      ...blocks,
    ],
  };
}

export async function addVersion(
  board: { id: string },
  proposal: { id: string; title: string },
  number: number,
  doc: Record<string, unknown>,
  checks: { blockId: string; label: string; status: "consistent" | "inconsistent" | "invalid"; claimedPeriod: number; computedPeriod: number }[],
  submittedBy: string,
) {
  const [version] = await db()
    .insert(proposalVersions)
    .values({
      proposalId: proposal.id,
      boardId: board.id,
      number,
      title: proposal.title,
      document: doc,
      documentKey: `boards/${board.id}/proposals/${proposal.id}/versions/${number}/document.json`,
      htmlKey: `boards/${board.id}/proposals/${proposal.id}/versions/${number}/document.html`,
      submittedBy,
    })
    .returning();
  for (const c of checks) {
    await db()
      .insert(checkResults)
      .values({
        versionId: version!.id,
        boardId: board.id,
        blockId: c.blockId,
        label: c.label,
        kind: "orbit",
        status: c.status,
        claim: { kind: "orbit", body: "earth", given: { periapsisAltitude: 500, apoapsisAltitude: 800 }, claimed: { period: c.claimedPeriod } },
        result: {
          id: c.blockId,
          kind: "orbit",
          status: c.status,
          computed: { period: c.computedPeriod },
          checks: [
            {
              quantity: "period",
              claimed: c.claimedPeriod,
              computed: c.computedPeriod,
              unit: "s",
              relativeError: Math.abs(c.claimedPeriod - c.computedPeriod) / c.computedPeriod,
              ok: c.status === "consistent",
            },
          ],
          messages: c.status === "consistent" ? [] : ["the claimed period differs from the two-body value by more than the call's tolerance"],
        },
      });
  }
  return version!;
}

/** A proposal whose version 1 is in review, with `submitted` of two assigned reviews submitted. */
export async function decisionScenario(
  options: { submitted?: 0 | 1 | 2; required?: number; callClosesInDays?: number; cast?: Awaited<ReturnType<typeof createBoardWithCast>> } = {},
) {
  const cast = options.cast ?? (await createBoardWithCast());
  const { board, chair, reviewer, proposer } = cast;
  const reviewer2 = await createUser({ name: "Second Reviewer" });
  await addMember(board.id, reviewer2.id, "reviewer");
  const [call] = await db()
    .insert(calls)
    .values({
      boardId: board.id,
      title: unique("Call for lunar relay missions"),
      opensAt: new Date(Date.now() - 86_400_000),
      closesAt: new Date(Date.now() + (options.callClosesInDays ?? 30) * 86_400_000),
      reviewersPerProposal: options.required ?? 2,
    })
    .returning();
  const [rubric] = await db()
    .insert(rubricTemplates)
    .values({ boardId: board.id, callId: call!.id, version: 1, name: "Standard rubric", criteria, frozenAt: new Date() })
    .returning();
  const title = unique("Selene Relay Pathfinder");
  const [proposal] = await db()
    .insert(proposals)
    .values({ boardId: board.id, callId: call!.id, ownerId: proposer.id, title, missionType: "lunar relay", status: "in_review", latestVersion: 1 })
    .returning();
  const parkingId = crypto.randomUUID();
  const transferId = crypto.randomUUID();
  const version = await addVersion(
    board,
    proposal!,
    1,
    dossierDoc("The relay rides a low parking orbit before the transfer burn.", [
      parkingOrbitBlock(parkingId, "the parking orbit", 5827),
      parkingOrbitBlock(transferId, "the drift orbit", 6100),
    ]),
    [
      { blockId: parkingId, label: "the parking orbit", status: "consistent", claimedPeriod: 5827, computedPeriod: 5863.69 },
      { blockId: transferId, label: "the drift orbit", status: "inconsistent", claimedPeriod: 6100, computedPeriod: 5863.69 },
    ],
    proposer.id,
  );
  const submitted = options.submitted ?? 2;
  const people = [reviewer, reviewer2];
  const totals = [3.6, 4.4];
  const assignmentRows = [];
  for (let i = 0; i < 2; i++) {
    const [a] = await db()
      .insert(assignments)
      .values({
        boardId: board.id,
        proposalId: proposal!.id,
        versionId: version.id,
        reviewerId: people[i]!.id,
        dueAt: new Date(Date.now() + 7 * 86_400_000),
        assignedBy: chair.id,
      })
      .returning();
    assignmentRows.push(a!);
    await db()
      .insert(reviews)
      .values({
        assignmentId: a!.id,
        boardId: board.id,
        proposalId: proposal!.id,
        versionId: version.id,
        reviewerId: people[i]!.id,
        rubricTemplateId: rubric!.id,
        scores: { science: { score: 4, comment: "Clear return." }, feasibility: { score: i === 0 ? 3 : 5, comment: "See the drift orbit." } },
        summary: `Summary by reviewer ${i + 1}`,
        weightedTotal: totals[i]!,
        status: i < submitted ? "submitted" : "draft",
        submittedAt: i < submitted ? new Date() : null,
      });
  }
  const anchor = { from: 0, to: 5, quote: "The r", prefix: "", suffix: "elay" };
  const [major] = await db()
    .insert(reviewItems)
    .values({
      boardId: board.id,
      proposalId: proposal!.id,
      versionId: version.id,
      authorId: reviewer.id,
      severity: "major",
      title: "Drift orbit period",
      body: "The stated period does not follow from the altitudes.",
      anchor,
    })
    .returning();
  const [minor] = await db()
    .insert(reviewItems)
    .values({
      boardId: board.id,
      proposalId: proposal!.id,
      versionId: version.id,
      authorId: reviewer2.id,
      severity: "minor",
      title: "Eclipse season",
      body: "Say which eclipse model was used.",
      anchor,
    })
    .returning();
  return {
    ...cast,
    reviewer2,
    call: call!,
    rubric: rubric!,
    proposal: proposal!,
    version,
    assignments: assignmentRows,
    items: { major: major!, minor: minor! },
    blockIds: { parkingId, transferId },
  };
}
