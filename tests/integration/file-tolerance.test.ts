// The call's tolerance for orbit files against the text, against the running app and the real
// database: the chair changes it over /api/v1 with values typed in their units, members read
// it in the call's representation, bad values get a 422 sentence naming the field, and the
// submission applies it: a TLE that agreed with the text under the defaults raises the flag
// once the chair tightens the altitude bound, and the reverse once the chair widens it.
import crypto from "node:crypto";
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { checkResults, proposalVersions } from "@/db/schema";
import { confirmAttachment, presignAttachmentUpload } from "@/lib/dal/attachments";
import { getOrbitFile } from "@/lib/dal/orbit-files";
import { createProposal, saveDraft, submitProposal } from "@/lib/dal/proposals";
import { tleChecksum } from "@/lib/orbit-files";
import { claimFromSummary } from "@/lib/orbit-files/claim";
import { DEFAULT_FILE_TOLERANCE } from "@/lib/orbit-files/tolerance";
import { appUrl } from "../support/app";
import { signedIn } from "../support/http";
import { asSessionUser, unique } from "../support/factories";
import type { MatrixCast as Cast } from "./matrix/types";
import { dossierDoc, makeProposal } from "./matrix/dossiers";

/** Invented satellite 99007 "VV-KESTREL": mean motion 15.06 rev/day, a mean altitude of about 545.4 km (SGP4 mean elements). */
function kestrelTle(): string {
  const l1 = "1 99007U 26006A   26060.50000000  .00000000  00000-0  00000-0 0  999";
  const l2 = "2 99007  97.6000  10.0000 0001000  90.0000   0.0000 15.06000000    1";
  return `VV-KESTREL\n${l1}${tleChecksum(l1)}\n${l2}${tleChecksum(l2)}\n`;
}

async function uploadTle(cast: Cast, proposalId: string) {
  const proposer = asSessionUser(cast.proposer);
  const body = Buffer.from(kestrelTle(), "utf8");
  const presigned = await presignAttachmentUpload(proposer, cast.board.id, proposalId, {
    filename: "kestrel.tle",
    contentType: "text/plain",
    size: body.length,
  });
  const put = await fetch(presigned.uploadUrl, { method: "PUT", headers: presigned.headers, body: new Uint8Array(body) });
  expect(put.status).toBe(200);
  return confirmAttachment(proposer, cast.board.id, presigned.attachment.id);
}

/** A proposal of the call whose text claims `altitudeKm` for the orbit it made from the element set; submitted; answers the stored flag. */
async function submitClaiming(cast: Cast, callId: string, altitudeKm: number) {
  const proposer = asSessionUser(cast.proposer);
  const proposal = await createProposal(proposer, cast.board.id, { title: unique("Proposal"), missionType: "science", callId, coauthorIds: [] });
  const a = await uploadTle(cast, proposal.id);
  const view = await getOrbitFile(proposer, cast.board.id, a.id);
  const made = claimFromSummary({ attachmentId: a.id, sha256: a.sha256!, filename: a.filename }, view.summaries[0]!);
  if ("error" in made) throw new Error(made.error);
  const textBlock = {
    type: "orbitCheck",
    attrs: {
      blockId: crypto.randomUUID(),
      label: "the science orbit",
      claim: { kind: "sunSynchronous", body: "earth", given: { altitude: altitudeKm }, claimed: {} },
      initialFrom: null,
    },
  };
  const fromFile = {
    type: "orbitCheck",
    attrs: { blockId: crypto.randomUUID(), label: "the science orbit", claim: made.claim, initialFrom: null, source: made.source },
  };
  await saveDraft(proposer, cast.board.id, proposal.id, { revision: 1, document: dossierDoc([textBlock, fromFile]) });
  await submitProposal(proposer, cast.board.id, proposal.id);
  const [version] = await db().select({ id: proposalVersions.id }).from(proposalVersions).where(eq(proposalVersions.proposalId, proposal.id));
  const [flag] = await db()
    .select({ status: checkResults.status, result: checkResults.result, claim: checkResults.claim })
    .from(checkResults)
    .where(and(eq(checkResults.versionId, version!.id), eq(checkResults.blockId, `file:${textBlock.attrs.blockId}:${a.id}`)));
  return { fileAltitude: view.summaries[0]!.compare!.altitudeKm, flag: flag! };
}

describe("the call's tolerance for orbit files against the text", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("chairs change it in the units they write; members read it in the call; bad values get a sentence naming the field", async () => {
    const { cast, call } = await makeProposal();
    const path = `/api/v1/boards/${cast.board.id}/calls/${call.id}`;
    const chair = await signedIn(cast.chair.email);
    const proposer = await signedIn(cast.proposer.email);

    const before = (await (await proposer.get(path)).json()).call;
    expect(before.fileTolerance).toEqual(DEFAULT_FILE_TOLERANCE);
    expect(before.fileToleranceIsDefault).toBe(true);
    const base = { title: before.title, description: before.description, opensAt: before.opensAt, closesAt: before.closesAt, tolerance: before.tolerance };

    const set = await chair.request(path, { method: "PUT", json: { ...base, fileTolerance: { km: "500 m", deg: "3 arcmin", "1": "0.001", s: "1 min" } } });
    expect(set.status).toBe(200);
    expect((await set.json()).call.fileTolerance).toEqual({ km: 0.5, deg: 0.05, "1": 0.001, s: 60 });
    const read = (await (await proposer.get(path)).json()).call;
    expect(read.fileTolerance).toEqual({ km: 0.5, deg: 0.05, "1": 0.001, s: 60 });
    expect(read.fileToleranceIsDefault).toBe(false);
    // A change of the call's other settings that does not send fileTolerance keeps it.
    expect((await chair.request(path, { method: "PUT", json: { ...base, title: `${before.title} (edited)` } })).status).toBe(200);
    expect((await (await proposer.get(path)).json()).call.fileTolerance).toEqual({ km: 0.5, deg: 0.05, "1": 0.001, s: 60 });

    const bad = await chair.request(path, { method: "PUT", json: { ...base, fileTolerance: { km: "5 miles", deg: 0.1, "1": 0.002, s: 60 } } });
    expect(bad.status).toBe(422);
    const issues = (await bad.json()).details.issues as { path: string; message: string }[];
    expect(issues).toContainEqual({ path: "fileTolerance.km", message: expect.stringContaining('"miles" is not a unit for altitudes: use km, m') });
    // Proposers may read it, not change it.
    expect((await proposer.request(path, { method: "PUT", json: { ...base, fileTolerance: null } })).status).toBe(403);
    // null returns to the defaults.
    const reset = await chair.request(path, { method: "PUT", json: { ...base, fileTolerance: null } });
    expect((await reset.json()).call).toMatchObject({ fileTolerance: DEFAULT_FILE_TOLERANCE, fileToleranceIsDefault: true });
  });

  it("a chair tightens it and an element set that passed raises the flag at submission; widening it clears the flag", async () => {
    const { cast, call } = await makeProposal();
    const path = `/api/v1/boards/${cast.board.id}/calls/${call.id}`;
    const chair = await signedIn(cast.chair.email);
    const base = (await (await chair.get(path)).json()).call;
    const put = (fileTolerance: unknown) =>
      chair.request(path, {
        method: "PUT",
        json: { title: base.title, description: base.description, opensAt: base.opensAt, closesAt: base.closesAt, tolerance: base.tolerance, fileTolerance },
      });

    // The file's mean altitude is about 545.4 km; the text claims 548 km, 2.6 km more: inside the default ±5 km.
    const first = await submitClaiming(cast, call.id, 548);
    expect(first.fileAltitude).toBeGreaterThan(545);
    expect(first.fileAltitude).toBeLessThan(546);
    expect(first.flag.status).toBe("consistent");

    expect((await put({ km: "1 km", deg: "0.1°", "1": "0.002", s: "60 s" })).status).toBe(200);
    const tightened = await submitClaiming(cast, call.id, 548);
    expect(tightened.flag.status).toBe("inconsistent");
    expect((tightened.flag.result as { messages: string[] }).messages[0]).toMatch(
      /^the attached element set gives 545\.\d km altitude, the text claims 548 km \(the science orbit; tolerance ±1 km\)$/,
    );
    expect((tightened.flag.claim as { tolerance: unknown }).tolerance).toEqual({ km: 1, deg: 0.1, "1": 0.002, s: 60 });

    // The reverse: 540 km in the text is 5.4 km off, outside ±5 km; the chair widens the bound to 10 km (typed in metres).
    expect((await put(null)).status).toBe(200);
    expect((await submitClaiming(cast, call.id, 540)).flag.status).toBe("inconsistent");
    expect((await put({ km: "10000 m", deg: "0.1°", "1": "0.002", s: "60 s" })).status).toBe(200);
    expect((await submitClaiming(cast, call.id, 540)).flag.status).toBe("consistent");
  });
});
