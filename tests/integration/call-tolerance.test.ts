// The call's tolerance policy for orbit checks, against the running app and the real
// database: chairs set it over /api/v1, members read it, bad policies get a 4xx naming the
// field, submission applies it, and a version submitted before a change keeps its record
// (contract version and policy) while a chair sees today's rules beside it.
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { checkResults, proposalVersions } from "@/db/schema";
import { updateCallTolerance } from "@/lib/dal/calls";
import { getVersion, rerunVersionWithTodaysRules, saveDraft, submitProposal } from "@/lib/dal/proposals";
import { AppError } from "@/lib/errors";
import { appUrl } from "../support/app";
import { signedIn } from "../support/http";
import { asSessionUser } from "../support/factories";
import { dossierDoc, makeProposal, orbitBlock } from "./matrix/dossiers";

// A 500 km circular Earth orbit: two-body period about 5677 s with the engine's constants
// table (mu 398600.4418 km³/s², radius 6378.137 km; WGS 84 values). 5690 s is 0.23 % off:
// inside 1 %, outside 0.1 % (and outside its written precision of ±0.5 s and the 1 s bound).
const periodClaim = () => orbitBlock("science orbit", { kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: "5690" } });

async function statusOf(promise: Promise<unknown>): Promise<number | "ok"> {
  try {
    await promise;
    return "ok";
  } catch (error) {
    if (error instanceof AppError) return error.status;
    throw error;
  }
}

describe("call tolerance policy", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("chairs set it, members read it, and bad policies get a 4xx naming the field", async () => {
    const { cast, call } = await makeProposal();
    const path = `/api/v1/boards/${cast.board.id}/calls/${call.id}/tolerance`;
    const chair = await signedIn(cast.chair.email);
    const proposer = await signedIn(cast.proposer.email);

    const set = await chair.request(path, { method: "PUT", json: { relative: 0.0005, absolute: { deg: 0.02, km: 0.5 } } });
    expect(set.status).toBe(200);
    expect((await set.json()).tolerance).toEqual({ relative: 0.0005, absolute: { deg: 0.02, km: 0.5 } });
    const read = await proposer.get(path);
    expect(read.status).toBe(200);
    expect((await read.json()).tolerance).toEqual({ relative: 0.0005, absolute: { deg: 0.02, km: 0.5 } });
    expect((await proposer.request(path, { method: "PUT", json: { relative: 0.1 } })).status).toBe(403);

    const bad: [unknown, string][] = [
      [{ relative: -0.001 }, "relative"],
      [{ relative: 0.5 }, "relative"],
      [{ relative: 0.9 }, "relative"],
      [{ relative: "0.1" }, "relative"],
      [{ relative: 0.001, absolute: { km: -1 } }, "absolute.km"],
      [{ relative: 0.001, absolute: { parsec: 1 } }, "absolute"],
      [{ relative: 0.001, extra: true }, ""],
    ];
    for (const [body, field] of bad) {
      const answer = await chair.request(path, { method: "PUT", json: body });
      expect(answer.status, JSON.stringify(body)).toBe(422);
      const payload = await answer.json();
      expect(payload.error).toMatch(/relative|absolute|tolerance/);
      if (field) expect(payload.details.issues.map((i: { path: string }) => i.path)).toContain(field);
    }
    // Non-finite: JSON reads 1e400 as Infinity, which is no bound.
    const infinite = await chair.request(path, { method: "PUT", body: '{"relative":1e400}', headers: { "content-type": "application/json" } });
    expect(infinite.status).toBe(422);
    expect((await infinite.json()).details.issues[0].path).toBe("relative");
    // The call's whole form takes the same rules under tolerance.*.
    const form = await chair.request(`/api/v1/boards/${cast.board.id}/calls/${call.id}`, {
      method: "PUT",
      json: { title: call.title, opensAt: call.opensAt, closesAt: call.closesAt, tolerance: { relative: 0.5 } },
    });
    expect(form.status).toBe(422);
    expect((await form.json()).details.issues.map((i: { path: string }) => i.path)).toContain("tolerance.relative");
    // Nothing bad was stored.
    expect((await (await proposer.get(path)).json()).tolerance.relative).toBe(0.0005);
  });

  it("submission applies the policy; an earlier version keeps its record and a chair sees today's rules beside it", async () => {
    const { cast, call, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const chair = asSessionUser(cast.chair);
    await saveDraft(proposer, cast.board.id, proposal.id, { revision: 1, document: dossierDoc([periodClaim()]) });
    const first = await submitProposal(proposer, cast.board.id, proposal.id);
    expect(first.counts).toEqual({ consistent: 1, inconsistent: 0, invalid: 0 });
    const [row] = await db()
      .select({ contractVersion: checkResults.contractVersion, tolerance: checkResults.tolerance })
      .from(checkResults)
      .where(and(eq(checkResults.boardId, cast.board.id), eq(checkResults.versionId, first.versionId)));
    expect(row).toEqual({ contractVersion: 2, tolerance: { relative: 0.01 } });

    await updateCallTolerance(chair, cast.board.id, call.id, { relative: 0.001 });
    const rerun = await rerunVersionWithTodaysRules(chair, cast.board.id, proposal.id, 1);
    expect(rerun.tolerance).toEqual({ relative: 0.001 });
    expect(rerun.differing).toBe(1);
    expect(rerun.blocks[0]).toMatchObject({ storedStatus: "consistent", todayStatus: "inconsistent", storedContractVersion: 2 });
    expect(rerun.blocks[0]!.changes[0]).toMatchObject({ quantity: "period", stored: { ok: true }, today: { ok: false } });
    // The record is unchanged, and only chairs may run today's rules.
    const version = await getVersion(chair, cast.board.id, proposal.id, 1);
    expect(version.checkResults.map((r) => r.status)).toEqual(["consistent"]);
    expect(await statusOf(rerunVersionWithTodaysRules(proposer, cast.board.id, proposal.id, 1))).toBe(403);
    expect(await statusOf(rerunVersionWithTodaysRules(asSessionUser(cast.reviewer), cast.board.id, proposal.id, 1))).toBe(404);

    // A new submission is checked at the tightened policy.
    const again = await makeProposal({ cast });
    await updateCallTolerance(chair, cast.board.id, again.call.id, { relative: 0.001 });
    await saveDraft(proposer, cast.board.id, again.proposal.id, { revision: 1, document: dossierDoc([periodClaim()]) });
    const tight = await submitProposal(proposer, cast.board.id, again.proposal.id);
    expect(tight.counts).toEqual({ consistent: 0, inconsistent: 1, invalid: 0 });
    const [tightRow] = await db()
      .select({ result: checkResults.result, tolerance: checkResults.tolerance })
      .from(checkResults)
      .innerJoin(proposalVersions, eq(proposalVersions.id, checkResults.versionId))
      .where(eq(proposalVersions.id, tight.versionId));
    expect(tightRow!.tolerance).toEqual({ relative: 0.001 });
    expect((tightRow!.result as { checks: { quantity: string; ok: boolean }[] }).checks).toEqual([expect.objectContaining({ quantity: "period", ok: false })]);
  });
});
