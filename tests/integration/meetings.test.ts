// Calibrated scores and the panel meeting over HTTP against the real app and PostgreSQL:
// the chair's calibration matches the library on the stored totals, meeting actions by anyone
// but the chair get 403 and save nothing, a consensus score off the rubric's scale gets 422,
// a conflicted member steps out and receives nothing of that proposal, and the live stream
// (server-sent events) delivers the chair's move to a reviewer.
import { createRequire } from "node:module";
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { auditEvents, callRankings, panelMeetingRecords, panelMeetings } from "@/db/schema";
import type { MeetingView } from "@/lib/dal/meetings";
import { calibrateScores } from "@/lib/review/calibration";
import { appUrl } from "../support/app";
import { signedIn, type HttpClient } from "../support/http";
import { baseUrl } from "../support/http";
import { meetingScenario } from "./meeting-fixtures";

const pdfParse = createRequire(import.meta.url)("pdf-parse/lib/pdf-parse.js") as (data: Buffer) => Promise<{ text: string }>;

/** Reads server-sent events from a response body until `until` accepts one (or the stream ends). */
async function readEvents(response: Response, until: (view: MeetingView) => boolean): Promise<MeetingView[]> {
  const reader = response.body!.getReader();
  const decoder = new TextDecoder();
  const seen: MeetingView[] = [];
  let buffer = "";
  for (;;) {
    const { done, value } = await reader.read();
    if (done) return seen;
    buffer += decoder.decode(value, { stream: true });
    let cut: number;
    while ((cut = buffer.indexOf("\n\n")) >= 0) {
      const frame = buffer.slice(0, cut);
      buffer = buffer.slice(cut + 2);
      const event = /^event: (.*)$/m.exec(frame)?.[1];
      const data = /^data: (.*)$/m.exec(frame)?.[1];
      if (event === "meeting" && data) {
        const view = JSON.parse(data) as MeetingView;
        seen.push(view);
        if (until(view)) {
          await reader.cancel();
          return seen;
        }
      }
    }
  }
}

describe("calibrated scores and the panel meeting over HTTP", () => {
  let s: Awaited<ReturnType<typeof meetingScenario>>;
  let chair: HttpClient;
  let reviewer: HttpClient;
  let conflicted: HttpClient;
  let proposer: HttpClient;
  let callPath: string;

  beforeAll(async () => {
    await appUrl();
    s = await meetingScenario();
    callPath = `/api/v1/boards/${s.board.id}/calls/${s.call.id}`;
    [chair, reviewer, conflicted, proposer] = await Promise.all([
      signedIn(s.chair.email),
      signedIn(s.reviewer.email),
      signedIn(s.reviewer3.email),
      signedIn(s.proposer.email),
    ]);
  });

  it("the chair's calibration is the library's on the stored totals; reviewers and proposers get 403; the rank-by choice is saved", async () => {
    const response = await chair.get(`${callPath}/calibration`);
    expect(response.status).toBe(200);
    const body = await response.json();
    const expected = calibrateScores(s.scores.map(([p, r, total]) => ({ proposalId: p.proposal.id, reviewerId: r.id, score: total })));
    for (const p of expected.proposals) {
      const got = body.proposals.find((x: { proposalId: string }) => x.proposalId === p.proposalId);
      expect(got.rawMean).toBeCloseTo(p.rawMean, 9);
      expect(got.calibratedMean).toBeCloseTo(p.calibratedMean, 9);
      expect(got.calibratedRank).toBe(p.calibratedRank);
    }
    expect(body.lambda).toBe(2);
    // Reviewer 1's 1.0 on P3 against two 3.5s (spread floored at 0.5) is 5 deviations below.
    expect(body.outliers).toEqual([expect.objectContaining({ proposalId: s.p3.id, reviewerId: s.reviewer.id, score: 1, deviations: -5 })]);
    expect(body.rankBy).toBe("raw");

    expect((await reviewer.get(`${callPath}/calibration`)).status).toBe(403);
    expect((await proposer.get(`${callPath}/calibration`)).status).toBe(403);
    const refused = await reviewer.request(`${callPath}/rank-by`, { method: "PUT", json: { rankBy: "calibrated" } });
    expect(refused.status).toBe(403);
    expect(await db().select().from(callRankings).where(eq(callRankings.callId, s.call.id))).toEqual([]);
    const bad = await chair.request(`${callPath}/rank-by`, { method: "PUT", json: { rankBy: "loudest" } });
    expect(bad.status).toBe(422);
    expect((await bad.json()).error).toMatch(/raw or calibrated/);
    const ok = await chair.request(`${callPath}/rank-by`, { method: "PUT", json: { rankBy: "calibrated" } });
    expect(ok.status).toBe(200);
    expect((await (await chair.get(`${callPath}/calibration`)).json()).rankBy).toBe("calibrated");
  });

  it("meeting actions by anyone but the chair get 403 and save nothing; a score off the scale gets 422 and saves nothing", async () => {
    const order = [s.p1.id, s.p2.id, s.p3.id];
    // Before the chair starts: a reviewer cannot start it.
    const early = await reviewer.post(`${callPath}/meeting`, { order });
    expect(early.status).toBe(403);
    expect((await early.json()).error).toMatch(/permission/);
    expect(await db().select().from(panelMeetings).where(eq(panelMeetings.callId, s.call.id))).toEqual([]);
    // A proposer is not on the panel at all.
    expect((await proposer.get(`${callPath}/meeting`)).status).toBe(403);

    const started = await chair.post(`${callPath}/meeting`, { order });
    expect(started.status).toBe(200);
    const view = (await started.json()) as MeetingView;
    expect(view.status).toBe("running");
    expect(view.current?.proposalId).toBe(s.p1.id);
    const [before] = await db().select().from(panelMeetings).where(eq(panelMeetings.callId, s.call.id));

    const attempts = [
      reviewer.request(`${callPath}/meeting/current`, { method: "PUT", json: { proposalId: s.p2.id } }),
      reviewer.request(`${callPath}/meeting/records/${s.p1.id}`, { method: "PUT", json: { consensusScore: 4, recommendation: "recommend", notes: "" } }),
      reviewer.post(`${callPath}/meeting`, { order: [s.p3.id] }),
      reviewer.post(`${callPath}/meeting/close`),
      proposer.request(`${callPath}/meeting/current`, { method: "PUT", json: { proposalId: s.p2.id } }),
    ];
    for (const response of await Promise.all(attempts)) {
      expect(response.status).toBe(403);
      expect(typeof (await response.json()).error).toBe("string");
    }
    const [after] = await db().select().from(panelMeetings).where(eq(panelMeetings.callId, s.call.id));
    expect(after).toEqual(before);
    expect(await db().select().from(panelMeetingRecords).where(eq(panelMeetingRecords.meetingId, before!.id))).toEqual([]);

    // Consensus scores: the rubric's scale is 1..5.
    const record = (consensusScore: unknown, recommendation: unknown = "recommend") =>
      chair.request(`${callPath}/meeting/records/${s.p1.id}`, { method: "PUT", json: { consensusScore, recommendation, notes: "Margins agreed." } });
    for (const [score, message] of [
      [5.5, /within the rubric's scale, 1 to 5/],
      [0, /within the rubric's scale, 1 to 5/],
      [3.333, /at most two decimals/],
      ["4", /must be a number/],
    ] as const) {
      const refusedScore = await record(score);
      expect(refusedScore.status, String(score)).toBe(422);
      expect((await refusedScore.json()).error).toMatch(message);
    }
    const wrongWord = await record(4, "ship it");
    expect(wrongWord.status).toBe(422);
    expect((await wrongWord.json()).error).toMatch(/Choose a recommendation/);
    expect(await db().select().from(panelMeetingRecords).where(eq(panelMeetingRecords.meetingId, before!.id))).toEqual([]);

    const saved = await record(4.25);
    expect(saved.status).toBe(200);
    const savedView = (await saved.json()) as MeetingView;
    expect(savedView.current?.record).toMatchObject({ consensusScore: 4.25, recommendation: "recommend", notes: "Margins agreed." });
    const audit = await db()
      .select({ action: auditEvents.action })
      .from(auditEvents)
      .where(and(eq(auditEvents.boardId, s.board.id), eq(auditEvents.action, "meeting.record")));
    expect(audit).toHaveLength(1);
  });

  it("a conflicted member steps out: no title, scores or record of that proposal on their view or stream", async () => {
    const move = await chair.request(`${callPath}/meeting/current`, { method: "PUT", json: { proposalId: s.p1.id } });
    expect(move.status).toBe(200);
    const asChair = (await move.json()) as MeetingView;
    expect(asChair.panel.find((p) => p.userId === s.reviewer3.id)).toMatchObject({ steppingOut: true });
    expect(asChair.current?.title).toBe(s.p1.title);

    const view = (await (await conflicted.get(`${callPath}/meeting`)).json()) as MeetingView;
    expect(view.me.steppingOut).toBe(true);
    expect(view.current).toMatchObject({ proposalId: s.p1.id, steppedOut: true, title: null, scores: null, record: null, openItems: [] });
    expect(view.agenda.find((a) => a.proposalId === s.p1.id)?.title).toBeNull();
    const stream = await conflicted.get(`${callPath}/meeting/events?once=1`);
    expect(stream.headers.get("content-type")).toMatch(/^text\/event-stream/);
    const text = await stream.text();
    expect(text).toMatch(/^event: meeting$/m);
    expect(text).not.toContain(s.p1.title);
    expect(text).not.toContain("Margins agreed.");
    // Another reviewer sees the proposal and the scores, labelled without names.
    const other = (await (await reviewer.get(`${callPath}/meeting`)).json()) as MeetingView;
    expect(other.current?.title).toBe(s.p1.title);
    expect(other.current?.scores?.reviews).toEqual([{ label: "Reviewer 1", total: 4.5, outlier: false, deviations: null }]);
    expect((await reviewer.get(`${callPath}/meeting/events?once=yes`)).status).toBe(400);
  });

  it("the live stream delivers the chair's move to a reviewer, and presence to the chair", async () => {
    const stream = await fetch(`${baseUrl()}${callPath}/meeting/events`, { headers: { cookie: reviewer.cookieHeader() } });
    expect(stream.status).toBe(200);
    const move = chair.request(`${callPath}/meeting/current`, { method: "PUT", json: { proposalId: s.p3.id } });
    const events = await readEvents(stream, (v) => v.current?.proposalId === s.p3.id);
    expect((await move).status).toBe(200);
    const last = events.at(-1)!;
    expect(last.current?.title).toBe(s.p3.title);
    expect(last.current?.scores?.reviews.find((r) => r.outlier)).toMatchObject({ total: 1, deviations: -5 });

    const chairStream = await fetch(`${baseUrl()}${callPath}/meeting/events`, { headers: { cookie: chair.cookieHeader() } });
    const present = reviewer.request(`${callPath}/meeting/attendance`, { method: "PUT", json: { present: true } });
    const seen = await readEvents(chairStream, (v) => v.panel.some((p) => p.userId === s.reviewer.id && p.present));
    expect((await present).status).toBe(200);
    expect(seen.at(-1)!.panel.find((p) => p.userId === s.reviewer.id)?.present).toBe(true);
  });

  it("the minutes PDF has its sections; after closing, meeting actions get 409", async () => {
    expect((await reviewer.get(`${callPath}/meeting/minutes`)).status).toBe(403);
    const closed = await chair.post(`${callPath}/meeting/close`);
    expect(closed.status).toBe(200);
    expect(((await closed.json()) as MeetingView).status).toBe("closed");
    const again = await chair.request(`${callPath}/meeting/current`, { method: "PUT", json: { proposalId: s.p1.id } });
    expect(again.status).toBe(409);
    expect((await again.json()).error).toMatch(/closed/);

    const response = await chair.get(`${callPath}/meeting/minutes`);
    expect(response.status).toBe(200);
    expect(response.headers.get("content-type")).toBe("application/pdf");
    const { text } = await pdfParse(Buffer.from(await response.arrayBuffer()));
    for (const section of ["Minutes of the panel meeting", "Attendance", "Proposals discussed", "Consensus score", "Recommendation", "Stepped out (conflict)"])
      expect(text).toContain(section);
    expect(text).toContain(s.p1.title);
    expect(text).toContain("4.25");
    expect(text).toContain("Margins agreed.");
    expect(text).toContain(s.reviewer3.name);
    expect(text).toMatch(/two-body/i);
  });
});
