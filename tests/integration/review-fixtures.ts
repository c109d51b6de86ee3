// Test data for the review area: a board with a call, a rubric, submitted proposals with a
// version (a small Tiptap document with an orbit-check block) and the server's check results,
// made straight in the database. Invented scenario; every call makes fresh rows.
import { db } from "@/db/client";
import { boards, calls, checkResults, proposalCoauthors, proposals, proposalVersions } from "@/db/schema";
import { saveCallRubric } from "@/lib/dal/rubrics";
import { addMember, asSessionUser, createBoardWithCast, createUser, unique } from "../support/factories";

export const PERIOD_BLOCK = "0b6f3c1e-52a4-4c5e-9a11-6f1d2b7e8a01";
export const HOHMANN_BLOCK = "0b6f3c1e-52a4-4c5e-9a11-6f1d2b7e8a02";

/** Block ids are UUIDs (the dossier sanitizer replaces anything else). */
export const dossierDocument = (tag: string, blocks = { period: PERIOD_BLOCK, hohmann: HOHMANN_BLOCK }) => ({
  type: "doc",
  content: [
    { type: "heading", attrs: { level: 2 }, content: [{ type: "text", text: "Mission orbit" }] },
    {
      type: "paragraph",
      content: [
        { type: "text", text: `The ${tag} spacecraft operates in a circular orbit at 550 km altitude. ` },
        { type: "text", text: "The orbital period is 95.6 minutes", marks: [{ type: "bold" }] },
        { type: "text", text: " and the station-keeping budget is 18 m/s per year." },
      ],
    },
    {
      type: "orbitCheck",
      attrs: {
        blockId: blocks.period,
        label: "Operational orbit period",
        claim: { kind: "orbit", body: "earth", given: { altitude: 550 }, claimed: { period: 5736 } },
      },
    },
    { type: "heading", attrs: { level: 2 }, content: [{ type: "text", text: "Transfer" }] },
    { type: "paragraph", content: [{ type: "text", text: "A Hohmann transfer raises the orbit from 300 km to 550 km with a total of 141 m/s." }] },
    {
      type: "orbitCheck",
      attrs: {
        blockId: blocks.hohmann,
        label: "Raising transfer",
        claim: { kind: "hohmann", body: "earth", given: { initialAltitude: 300, finalAltitude: 550 }, claimed: { deltaVTotal: 0.2 } },
      },
    },
  ],
});

export const rubricInput = {
  name: "Mission review rubric",
  criteria: [
    {
      id: "science",
      title: "Science return",
      description: "Value of the data to the programme.",
      weight: 50,
      scaleMin: 1,
      scaleMax: 5,
      levels: ["Negligible", "Limited", "Useful", "Significant", "Outstanding"],
      commentRequiredBelow: 3,
    },
    {
      id: "feasibility",
      title: "Technical feasibility",
      description: "Orbit, Δv budget and margins hold up.",
      weight: 30,
      scaleMin: 1,
      scaleMax: 5,
      levels: ["Not credible", "Doubtful", "Plausible", "Sound", "Proven"],
      commentRequiredBelow: null,
    },
    {
      id: "cost",
      title: "Cost realism",
      description: "",
      weight: 20,
      scaleMin: 1,
      scaleMax: 5,
      levels: ["Unrealistic", "Optimistic", "Fair", "Realistic", "Conservative"],
      commentRequiredBelow: null,
    },
  ],
};

export async function createProposalWithVersion(options: {
  boardId: string;
  callId: string;
  ownerId: string;
  title?: string;
  status?: "submitted" | "in_review" | "draft";
}) {
  const title = options.title ?? unique("Proposal");
  const [proposal] = await db()
    .insert(proposals)
    .values({
      boardId: options.boardId,
      callId: options.callId,
      ownerId: options.ownerId,
      title,
      missionType: "earth observation",
      status: options.status ?? "submitted",
      latestVersion: 1,
    })
    .returning();
  const [version] = await db()
    .insert(proposalVersions)
    .values({
      proposalId: proposal!.id,
      boardId: options.boardId,
      number: 1,
      title,
      document: dossierDocument(title),
      documentKey: `test/${proposal!.id}/1.json`,
      htmlKey: `test/${proposal!.id}/1.html`,
    })
    .returning();
  const [consistent, inconsistent] = await db()
    .insert(checkResults)
    .values([
      {
        versionId: version!.id,
        boardId: options.boardId,
        blockId: PERIOD_BLOCK,
        label: "Operational orbit period",
        kind: "orbit",
        status: "consistent",
        claim: { kind: "orbit" },
        result: {
          status: "consistent",
          checks: [{ quantity: "period", claimed: 5736, computed: 5739.5, unit: "s", relativeError: 0.0006, ok: true }],
          messages: [],
        },
      },
      {
        versionId: version!.id,
        boardId: options.boardId,
        blockId: HOHMANN_BLOCK,
        label: "Raising transfer",
        kind: "hohmann",
        status: "inconsistent",
        claim: { kind: "hohmann" },
        result: {
          status: "inconsistent",
          checks: [{ quantity: "deltaVTotal", claimed: 0.2, computed: 0.1433, unit: "km/s", relativeError: 0.396, ok: false }],
          messages: [],
        },
      },
    ])
    .returning();
  return { proposal: proposal!, version: version!, checks: { consistent: consistent!, inconsistent: inconsistent! } };
}

/** A board cast, a call with the rubric above, one submitted proposal and two extra reviewers at other domains. */
export async function createReviewRound(options: { hideProposerNames?: boolean; shareItems?: boolean; rubric?: boolean } = {}) {
  const cast = await createBoardWithCast();
  if (options.hideProposerNames !== undefined || options.shareItems !== undefined) {
    const { eq } = await import("drizzle-orm");
    await db()
      .update(boards)
      .set({ hideProposerNames: options.hideProposerNames ?? false, shareReviewItemsAfterSubmit: options.shareItems ?? true })
      .where(eq(boards.id, cast.board.id));
  }
  const [call] = await db()
    .insert(calls)
    .values({
      boardId: cast.board.id,
      title: unique("Call for small missions"),
      opensAt: new Date(Date.now() - 86_400_000),
      closesAt: new Date(Date.now() + 30 * 86_400_000),
      reviewersPerProposal: 2,
    })
    .returning();
  if (options.rubric !== false) await saveCallRubric(asSessionUser(cast.chair), cast.board.id, call!.id, rubricInput);
  const { proposal, version, checks } = await createProposalWithVersion({ boardId: cast.board.id, callId: call!.id, ownerId: cast.proposer.id });
  const reviewer2 = await createUser({ name: unique("Second reviewer"), email: `${unique("r2")}@meridian.example.net` });
  const reviewer3 = await createUser({ name: unique("Third reviewer"), email: `${unique("r3")}@aldebaran.example.com` });
  await addMember(cast.board.id, reviewer2.id, "reviewer");
  await addMember(cast.board.id, reviewer3.id, "reviewer");
  return { ...cast, call: call!, proposal, version, checks, reviewer2, reviewer3 };
}

export async function addCoauthor(proposalId: string, userId: string) {
  await db().insert(proposalCoauthors).values({ proposalId, userId });
}

export const inFuture = (days = 14) => new Date(Date.now() + days * 86_400_000);
