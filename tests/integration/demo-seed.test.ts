import { and, eq, inArray } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import {
  attachments,
  boardMembers,
  boards,
  callRequirements,
  calls,
  checkResults,
  conflicts,
  decisions,
  outboxMessages,
  proposals,
  proposalVersions,
  responseWindows,
  reviewItemAnswers,
  reviewItemDispositions,
  reviewItems,
  reviews,
  users,
} from "@/db/schema";
import { verifyPassword } from "@/lib/auth/passwords";
import { listInvitations } from "@/lib/dal/invitations";
import { getAssignmentBoard } from "@/lib/dal/assignments";
import { listStations } from "@/lib/dal/stations";
import { dossierPlainText } from "@/lib/dossier";
import { DEMO_ACCOUNTS, seedDemoAccounts } from "@/db/seed/accounts";
import { assertDemoMode, seedDemo } from "@/db/seed/index";
import { DEMO_CAST_PASSWORD, DEMO_PEOPLE } from "@/db/seed/people";
import { DECIDED_CALL_TITLE, OPEN_CALL_TITLE } from "@/db/seed/scenario";
import { statObjectOrNull } from "@/storage/object-store";
import { unique } from "../support/factories";

const freshBoard = () => {
  const slug = unique("kestrel-demo-test");
  return { slug, name: `Kestrel demo (${slug})`, description: "The demo scenario, seeded by a test into its own board." };
};

describe("demo accounts seed", () => {
  it("refuses to run outside the demo profile", async () => {
    expect(() => assertDemoMode("production")).toThrow(/only runs with VISVIVA_MODE=demo/);
    expect(() => assertDemoMode(undefined)).toThrow(/only runs with VISVIVA_MODE=demo/);
    expect(() => assertDemoMode("demo")).not.toThrow();
    // The whole seed refuses before it writes anything.
    const board = freshBoard();
    await expect(seedDemo(db(), { mode: "production", board })).rejects.toThrow(/only runs with VISVIVA_MODE=demo/);
    await expect(seedDemo(db(), { mode: undefined, board })).rejects.toThrow(/only runs with VISVIVA_MODE=demo/);
    expect(await db().select({ id: boards.id }).from(boards).where(eq(boards.slug, board.slug))).toEqual([]);
  });

  it("creates one account per role on the demo board, idempotently, with the documented passwords", async () => {
    const first = await seedDemoAccounts(db());
    const second = await seedDemoAccounts(db());
    expect(second).toEqual(first);
    for (const account of DEMO_ACCOUNTS) {
      expect(account.password.length).toBeGreaterThanOrEqual(12);
      expect(account.email).toMatch(/@[a-z-]+\.example\.(org|com|net)$/);
      const [row] = await db()
        .select({ passwordHash: users.passwordHash, isAdmin: users.isAdmin })
        .from(users)
        .where(eq(users.id, first.users[account.key].id));
      expect(row?.isAdmin).toBe(account.isAdmin);
      expect(await verifyPassword(row!.passwordHash, account.password)).toBe(true);
      const [membership] = await db()
        .select({ role: boardMembers.role })
        .from(boardMembers)
        .where(and(eq(boardMembers.boardId, first.boardId), eq(boardMembers.userId, first.users[account.key].id)));
      expect(membership?.role ?? null).toBe(account.role);
    }
  });
});

describe("demo scenario", () => {
  it("seeds the whole story through the data-access layer: calls, dossiers, flags, reviews, decisions and mail", { timeout: 300_000 }, async () => {
    const board = freshBoard();
    const { scenario: s } = await seedDemo(db(), { mode: "demo", board });
    expect(s.skipped).toBe(false);
    const boardId = s.boardId;

    // The cast: every person is a member in their role, with an invented example address.
    for (const person of DEMO_PEOPLE) {
      expect(person.email).toMatch(/@[a-z-]+\.example\.(org|com|net)$/);
      const [m] = await db()
        .select({ role: boardMembers.role })
        .from(boardMembers)
        .where(and(eq(boardMembers.boardId, boardId), eq(boardMembers.userId, s.people[person.key].id)));
      expect(m?.role).toBe(person.role);
    }
    const [cast] = await db().select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, s.people.ines.id));
    expect(await verifyPassword(cast!.passwordHash, DEMO_CAST_PASSWORD)).toBe(true);

    // One decided call, closed in the past, and one open call.
    const callRows = await db()
      .select({ id: calls.id, title: calls.title, closesAt: calls.closesAt, opensAt: calls.opensAt })
      .from(calls)
      .where(eq(calls.boardId, boardId));
    expect(callRows.map((c) => c.title).sort()).toEqual([DECIDED_CALL_TITLE, OPEN_CALL_TITLE].sort());
    const decided = callRows.find((c) => c.title === DECIDED_CALL_TITLE)!;
    const open = callRows.find((c) => c.title === OPEN_CALL_TITLE)!;
    expect(decided.closesAt.getTime()).toBeLessThan(Date.now());
    expect(open.opensAt.getTime()).toBeLessThan(Date.now());
    expect(open.closesAt.getTime()).toBeGreaterThan(Date.now());

    // Fourteen proposals in their states.
    const rows = await db()
      .select({ id: proposals.id, title: proposals.title, status: proposals.status, callId: proposals.callId, latestVersion: proposals.latestVersion })
      .from(proposals)
      .where(eq(proposals.boardId, boardId));
    expect(rows).toHaveLength(14);
    const byKey = (key: string) => rows.find((r) => r.id === s.proposals[key])!;
    expect(byKey("tern-1").status).toBe("decided");
    expect(byKey("wisp").status).toBe("decided");
    expect(byKey("skiff-ep")).toMatchObject({ status: "in_review", latestVersion: 2 });
    expect(byKey("kite").status).toBe("draft");
    expect(byKey("glint").status).toBe("draft");
    expect(byKey("quill").status).toBe("submitted");
    expect(byKey("plover").status).toBe("submitted");
    expect(byKey("curlew").status).toBe("submitted");
    expect(rows.filter((r) => r.callId === decided.id)).toHaveLength(3);

    // The server recomputed every block of every submitted version and agrees with the verdict each block was built for.
    const versionRows = await db()
      .select({ id: proposalVersions.id, proposalId: proposalVersions.proposalId, number: proposalVersions.number, document: proposalVersions.document })
      .from(proposalVersions)
      .where(eq(proposalVersions.boardId, boardId));
    const results = await db()
      .select({ versionId: checkResults.versionId, blockId: checkResults.blockId, status: checkResults.status })
      .from(checkResults)
      .where(eq(checkResults.boardId, boardId));
    const v1 = new Map(versionRows.filter((v) => v.number === 1).map((v) => [v.id, v.proposalId]));
    const submittedBlocks = s.blocks.filter((b) => !["kite", "glint"].includes(b.proposal));
    for (const b of submittedBlocks) {
      const stored = results.find((r) => r.blockId === b.blockId && v1.get(r.versionId) === s.proposals[b.proposal]);
      expect(stored?.status, `${b.proposal}: ${b.label}`).toBe(b.expected);
    }
    expect(results.filter((r) => r.status === "consistent").length).toBeGreaterThan(results.filter((r) => r.status === "inconsistent").length * 3);
    expect(results.some((r) => r.status === "invalid")).toBe(false);
    // At least one flagged claim for each way dossiers are really wrong.
    for (const mistake of ["period-from-altitude", "degrees-as-radians", "budget-without-margin", "sso-wrong-altitude"]) {
      const flagged = submittedBlocks.filter((b) => b.mistake === mistake && results.some((r) => r.blockId === b.blockId && r.status === "inconsistent"));
      expect(flagged.length, mistake).toBeGreaterThan(0);
    }
    // Skiff-EP version 2 fixed its margin: every claim holds.
    const skiffV2 = versionRows.find((v) => v.proposalId === s.proposals["skiff-ep"] && v.number === 2)!;
    expect(results.filter((r) => r.versionId === skiffV2.id).map((r) => r.status)).toEqual(expect.arrayContaining(["consistent"]));
    expect(results.filter((r) => r.versionId === skiffV2.id && r.status !== "consistent")).toEqual([]);

    // The open call's requirements judged each claim at submission (figures from the engine):
    // Plover has no propulsion and misses the 25-year deadline; Curlew's budget closes only
    // without its statistical margin; its mass budget meets the 20 % system margin.
    expect((await db().select({ id: callRequirements.id }).from(callRequirements).where(eq(callRequirements.callId, open.id))).length).toBe(6);
    const judged = await db()
      .select({ blockId: checkResults.blockId, versionId: checkResults.versionId, requirements: checkResults.requirements })
      .from(checkResults)
      .where(eq(checkResults.boardId, boardId));
    const outcome = (proposal: string, label: string) => {
      const b = s.blocks.find((x) => x.proposal === proposal && x.label === label)!;
      return judged.find((r) => r.blockId === b.blockId)!.requirements;
    };
    expect(outcome("plover", "end of life by natural decay")).toMatchObject([{ type: "disposalDeadline", status: "notMet" }]);
    expect(outcome("curlew", "the phased Δv budget")).toMatchObject([{ type: "deltaVMargin", status: "notMet" }]);
    expect(outcome("curlew", "the phased Δv budget")[0]!.reason).toMatch(/closes only without the statistical phases' margin/);
    expect(outcome("curlew", "the mass budget")).toMatchObject([{ type: "systemMassMargin", status: "met" }]);
    // Ground coverage: the board keeps three stations; Harrow's two polar stations give well over
    // the call's 90 minutes a day, and its X-band link closes with 2.3 dB against the call's 3 dB.
    const boardStations = await listStations(s.people.chair, boardId);
    expect(boardStations.stations.map((st) => st.name).sort()).toEqual(["Sorrel campus dish", "Tarnholm polar site", "Vesterhaug station"]);
    expect(outcome("harrow", "daily contact at the cooperative's stations")).toMatchObject([{ type: "minDailyContact", status: "met" }]);
    expect(outcome("harrow", "the X-band downlink")).toMatchObject([{ type: "minLinkMargin", status: "notMet" }]);
    expect(outcome("harrow", "the X-band downlink")[0]!.reason).toMatch(/the link margin is 2\.3 dB, the call asks at least 3 dB/);
    expect(outcome("harrow", "the 4-day repeating ground track")).toEqual([]);
    const harrowBlocks = s.blocks.filter((b) => b.proposal === "harrow");
    expect(results.filter((r) => harrowBlocks.some((b) => b.blockId === r.blockId && b.label === "the X-band downlink")).map((r) => r.status)).toEqual([
      "consistent",
    ]);
    // Claims of the decided call are judged by nothing (that call sets no requirements).
    const decidedVersions = new Set(versionRows.filter((v) => rows.find((r) => r.id === v.proposalId)?.callId === decided.id).map((v) => v.id));
    expect(judged.filter((r) => decidedVersions.has(r.versionId)).every((r) => r.requirements.length === 0)).toBe(true);

    // Attachments were uploaded to the store and confirmed.
    const files = await db()
      .select({ status: attachments.status, detectedType: attachments.detectedType, sha256: attachments.sha256 })
      .from(attachments)
      .where(eq(attachments.boardId, boardId));
    expect(files.length).toBe(s.attachments);
    expect(files.every((f) => f.status === "confirmed" && f.sha256?.length === 64)).toBe(true);
    expect(new Set(files.map((f) => f.detectedType))).toEqual(new Set(["application/pdf", "text/csv", "text/plain"]));

    // Invitations: two still out, one withdrawn.
    const invites = await listInvitations(s.people.chair, boardId, { show: "all" });
    expect(invites).toMatchObject({ total: 3, pendingTotal: 2 });
    expect(invites.invitations.map((i) => i.status).sort()).toEqual(["pending", "pending", "revoked"]);

    // A declared conflict, and the same-domain flag the chair sees on the assignment page.
    expect(await db().select({ id: conflicts.id }).from(conflicts).where(eq(conflicts.boardId, boardId))).toHaveLength(1);
    const assignment = await getAssignmentBoard(s.people.chair, boardId, open.id);
    expect(assignment.conflicts[`${s.people.runa.id}:${s.proposals.petrel}`]?.[0]).toMatchObject({ strength: "conflict", rule: "declared-proposal" });
    expect(assignment.conflicts[`${s.people.jonas.id}:${s.proposals.quill}`]?.[0]).toMatchObject({ strength: "likely", rule: "same-email-domain" });

    // Reviews with scores, and review items anchored to the text of the version they were raised on.
    const reviewRows = await db().select({ status: reviews.status, weightedTotal: reviews.weightedTotal }).from(reviews).where(eq(reviews.boardId, boardId));
    expect(reviewRows.filter((r) => r.status === "submitted")).toHaveLength(11);
    expect(reviewRows.filter((r) => r.status === "draft")).toHaveLength(2);
    expect(reviewRows.every((r) => typeof r.weightedTotal === "number")).toBe(true);
    const items = await db().select({ versionId: reviewItems.versionId, anchor: reviewItems.anchor }).from(reviewItems).where(eq(reviewItems.boardId, boardId));
    expect(items).toHaveLength(s.reviewItems);
    expect(items.length).toBeGreaterThanOrEqual(10);
    for (const item of items) {
      const text = dossierPlainText(versionRows.find((v) => v.id === item.versionId)!.document);
      expect(text.slice(item.anchor.from, item.anchor.to)).toBe(item.anchor.quote);
    }

    // The decided call's decisions, each with its PDF letter in the store and its e-mail in the outbox.
    const decisionRows = await db()
      .select({ id: decisions.id, proposalId: decisions.proposalId, outcome: decisions.outcome, pdfKey: decisions.pdfKey, letterText: decisions.letterText })
      .from(decisions)
      .where(eq(decisions.boardId, boardId));
    expect(Object.fromEntries(decisionRows.map((d) => [d.proposalId, d.outcome]))).toEqual({
      [s.proposals["tern-1"]!]: "accept",
      [s.proposals["skiff-ep"]!]: "revise",
      [s.proposals.wisp!]: "decline",
    });
    for (const d of decisionRows) {
      expect(d.letterText).toContain(
        s.people[d.proposalId === s.proposals.wisp ? "maren" : d.proposalId === s.proposals["skiff-ep"] ? "tobias" : "nadia"].name,
      );
      expect((await statObjectOrNull(d.pdfKey!))?.size).toBeGreaterThan(1000);
    }
    const mail = await db()
      .select({ kind: outboxMessages.kind, to: outboxMessages.toAddresses, attachments: outboxMessages.attachments })
      .from(outboxMessages)
      .where(eq(outboxMessages.boardId, boardId));
    const letters = mail.filter((m) => m.kind === "decision-letter");
    expect(letters).toHaveLength(3);
    expect(letters.every((m) => m.attachments.length === 1 && m.attachments[0]!.contentType === "application/pdf")).toBe(true);
    expect(letters.flatMap((m) => m.to).sort()).toEqual([s.people.nadia.email, s.people.tobias.email, s.people.maren.email].sort());
    // 8 proposals × 2 reviewers, and the two reviewers asked again for Skiff-EP's version 2.
    expect(mail.filter((m) => m.kind === "reviewer-assignment")).toHaveLength(18);
    // The open call's response round: opened (proposers of its proposals under review told), one answer, one disposition.
    const [window] = await db().select().from(responseWindows).where(eq(responseWindows.callId, open.id));
    expect(window!.openingMailedAt).not.toBeNull();
    expect(mail.filter((m) => m.kind === "response-opening").length).toBeGreaterThan(0);
    const answered = await db().select({ itemId: reviewItemAnswers.reviewItemId }).from(reviewItemAnswers).where(eq(reviewItemAnswers.boardId, boardId));
    expect(answered).toHaveLength(1);
    const disposed = await db()
      .select({ itemId: reviewItemDispositions.reviewItemId, disposition: reviewItemDispositions.disposition })
      .from(reviewItemDispositions)
      .where(eq(reviewItemDispositions.boardId, boardId));
    expect(disposed).toEqual([{ itemId: answered[0]!.itemId, disposition: "agreed" }]);

    // Running it again changes nothing.
    const again = await seedDemo(db(), { mode: "demo", board });
    expect(again.scenario).toMatchObject({ skipped: true, boardId, calls: { decided: decided.id, open: open.id } });
    expect(await db().select({ id: proposals.id }).from(proposals).where(eq(proposals.boardId, boardId))).toHaveLength(14);
    expect(
      await db()
        .select({ id: decisions.id })
        .from(decisions)
        .where(inArray(decisions.proposalId, Object.values(s.proposals))),
    ).toHaveLength(3);
  });
});
