// Call requirements against the real database and object store: chairs set them, bad
// parameters are refused naming the field with nothing saved, and a submission stores the
// met / not met / not evaluated outcome per claim beside its agreement verdict.
import { describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { callRequirements, checkResults } from "@/db/schema";
import { addRequirement, listRequirements, removeRequirement } from "@/lib/dal/requirements";
import { createProposal, getVersion, getVersionHtml, saveDraft, submitProposal } from "@/lib/dal/proposals";
import { AppError } from "@/lib/errors";
import { parseWith } from "@/lib/http/api";
import { requirementInputSchema } from "@/lib/validation/requirements";
import { asSessionUser, unique } from "../support/factories";
import { dossierDoc, makeProposal, orbitBlock } from "./matrix/dossiers";

async function errorOf(promise: Promise<unknown> | (() => unknown)): Promise<AppError> {
  try {
    await (typeof promise === "function" ? promise() : promise);
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
  throw new Error("expected an AppError");
}

const input = (body: unknown) => parseWith(requirementInputSchema, body);

describe("call requirements", () => {
  it("lets the chair add and remove them, members read them, and others not change them", async () => {
    const { cast, call } = await makeProposal();
    const chair = asSessionUser(cast.chair);
    const added = await addRequirement(chair, cast.board.id, call.id, input({ type: "disposalDeadline", params: { years: 25 }, rationale: "" }));
    expect(added.summary).toBe("Re-entry within 25 years after the end of the mission");
    // An empty rationale takes the type's own wording, which names no authority as the governing one.
    expect(added.rationale).toMatch(/common practice/);
    const seen = await listRequirements(asSessionUser(cast.proposer), cast.board.id, call.id);
    expect(seen.map((r) => r.id)).toEqual([added.id]);
    expect(
      (await errorOf(addRequirement(asSessionUser(cast.proposer), cast.board.id, call.id, input({ type: "maxEclipse", params: { maximumDuration: 2100 } }))))
        .status,
    ).toBe(403);
    expect((await errorOf(removeRequirement(asSessionUser(cast.reviewer), cast.board.id, call.id, added.id))).status).toBe(403);
    await removeRequirement(chair, cast.board.id, call.id, added.id);
    expect(await listRequirements(chair, cast.board.id, call.id)).toEqual([]);
  });

  it("refuses impossible parameters with a 422 naming the field, and saves nothing", async () => {
    const { cast, call } = await makeProposal();
    // Each refusal names its field (details.issues[].path) and says what to do in a sentence.
    const cases: [unknown, string, RegExp][] = [
      [{ type: "disposalDeadline", params: { years: -5 } }, "params.years", /the deadline must be more than 0 years/i],
      [
        { type: "deltaVMargin", params: { deterministicMargin: 1, statisticalMargin: 0.1 } },
        "params.deterministicMargin",
        /the deterministic margin must be below 100 %/i,
      ],
      [{ type: "systemMassMargin", params: { minimumMargin: -0.1 } }, "params.minimumMargin", /the minimum system margin cannot be negative/i],
      [{ type: "maxEclipse", params: { maximumDuration: "long" } }, "params.maximumDuration", /./],
      [{ type: "disposalDeadline", params: { years: 25, extra: 1 } }, "params", /./],
      [{ type: "orbitalPurity", params: {} }, "type", /choose a requirement type/i],
    ];
    for (const [body, field, message] of cases) {
      const error = await errorOf(() => input(body));
      expect(error.status).toBe(422);
      const issues = (error.details as { issues: { path: string; message: string }[] }).issues;
      expect(issues.filter((i) => i.path === field && message.test(i.message)).length, JSON.stringify(issues)).toBe(1);
      expect(error.message).toMatch(message);
    }
    const rows = await db().select({ id: callRequirements.id }).from(callRequirements).where(eq(callRequirements.callId, call.id));
    expect(rows).toEqual([]);
    expect((await errorOf(removeRequirement(asSessionUser(cast.chair), cast.board.id, call.id, "not-a-uuid"))).status).toBe(404);
  });

  it("stores met / not met / not evaluated per claim at submission, and shows the flags in the rendered version", async () => {
    const { cast, call, proposal } = await makeProposal();
    const chair = asSessionUser(cast.chair);
    const proposer = asSessionUser(cast.proposer);
    const disposal = await addRequirement(chair, cast.board.id, call.id, input({ type: "disposalDeadline", params: { years: 25 } }));
    const margin = await addRequirement(
      chair,
      cast.board.id,
      call.id,
      input({ type: "deltaVMargin", params: { deterministicMargin: 0.05, statisticalMargin: 0.1 } }),
    );
    const eclipse = await addRequirement(chair, cast.board.id, call.id, input({ type: "maxEclipse", params: { maximumDuration: 40 * 60 } }));
    // 700 km with B = 50 kg/m² and no burn: about 58 years (engine value), so the 25-year deadline is not met.
    const noBurn = orbitBlock("end of life", { kind: "disposal", body: "earth", given: { altitude: 700, ballisticCoefficient: 50 } });
    // Statistical phase with 5 % where the call asks 10 %.
    const budget = orbitBlock("Δv budget", {
      kind: "deltaVBudget",
      given: {
        specificImpulse: 220,
        initialMass: 150,
        finalMass: 130,
        phases: [
          { name: "transfer", type: "deterministic", margin: 0.05, maneuvers: [{ name: "raise", deltaV: 0.1 }] },
          { name: "corrections", type: "statistical", margin: 0.05, maneuvers: [{ name: "trim", deltaV: 0.02 }] },
        ],
      },
    });
    const orbit = orbitBlock("science orbit", { kind: "orbit", body: "earth", given: { altitude: 700 } });
    await saveDraft(proposer, cast.board.id, proposal.id, { revision: 1, document: dossierDoc([noBurn, budget, orbit]) });
    const submission = await submitProposal(proposer, cast.board.id, proposal.id);
    expect(submission.requirementCounts).toEqual({ met: 0, notMet: 2, notEvaluated: 0 });

    const rows = await db()
      .select({ blockId: checkResults.blockId, status: checkResults.status, requirements: checkResults.requirements })
      .from(checkResults)
      .where(and(eq(checkResults.versionId, submission.versionId), eq(checkResults.boardId, cast.board.id)));
    const byBlock = new Map(rows.map((r) => [r.blockId, r]));
    const disposalRow = byBlock.get(noBurn.attrs.blockId)!;
    expect(disposalRow.status).toBe("consistent");
    expect(disposalRow.requirements).toHaveLength(1);
    expect(disposalRow.requirements[0]).toMatchObject({ requirementId: disposal.id, status: "notMet" });
    expect(disposalRow.requirements[0]!.reason).toMatch(/re-entry takes 5\d\.\d years by natural decay; the call asks at most 25 years/);
    const budgetRow = byBlock.get(budget.attrs.blockId)!;
    expect(budgetRow.requirements[0]).toMatchObject({ requirementId: margin.id, status: "notMet" });
    expect(budgetRow.requirements[0]!.reason).toMatch(/phase "corrections" carries 5 %, the call asks 10 % for statistical phases/);
    // The orbit block is concerned by no requirement; the eclipse requirement concerns no claim here.
    expect(byBlock.get(orbit.attrs.blockId)!.requirements).toEqual([]);
    expect(rows.flatMap((r) => r.requirements).some((o) => o.requirementId === eclipse.id)).toBe(false);

    const version = await getVersion(proposer, cast.board.id, proposal.id, submission.number);
    expect(version.checkResults.find((r) => r.blockId === noBurn.attrs.blockId)!.requirements[0]!.status).toBe("notMet");
    const html = await getVersionHtml(proposer, cast.board.id, proposal.id, submission.number);
    expect(html).toContain('data-requirement-status="notMet"');
    expect(html).toContain("Requirement not met:");

    // The fix: a disposal burn to a 250 km perigee; a dossier with it meets the deadline.
    const other = await createProposal(proposer, cast.board.id, { title: unique("Fixed proposal"), missionType: "science", callId: call.id, coauthorIds: [] });
    const burn = orbitBlock("end of life", {
      kind: "disposal",
      body: "earth",
      given: { altitude: 700, ballisticCoefficient: 50, targetPerigeeAltitude: 250 },
    });
    await saveDraft(proposer, cast.board.id, other.id, { revision: 1, document: dossierDoc([burn, orbit]) });
    const second = await submitProposal(proposer, cast.board.id, other.id);
    const [fixed] = await db()
      .select({ requirements: checkResults.requirements })
      .from(checkResults)
      .where(and(eq(checkResults.versionId, second.versionId), eq(checkResults.blockId, burn.attrs.blockId)));
    expect(fixed!.requirements[0]).toMatchObject({ requirementId: disposal.id, status: "met" });
    expect(second.requirementCounts).toEqual({ met: 1, notMet: 0, notEvaluated: 0 });
  });
});
