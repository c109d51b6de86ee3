// The review API over HTTP: bad input gets a clear 4xx with a JSON message and nothing is
// saved half-way; the OpenAPI document lists the review operations.
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { assignments, reviewItems, reviews } from "@/db/schema";
import { dossierPlainText } from "@/lib/dossier";
import { makeAnchor } from "@/lib/review/anchors";
import { appUrl } from "../support/app";
import { signedIn } from "../support/http";
import { createDecision } from "@/lib/decisions";
import { DEFAULT_LETTER_TEMPLATE } from "@/lib/decisions/template";
import { asSessionUser } from "../support/factories";
import { decisionScenario } from "./decision-fixtures";
import { createReviewRound, dossierDocument, inFuture, rubricInput } from "./review-fixtures";

describe("review API over HTTP", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("a decided version's review is closed: GET says so and PUT and submit get a 409 saying why", async () => {
    const s = await decisionScenario({ submitted: 1, required: 1 });
    await createDecision(asSessionUser(s.chair), s.board.id, s.proposal.id, { outcome: "accept", letter: DEFAULT_LETTER_TEMPLATE, selectedReviewItemIds: [] });
    const reviewer = await signedIn(s.reviewer2.email);
    const url = `/api/v1/boards/${s.board.id}/reviews/${s.assignments[1]!.id}`;
    const screen = await reviewer.request(url);
    expect(screen.status).toBe(200);
    const body = await screen.json();
    expect(body.canEdit).toBe(false);
    expect(body.closedReason).toMatch(/so this review is closed: nothing more is needed from you/);
    const put = await reviewer.request(url, { method: "PUT", json: { revision: body.review.revision, scores: body.review.scores, summary: "Too late" } });
    expect(put.status).toBe(409);
    expect(await put.json()).toEqual({ error: body.closedReason, details: { closed: true } });
    const submit = await reviewer.post(`${url}/submit`, { revision: body.review.revision });
    expect(submit.status).toBe(409);
    expect((await submit.json()).error).toBe(body.closedReason);
  });

  it("runs a round: rubric, assignment, autosave, stale save, submit, overview CSV", async () => {
    const round = await createReviewRound();
    const chair = await signedIn(round.chair.email);
    const board = `/api/v1/boards/${round.board.id}`;

    const badWeights = await chair.request(`${board}/rubrics/${round.call.id}`, {
      method: "PUT",
      json: { ...rubricInput, criteria: rubricInput.criteria.map((c) => ({ ...c, weight: 40 })) },
    });
    expect(badWeights.status).toBe(422);
    expect((await badWeights.json()).error).toContain("The weights add up to 120 %; they must add up to 100 %.");

    const conflicted = await signedIn(round.reviewer3.email);
    expect((await conflicted.post(`${board}/conflicts`, { proposalId: round.proposal.id, reason: "Shared a grant with the lead author" })).status).toBe(201);
    const refused = await chair.post(`${board}/assignments`, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id, round.reviewer3.id],
      dueAt: inFuture().toISOString(),
    });
    expect(refused.status).toBe(409);
    expect((await refused.json()).error).toMatch(/^Conflicted reviewers cannot be assigned/);
    expect(await db().select().from(assignments).where(eq(assignments.proposalId, round.proposal.id))).toEqual([]);

    const assigned = await chair.post(`${board}/assignments`, {
      proposalIds: [round.proposal.id],
      reviewerIds: [round.reviewer2.id],
      dueAt: inFuture().toISOString(),
    });
    expect(assigned.status).toBe(201);
    const assignmentId = (await assigned.json()).created[0].assignmentId as string;

    const reviewer = await signedIn(round.reviewer2.email);
    const url = `${board}/reviews/${assignmentId}`;
    const outOfScale = await reviewer.request(url, { method: "PUT", json: { revision: 0, scores: { science: { score: 0, comment: "" } }, summary: "" } });
    expect(outOfScale.status).toBe(422);
    expect((await outOfScale.json()).error).toBe('"Science return": 0 is outside the scale 1..5.');
    expect(await db().select().from(reviews).where(eq(reviews.assignmentId, assignmentId))).toEqual([]);

    const first = await reviewer.request(url, { method: "PUT", json: { revision: 0, scores: { science: { score: 4, comment: "" } }, summary: "" } });
    expect(first.status).toBe(200);
    expect((await first.json()).review.revision).toBe(1);
    const stale = await reviewer.request(url, { method: "PUT", json: { revision: 0, scores: { science: { score: 2, comment: "" } }, summary: "" } });
    expect(stale.status).toBe(409);
    expect((await stale.json()).details.review.scores.science.score).toBe(4);

    const early = await reviewer.post(`${url}/submit`, { revision: 1 });
    expect(early.status).toBe(422);
    expect((await early.json()).details.issues.map((i: { path: string }) => i.path)).toEqual(["scores.feasibility.score", "scores.cost.score"]);

    const full = await reviewer.request(url, {
      method: "PUT",
      json: {
        revision: 1,
        scores: { science: { score: 4, comment: "" }, feasibility: { score: 3, comment: "" }, cost: { score: 5, comment: "" } },
        summary: "Sound.",
      },
    });
    const submitted = await reviewer.post(`${url}/submit`, { revision: (await full.json()).review.revision });
    expect(submitted.status).toBe(200);
    const locked = await reviewer.request(url, { method: "PUT", json: { revision: (await submitted.json()).review.revision, scores: {}, summary: "" } });
    expect(locked.status).toBe(409);

    const text = dossierPlainText(dossierDocument(round.proposal.title));
    const outside = await chair.post(`${board}/review-items`, {
      proposalId: round.proposal.id,
      severity: "comment",
      title: "Beyond the end",
      body: "x",
      anchor: { from: text.length + 10, to: text.length + 20, quote: "nothing here", prefix: "", suffix: "" },
    });
    expect(outside.status).toBe(422);
    expect((await outside.json()).error).toContain("lies outside the dossier text");
    const from = text.indexOf("18 m/s");
    const item = await chair.post(`${board}/review-items`, {
      proposalId: round.proposal.id,
      severity: "minor",
      title: "Station keeping",
      body: "Justify 18 m/s.",
      anchor: makeAnchor(text, from, from + 6),
    });
    expect(item.status).toBe(201);
    expect(await db().select().from(reviewItems).where(eq(reviewItems.proposalId, round.proposal.id))).toHaveLength(1);

    const csv = await chair.get(`/api/v1/boards/${round.board.id}/calls/${round.call.id}/overview/csv`);
    expect(csv.status).toBe(200);
    expect(csv.headers.get("content-type")).toContain("text/csv");
    expect(csv.headers.get("content-disposition")).toMatch(/attachment; filename=".*-overview\.csv"/);
    const lines = (await csv.text()).trim().split("\r\n");
    expect(lines).toHaveLength(3);
    // One review of 3.9: mean 3.900, no spread with a single review.
    expect(lines[1]).toContain(",1,1,2,3.900,,0,1,0,1,0");
    // The orbit-check contract's notice closes the export (contract version 2, "Other additions").
    expect(lines[2]).toMatch(/^"Notice: .*screening.*flight/i);
  });

  it("answers malformed ids and bodies with 4xx, never 500", async () => {
    const round = await createReviewRound();
    const chair = await signedIn(round.chair.email);
    const board = `/api/v1/boards/${round.board.id}`;
    expect((await chair.get(`${board}/reviews/not-a-uuid`)).status).toBe(404);
    expect((await chair.get(`${board}/assignments`)).status).toBe(400);
    expect((await chair.get(`${board}/review-items?proposalId=nope`)).status).toBe(400);
    expect(
      (await chair.request(`${board}/rubrics/${round.call.id}`, { method: "PUT", body: "{not json", headers: { "content-type": "application/json" } })).status,
    ).toBe(400);
    expect((await chair.post(`${board}/conflicts`, { reason: "no target" })).status).toBe(422);
    const doc = await (await chair.get("/api/v1/openapi.json")).json();
    expect(Object.keys(doc.paths)).toEqual(
      expect.arrayContaining(["/api/v1/boards/{boardId}/reviews/{assignmentId}", "/api/v1/boards/{boardId}/calls/{callId}/overview/csv"]),
    );
  });
});
