// Dossiers against the real database and object store, through the data-access layer:
// calls, drafts with optimistic concurrency, submission snapshots and server recompute.
import { describe, expect, it } from "vitest";
import { and, desc, eq, sql } from "drizzle-orm";
import { db, pool } from "@/db/client";
import { checkResults, decisions, outboxMessages, proposalDrafts, proposals, proposalVersions } from "@/db/schema";
import { createCall, listCalls, updateCall } from "@/lib/dal/calls";
import {
  createProposal,
  getDraft,
  getVersion,
  getVersionHtml,
  listProposals,
  listVersions,
  proposalListStatement,
  saveDraft,
  startRevisionDraft,
  submitProposal,
  versionObjectKey,
} from "@/lib/dal/proposals";
import { AppError } from "@/lib/errors";
import { callInputSchema, proposalListQuerySchema } from "@/lib/validation/dossier";
import { readObject, statObjectOrNull } from "@/storage/object-store";
import { errorOf } from "../support/errors";
import { addMember, asSessionUser, createBoardWithCast, createUser } from "../support/factories";
import { dossierDoc, makeCall, makeProposal, orbitBlock } from "./matrix/dossiers";

interface PlanNode {
  "Node Type": string;
  "Relation Name"?: string;
  "Index Name"?: string;
  Plans?: PlanNode[];
}
const planNodes = (node: PlanNode): PlanNode[] => [node, ...(node.Plans ?? []).flatMap(planNodes)];

async function statusOf(promise: Promise<unknown>): Promise<number | "ok"> {
  try {
    await promise;
    return "ok";
  } catch (error) {
    if (error instanceof AppError) return error.status;
    throw error;
  }
}

// A 500 km circular earth orbit: period 5677 s (engine value with its earth constants; a
// 1 % error is far outside the default tolerance, which is what the inconsistent block uses).
const consistentOrbit = () => orbitBlock("the parking orbit", { kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: 5677 } });
const inconsistentOrbit = () => orbitBlock("the science orbit", { kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: 6100 } });

describe("calls", () => {
  it("lets chairs create and edit calls, members list them, and keeps others out", async () => {
    const cast = await createBoardWithCast();
    const chair = asSessionUser(cast.chair);
    const input = callInputSchema.parse({
      title: "Cubesat round",
      opensAt: new Date(Date.now() - 86400_000).toISOString(),
      closesAt: new Date(Date.now() + 86400_000).toISOString(),
      requiredSections: ["Mission design", "Mission design", "Propulsion"],
      tolerance: { relative: 0.02, absolute: { km: 2 } },
    });
    const call = await createCall(chair, cast.board.id, input);
    expect(call.state).toBe("open");
    expect(call.requiredSections).toEqual(["Mission design", "Propulsion"]);
    expect(await statusOf(createCall(asSessionUser(cast.proposer), cast.board.id, input))).toBe(403);
    expect(await statusOf(createCall(asSessionUser(cast.outsider), cast.board.id, input))).toBe(404);
    expect((await listCalls(asSessionUser(cast.reviewer), cast.board.id)).map((c) => c.id)).toContain(call.id);
    expect(await statusOf(listCalls(asSessionUser(cast.outsider), cast.board.id))).toBe(404);
    const closed = await updateCall(chair, cast.board.id, call.id, { ...input, closesAt: new Date(Date.now() - 1000) });
    expect(closed.state).toBe("closed");
    expect(callInputSchema.safeParse({ ...input, closesAt: input.opensAt }).success).toBe(false);
  });
});

describe("proposals and drafts", () => {
  it("creates a proposal with co-authors and a draft seeded with the required sections", async () => {
    const cast = await createBoardWithCast();
    const coauthor = await createUser({ name: "Second Author" });
    await addMember(cast.board.id, coauthor.id, "proposer");
    const call = await makeCall(cast, { requiredSections: ["Mission design", "Propulsion"] });
    const proposer = asSessionUser(cast.proposer);
    expect(
      await statusOf(createProposal(proposer, cast.board.id, { title: "Bad co", missionType: "", callId: call.id, coauthorIds: [cast.reviewer.id] })),
    ).toBe(422);
    const proposal = await createProposal(proposer, cast.board.id, {
      title: "Aurora mapper",
      missionType: "science",
      callId: call.id,
      coauthorIds: [coauthor.id],
    });
    const draft = await getDraft(asSessionUser(coauthor), cast.board.id, proposal.id);
    expect(draft.revision).toBe(1);
    expect(JSON.stringify(draft.document)).toContain("Propulsion");
    // Reviewers (unassigned) and outsiders do not see it; chairs cannot edit the draft.
    expect(await statusOf(getDraft(asSessionUser(cast.reviewer), cast.board.id, proposal.id))).toBe(404);
    expect(await statusOf(getDraft(asSessionUser(cast.outsider), cast.board.id, proposal.id))).toBe(404);
    expect(await statusOf(getDraft(asSessionUser(cast.chair), cast.board.id, proposal.id))).toBe(404);
    // Reviewers cannot create proposals.
    expect(
      await statusOf(createProposal(asSessionUser(cast.reviewer), cast.board.id, { title: "Nope", missionType: "", callId: call.id, coauthorIds: [] })),
    ).toBe(403);
  });

  it("pages, sorts and filters the proposer's list on the server", async () => {
    const cast = await createBoardWithCast();
    const call = await makeCall(cast);
    const proposer = asSessionUser(cast.proposer);
    for (const title of ["Charlie relay", "Alpha sounder", "Bravo imager"])
      await createProposal(proposer, cast.board.id, { title, missionType: "science", callId: call.id, coauthorIds: [] });
    const page1 = await listProposals(proposer, cast.board.id, proposalListQuerySchema.parse({ sort: "title", dir: "asc", pageSize: "2" }));
    expect(page1.hasMore).toBe(true);
    expect(page1).not.toHaveProperty("total");
    expect(page1.rows.map((r) => r.title)).toEqual(["Alpha sounder", "Bravo imager"]);
    const page2 = await listProposals(proposer, cast.board.id, proposalListQuerySchema.parse({ sort: "title", dir: "asc", pageSize: "2", page: "2" }));
    expect(page2.rows.map((r) => r.title)).toEqual(["Charlie relay"]);
    expect(page2.hasMore).toBe(false);
    expect(page2.nextCursor).toBeNull();
    // The keyset cursor gives the same next page as the offset.
    const byCursor = await listProposals(
      proposer,
      cast.board.id,
      proposalListQuerySchema.parse({ sort: "title", dir: "asc", pageSize: "2", cursor: page1.nextCursor }),
    );
    expect(byCursor.rows.map((r) => r.title)).toEqual(["Charlie relay"]);
    expect(byCursor.hasMore).toBe(false);
    // A cursor made for another sort, or not made by the list, is a 400 that says what to do.
    expect(await statusOf(listProposals(proposer, cast.board.id, proposalListQuerySchema.parse({ sort: "updatedAt", cursor: page1.nextCursor })))).toBe(400);
    expect(await statusOf(listProposals(proposer, cast.board.id, proposalListQuerySchema.parse({ cursor: "bm90IGEgY3Vyc29y" })))).toBe(400);
    const filtered = await listProposals(proposer, cast.board.id, proposalListQuerySchema.parse({ q: "imag" }));
    expect(filtered.rows.map((r) => r.title)).toEqual(["Bravo imager"]);
    // Another proposer sees none of them.
    const other = await createUser();
    await addMember(cast.board.id, other.id, "proposer");
    const none = await listProposals(asSessionUser(other), cast.board.id, proposalListQuerySchema.parse({}));
    expect(none.rows).toEqual([]);
    expect(none.hasMore).toBe(false);
    expect((await listProposals(asSessionUser(cast.chair), cast.board.id, proposalListQuerySchema.parse({}))).rows).toHaveLength(3);
  });

  it("walks every page by keyset in the default sort (newest change first), timestamps to the microsecond", async () => {
    const cast = await createBoardWithCast();
    const call = await makeCall(cast);
    const chair = asSessionUser(cast.chair);
    // Rows that share one updated_at (to the microsecond) differ only by the id tie-break.
    await db().execute(sql`
      insert into proposals (board_id, call_id, owner_id, title, updated_at)
      select ${cast.board.id}, ${call.id}, ${cast.proposer.id}, 'Keyset ' || g, timestamptz '2026-03-01 10:00:00.123456+00' + (g / 3) * interval '1 microsecond'
      from generate_series(1, 25) g`);
    const expected = await db()
      .select({ id: proposals.id })
      .from(proposals)
      .where(eq(proposals.boardId, cast.board.id))
      .orderBy(desc(proposals.updatedAt), desc(proposals.id));
    const seen: string[] = [];
    let cursor: string | undefined;
    for (let i = 0; i < 10; i += 1) {
      const page = await listProposals(chair, cast.board.id, proposalListQuerySchema.parse({ pageSize: "7", cursor }));
      seen.push(...page.rows.map((r) => r.id));
      if (!page.hasMore) break;
      cursor = page.nextCursor!;
    }
    expect(seen).toEqual(expected.map((r) => r.id));
  });

  it("walks back by keyset too (the UI's Previous): each prevCursor gives exactly the page before, in order", async () => {
    const cast = await createBoardWithCast();
    const call = await makeCall(cast);
    const chair = asSessionUser(cast.chair);
    await db().execute(sql`
      insert into proposals (board_id, call_id, owner_id, title)
      select ${cast.board.id}, ${call.id}, ${cast.proposer.id}, 'Backward ' || lpad(g::text, 2, '0') from generate_series(1, 17) g`);
    const query = (cursor?: string) => proposalListQuerySchema.parse({ sort: "title", dir: "desc", pageSize: "5", cursor });
    const forward = [await listProposals(chair, cast.board.id, query())];
    expect(forward[0]!.prevCursor).toBeNull();
    while (forward.at(-1)!.nextCursor) forward.push(await listProposals(chair, cast.board.id, query(forward.at(-1)!.nextCursor!)));
    expect(forward.map((p) => p.rows.length)).toEqual([5, 5, 5, 2]);
    // From the last page back to the first, each answer equals the page seen going forward.
    let current = forward.at(-1)!;
    for (let i = forward.length - 2; i >= 0; i -= 1) {
      current = await listProposals(chair, cast.board.id, query(current.prevCursor!));
      expect(current.rows.map((r) => r.title)).toEqual(forward[i]!.rows.map((r) => r.title));
      expect(current.hasMore).toBe(true);
      expect(current.nextCursor).not.toBeNull();
    }
    expect(current.prevCursor).toBeNull();
    expect(current.rows.map((r) => r.title)).toEqual(["Backward 17", "Backward 16", "Backward 15", "Backward 14", "Backward 13"]);
  });

  it("serves first pages from the sort's index, not a scan and sort: default sort with and without a cursor, every proposals-column sort both ways (EXPLAIN)", async () => {
    const cast = await createBoardWithCast();
    const call = await makeCall(cast);
    await db().execute(sql`
      insert into proposals (board_id, call_id, owner_id, title, updated_at, created_at)
      select ${cast.board.id}, ${call.id}, ${cast.proposer.id}, 'Plan ' || g, now() - g * interval '1 minute', now() - g * interval '1 minute'
      from generate_series(1, 4000) g`);
    await db().execute(sql`analyze proposals`);
    const chair = asSessionUser(cast.chair);
    const plans: PlanNode[] = [];
    for (const input of [{}, { cursor: (await listProposals(chair, cast.board.id, proposalListQuerySchema.parse({}))).nextCursor }]) {
      const built = proposalListStatement(chair, cast.board.id, "chair", proposalListQuerySchema.parse(input)).toSQL();
      const { rows } = await pool().query(`explain (format json) ${built.sql}`, built.params);
      plans.push((rows[0]["QUERY PLAN"] as { Plan: PlanNode }[])[0]!.Plan);
    }
    for (const plan of plans) {
      const nodes = planNodes(plan);
      expect(nodes.some((n) => n["Index Name"] === "proposals_board_updated_idx")).toBe(true);
      expect(nodes.filter((n) => n["Node Type"] === "Seq Scan" && n["Relation Name"] === "proposals")).toEqual([]);
      expect(nodes.filter((n) => n["Node Type"] === "Sort")).toEqual([]);
    }
    // Every other sort on a proposals column, both directions, reads its own (board, column, id) index.
    const indexFor = {
      title: "proposals_board_title_idx",
      createdAt: "proposals_board_created_idx",
      status: "proposals_board_status_idx",
      latestVersion: "proposals_board_version_idx",
    };
    for (const [sort, index] of Object.entries(indexFor))
      for (const dir of ["asc", "desc"]) {
        const built = proposalListStatement(chair, cast.board.id, "chair", proposalListQuerySchema.parse({ sort, dir })).toSQL();
        const { rows } = await pool().query(`explain (format json) ${built.sql}`, built.params);
        const nodes = planNodes((rows[0]["QUERY PLAN"] as { Plan: PlanNode }[])[0]!.Plan);
        expect({ sort, dir, index: nodes.some((n) => n["Index Name"] === index), sorted: nodes.some((n) => n["Node Type"] === "Sort") }).toEqual({
          sort,
          dir,
          index: true,
          sorted: false,
        });
      }
  });

  it("refuses a stale autosave with 409 and keeps the stored draft", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const first = await saveDraft(proposer, cast.board.id, proposal.id, {
      revision: 1,
      document: dossierDoc([{ type: "paragraph", content: [{ type: "text", text: "first tab" }] }]),
    });
    expect(first.revision).toBe(2);
    const stale = await errorOf(
      saveDraft(proposer, cast.board.id, proposal.id, {
        revision: 1,
        document: dossierDoc([{ type: "paragraph", content: [{ type: "text", text: "second tab" }] }]),
      }),
    );
    expect(stale.status).toBe(409);
    expect(stale.message).toMatch(/reload the latest and reapply/i);
    expect(stale.details).toMatchObject({ currentRevision: 2, yourRevision: 1 });
    const stored = await getDraft(proposer, cast.board.id, proposal.id);
    expect(JSON.stringify(stored.document)).toContain("first tab");
    expect(JSON.stringify(stored.document)).not.toContain("second tab");
  });

  it("sanitizes saved drafts and rejects what is not a document", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    expect(await statusOf(saveDraft(proposer, cast.board.id, proposal.id, { revision: 1, document: { type: "paragraph" } }))).toBe(422);
    const saved = await saveDraft(proposer, cast.board.id, proposal.id, {
      revision: 1,
      document: dossierDoc([
        { type: "rawHtml", attrs: { html: "<script>alert(1)</script>" } },
        {
          type: "paragraph",
          attrs: { onclick: "steal()" },
          content: [{ type: "text", text: "<b>plain</b>", marks: [{ type: "link", attrs: { href: "javascript:alert(1)" } }] }],
        },
        { type: "image", attrs: { src: "https://tracker.example.com/pixel.png" } },
      ]),
    });
    expect(saved.dropped).toEqual(expect.arrayContaining(["node rawHtml", "attr paragraph.onclick", "node image without src"]));
    const text = JSON.stringify((await getDraft(proposer, cast.board.id, proposal.id)).document);
    expect(text).not.toContain("rawHtml");
    expect(text).not.toContain("javascript:");
    expect(text).not.toContain("onclick");
    expect(text).toContain("<b>plain</b>");
  });
});

describe("submission", () => {
  it("lists what to fix: missing required sections and claims that cannot be evaluated", async () => {
    const { cast, proposal } = await makeProposal({ requiredSections: ["Mission design", "Propulsion"] });
    const proposer = asSessionUser(cast.proposer);
    await saveDraft(proposer, cast.board.id, proposal.id, {
      revision: 1,
      document: dossierDoc([
        { type: "heading", attrs: { level: 2 }, content: [{ type: "text", text: "Mission design" }] },
        orbitBlock("the broken orbit", { kind: "orbit", body: "earth", given: { periapsisAltitude: -7000, apoapsisAltitude: 500 }, claimed: { period: 5000 } }),
      ]),
    });
    const error = await errorOf(submitProposal(proposer, cast.board.id, proposal.id));
    expect(error.status).toBe(422);
    const problems = (error.details as { problems: { kind: string; message: string }[] }).problems;
    expect(problems.map((p) => p.kind).sort()).toEqual(["invalid-claim", "missing-section"]);
    expect(problems.find((p) => p.kind === "missing-section")!.message).toContain("Propulsion");
    expect(problems.find((p) => p.kind === "invalid-claim")!.message).toContain("the broken orbit");
    const versions = await db().select({ id: proposalVersions.id }).from(proposalVersions).where(eq(proposalVersions.proposalId, proposal.id));
    expect(versions).toHaveLength(0);
    expect(await statObjectOrNull(versionObjectKey(cast.board.id, proposal.id, 1, "document.json"))).toBeNull();
  });

  it("snapshots the version in the store and stores the server's result per claim", async () => {
    const { cast, proposal } = await makeProposal({ requiredSections: ["Mission design"] });
    const proposer = asSessionUser(cast.proposer);
    const good = consistentOrbit();
    const bad = inconsistentOrbit();
    const transfer = orbitBlock(
      "the raise to GEO",
      { kind: "hohmann", body: "earth", given: { finalAltitude: 35786 }, claimed: { deltaVTotal: 3.82 } },
      good.attrs.blockId,
    );
    const document = dossierDoc([
      { type: "heading", attrs: { level: 2 }, content: [{ type: "text", text: "Mission design" }] },
      { type: "paragraph", content: [{ type: "text", text: "We park, then raise. <script>x</script>" }] },
      good,
      bad,
      transfer,
    ]);
    const saved = await saveDraft(proposer, cast.board.id, proposal.id, { revision: 1, document });
    const result = await submitProposal(proposer, cast.board.id, proposal.id, { revision: saved.revision });
    expect(result.number).toBe(1);
    expect(result.counts).toEqual({ consistent: 2, inconsistent: 1, invalid: 0 });
    // The authors' receipt is queued with the version, once.
    const receipts = await db()
      .select({ to: outboxMessages.toAddresses, subject: outboxMessages.subject })
      .from(outboxMessages)
      .where(eq(outboxMessages.dedupeKey, `submission-receipt:${result.versionId}`));
    expect(receipts).toHaveLength(1);
    expect(receipts[0]!.to).toEqual([cast.proposer.email]);

    const rows = await db()
      .select({ blockId: checkResults.blockId, status: checkResults.status, label: checkResults.label, claim: checkResults.claim, result: checkResults.result })
      .from(checkResults)
      .where(eq(checkResults.versionId, result.versionId));
    const byBlock = Object.fromEntries(rows.map((r) => [r.blockId, r]));
    expect(byBlock[good.attrs.blockId]!.status).toBe("consistent");
    expect(byBlock[bad.attrs.blockId]!.status).toBe("inconsistent");
    expect(byBlock[bad.attrs.blockId]!.label).toBe("the science orbit");
    expect((byBlock[bad.attrs.blockId]!.result as { checks: { quantity: string; ok: boolean }[] }).checks).toEqual([
      expect.objectContaining({ quantity: "period", ok: false }),
    ]);
    // The transfer took its initial orbit from the parking orbit: 6378.137 + 500 km (engine's earth radius).
    expect((byBlock[transfer.attrs.blockId]!.claim as { given: Record<string, number> }).given.initialRadius).toBeCloseTo(6878.137, 3);
    expect(byBlock[transfer.attrs.blockId]!.status).toBe("consistent");

    const [version] = await db().select().from(proposalVersions).where(eq(proposalVersions.id, result.versionId));
    expect(version!.documentKey).toBe(`boards/${cast.board.id}/proposals/${proposal.id}/versions/1/document.json`);
    const storedJson = JSON.parse((await readObject(version!.documentKey)).toString("utf8"));
    expect(storedJson).toEqual(version!.document);
    expect(JSON.stringify(storedJson)).toContain("the science orbit");
    const storedHtml = (await readObject(version!.htmlKey)).toString("utf8");
    expect(storedHtml).toContain(`data-block-id="${bad.attrs.blockId}"`);
    expect(storedHtml).toContain('data-status="inconsistent"');
    expect(storedHtml).toContain("&lt;script&gt;x&lt;/script&gt;");
    expect(storedHtml).not.toContain("<script>");

    const [p] = await db().select({ status: proposals.status, latestVersion: proposals.latestVersion }).from(proposals).where(eq(proposals.id, proposal.id));
    expect(p).toEqual({ status: "submitted", latestVersion: 1 });
    // A second submission while under review is a conflict; drafts are frozen too.
    expect(await statusOf(submitProposal(proposer, cast.board.id, proposal.id))).toBe(409);
    expect(await statusOf(saveDraft(proposer, cast.board.id, proposal.id, { revision: saved.revision, document }))).toBe(409);

    // Chairs read versions and their results; the HTML carries the verdicts by block.
    const chair = asSessionUser(cast.chair);
    const detail = await getVersion(chair, cast.board.id, proposal.id, 1);
    expect(detail.checkResults.map((r) => r.blockId)).toEqual([good.attrs.blockId, bad.attrs.blockId, transfer.attrs.blockId]);
    expect(await getVersionHtml(chair, cast.board.id, proposal.id, 1)).toContain(`data-block-id="${transfer.attrs.blockId}"`);
    expect((await listVersions(chair, cast.board.id, proposal.id))[0]!.counts).toEqual({ consistent: 2, inconsistent: 1, invalid: 0 });
    expect(await statusOf(getVersion(asSessionUser(cast.reviewer), cast.board.id, proposal.id, 1))).toBe(404);
  });

  it("refuses a submission after the call closed and leaves nothing behind", async () => {
    const { cast, proposal, call } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    await saveDraft(proposer, cast.board.id, proposal.id, { revision: 1, document: dossierDoc([consistentOrbit()]) });
    await updateCall(
      asSessionUser(cast.chair),
      cast.board.id,
      call.id,
      callInputSchema.parse({ title: call.title, opensAt: new Date(Date.now() - 7200_000), closesAt: new Date(Date.now() - 60_000) }),
    );
    const error = await errorOf(submitProposal(proposer, cast.board.id, proposal.id));
    expect(error.status).toBe(409);
    expect(error.message).toMatch(/closed .* no longer accepts submissions/);
    expect(await db().select({ id: proposalVersions.id }).from(proposalVersions).where(eq(proposalVersions.proposalId, proposal.id))).toHaveLength(0);
    expect(await statObjectOrNull(versionObjectKey(cast.board.id, proposal.id, 1, "document.json"))).toBeNull();
    const [p] = await db().select({ status: proposals.status }).from(proposals).where(eq(proposals.id, proposal.id));
    expect(p!.status).toBe("draft");
  });

  it("deletes the snapshot objects when the transaction fails", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const saved = await saveDraft(proposer, cast.board.id, proposal.id, { revision: 1, document: dossierDoc([consistentOrbit()]) });
    // Occupy version number 1 behind the proposal's back so the insert hits the unique key.
    await db()
      .insert(proposalVersions)
      .values({ proposalId: proposal.id, boardId: cast.board.id, number: 1, title: "ghost", document: {}, documentKey: "ghost", htmlKey: "ghost" });
    await expect(submitProposal(proposer, cast.board.id, proposal.id, { revision: saved.revision })).rejects.toThrow();
    expect(await statObjectOrNull(versionObjectKey(cast.board.id, proposal.id, 1, "document.json"))).toBeNull();
    expect(await statObjectOrNull(versionObjectKey(cast.board.id, proposal.id, 1, "document.html"))).toBeNull();
  });

  it("after a decision to revise, seeds the draft from the decided version and submits version 2", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    await saveDraft(proposer, cast.board.id, proposal.id, {
      revision: 1,
      document: dossierDoc([{ type: "paragraph", content: [{ type: "text", text: "version one text" }] }, consistentOrbit()]),
    });
    const first = await submitProposal(proposer, cast.board.id, proposal.id);
    await db().transaction(async (tx) => {
      await tx
        .insert(decisions)
        .values({ boardId: cast.board.id, proposalId: proposal.id, versionId: first.versionId, outcome: "revise", letter: {}, letterHtml: "", letterText: "" });
      await tx.update(proposals).set({ status: "decided" }).where(eq(proposals.id, proposal.id));
      await startRevisionDraft(proposal.id, tx);
    });
    const draft = await getDraft(proposer, cast.board.id, proposal.id);
    expect(draft.basedOnVersion).toBe(1);
    expect(JSON.stringify(draft.document)).toContain("version one text");
    const saved = await saveDraft(proposer, cast.board.id, proposal.id, {
      revision: draft.revision,
      document: dossierDoc([{ type: "paragraph", content: [{ type: "text", text: "version two text" }] }]),
    });
    const second = await submitProposal(proposer, cast.board.id, proposal.id, { revision: saved.revision });
    expect(second.number).toBe(2);
    const [v1] = await db()
      .select({ document: proposalVersions.document })
      .from(proposalVersions)
      .where(and(eq(proposalVersions.proposalId, proposal.id), eq(proposalVersions.number, 1)));
    expect(JSON.stringify(v1!.document)).toContain("version one text");
    const [d] = await db().select({ basedOnVersion: proposalDrafts.basedOnVersion }).from(proposalDrafts).where(eq(proposalDrafts.proposalId, proposal.id));
    expect(d!.basedOnVersion).toBe(2);
  });
});
