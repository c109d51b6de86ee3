// Orbit files against the real services: parsed when the upload is confirmed (kept, with
// the line, when they cannot be read), read back through the data layer, compared with the
// dossier's text at submission (a stored flag), and exported as an OPM that parses back.
import crypto from "node:crypto";
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { checkResults, proposalVersions } from "@/db/schema";
import { confirmAttachment, listAttachments, presignAttachmentUpload } from "@/lib/dal/attachments";
import { exportBlockOpm, getOrbitFile, orbitFilesOfProposal } from "@/lib/dal/orbit-files";
import { saveDraft, submitProposal } from "@/lib/dal/proposals";
import { AppError } from "@/lib/errors";
import { parseOrbitFile, tleChecksum } from "@/lib/orbit-files";
import { claimFromSummary } from "@/lib/orbit-files/claim";
import type { OrbitSummary } from "@/lib/orbit-files/summary";
import { asSessionUser, createUser } from "../support/factories";
import { dossierDoc, makeProposal } from "./matrix/dossiers";

/** Invented satellite 99005 "VV-LANTERN" at about 548 km and 97.6° (mean elements). */
function lanternTle(): string {
  const l1 = "1 99005U 26004A   26060.50000000  .00000000  00000-0  00000-0 0  999";
  const l2 = "2 99005  97.6000  10.0000 0001000  90.0000   0.0000 15.06000000    1";
  return `VV-LANTERN\n${l1}${tleChecksum(l1)}\n${l2}${tleChecksum(l2)}\n`;
}

async function uploadText(
  user: ReturnType<typeof asSessionUser>,
  boardId: string,
  proposalId: string,
  filename: string,
  text: string,
  contentType = "text/plain",
) {
  const body = Buffer.from(text, "utf8");
  const presigned = await presignAttachmentUpload(user, boardId, proposalId, { filename, contentType, size: body.length });
  const put = await fetch(presigned.uploadUrl, { method: "PUT", headers: presigned.headers, body: new Uint8Array(body) });
  expect(put.status).toBe(200);
  return confirmAttachment(user, boardId, presigned.attachment.id);
}

describe("orbit files", () => {
  it("parses an element set on confirm and gives its orbit to those who may view the proposal", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const a = await uploadText(proposer, cast.board.id, proposal.id, "lantern.tle", lanternTle());
    const view = await getOrbitFile(asSessionUser(cast.chair), cast.board.id, a.id);
    expect(view.status).toBe("parsed");
    expect(view.format).toBe("tle");
    expect(view.sha256).toBe(crypto.createHash("sha256").update(lanternTle()).digest("hex"));
    const s = view.summaries[0]!;
    expect(s.label).toBe("VV-LANTERN (catalogue 99005)");
    expect(s.compare!.altitudeKm).toBeGreaterThan(545);
    expect(s.compare!.altitudeKm).toBeLessThan(552);
    expect(s.sunSynchronous!.sunSynchronous).toBe(true);
    expect(s.notes[0]).toMatch(/^Mean \(SGP4\) and osculating elements differ/);
    // Someone from another board learns nothing.
    const stranger = asSessionUser(await createUser());
    await expect(getOrbitFile(stranger, cast.board.id, a.id)).rejects.toMatchObject({ status: 404 });
  });

  it("keeps an element set with a wrong checksum as an attachment, unparsed, with the line and both checksums", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const lines = lanternTle().split("\n");
    const good = Number(lines[2]!.at(-1));
    const bad = (good + 3) % 10;
    lines[2] = lines[2]!.slice(0, 68) + bad;
    const a = await uploadText(proposer, cast.board.id, proposal.id, "lantern-bad.tle", lines.join("\n"));
    expect(a.status).toBe("confirmed");
    expect((await listAttachments(proposer, cast.board.id, proposal.id)).map((x) => x.id)).toEqual([a.id]);
    const [view] = await orbitFilesOfProposal(proposer, cast.board.id, proposal.id);
    expect(view).toMatchObject({ attachmentId: a.id, status: "unparsed", file: null, error: { line: 3, message: `line 3: checksum ${bad} expected ${good}` } });
  });

  it("refuses XML with an entity declaration without expanding it, and keeps the file", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const xml = `<?xml version="1.0"?>\n<!DOCTYPE opm [<!ENTITY secret SYSTEM "file:///etc/passwd">]>\n<opm id="CCSDS_OPM_VERS" version="2.0"><header><ORIGINATOR>&secret;</ORIGINATOR></header></opm>\n`;
    const a = await uploadText(proposer, cast.board.id, proposal.id, "orbit.xml", xml, "text/xml");
    const view = await getOrbitFile(proposer, cast.board.id, a.id);
    expect(view.status).toBe("unparsed");
    expect(view.error!.line).toBe(2);
    expect(view.error!.message).toMatch(/^line 2: XML DOCTYPE declarations are refused: entities are never fetched or expanded/);
  });

  it("a plain note is no orbit file: no row, 404 from the orbit view", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const a = await uploadText(proposer, cast.board.id, proposal.id, "notes.txt", "Thermal margins to be confirmed.\n");
    await expect(getOrbitFile(proposer, cast.board.id, a.id)).rejects.toBeInstanceOf(AppError);
    expect(await orbitFilesOfProposal(proposer, cast.board.id, proposal.id)).toEqual([]);
  });

  it("at submission, an element set contradicting the text becomes a stored flag; the block exports as an OPM that parses back", async () => {
    const { cast, proposal } = await makeProposal();
    const proposer = asSessionUser(cast.proposer);
    const a = await uploadText(proposer, cast.board.id, proposal.id, "lantern.tle", lanternTle());
    const view = await getOrbitFile(proposer, cast.board.id, a.id);
    const made = claimFromSummary({ attachmentId: a.id, sha256: a.sha256!, filename: a.filename }, view.summaries[0] as OrbitSummary);
    if ("error" in made) throw new Error(made.error);
    const fromFile = {
      type: "orbitCheck",
      attrs: { blockId: crypto.randomUUID(), label: "the operational orbit", claim: made.claim, initialFrom: null, source: made.source },
    };
    const textBlock = {
      type: "orbitCheck",
      attrs: {
        blockId: crypto.randomUUID(),
        label: "the operational orbit",
        claim: { kind: "sunSynchronous", body: "earth", given: { altitude: 540 }, claimed: { inclination: 97.5 } },
        initialFrom: null,
      },
    };
    await saveDraft(proposer, cast.board.id, proposal.id, {
      revision: 1,
      document: dossierDoc([{ type: "paragraph", content: [{ type: "text", text: "The operational orbit is 540 km sun-synchronous." }] }, textBlock, fromFile]),
    });
    await submitProposal(proposer, cast.board.id, proposal.id);

    const [version] = await db().select({ id: proposalVersions.id }).from(proposalVersions).where(eq(proposalVersions.proposalId, proposal.id));
    const flags = await db()
      .select({ blockId: checkResults.blockId, status: checkResults.status, label: checkResults.label, result: checkResults.result })
      .from(checkResults)
      .where(and(eq(checkResults.versionId, version!.id), eq(checkResults.kind, "fileAgainstText")));
    const flag = flags.find((f) => f.blockId === `file:${textBlock.attrs.blockId}:${a.id}`)!;
    expect(flag.status).toBe("inconsistent");
    expect(flag.label).toBe("the operational orbit against lantern.tle");
    const messages = (flag.result as { messages: string[]; question: string }).messages;
    expect(messages[0]).toMatch(/^the attached element set gives 54[5-9]\.\d km altitude, the text claims 540 km \(the operational orbit; tolerance ±5 km\)$/);
    expect((flag.result as { question: string }).question).toBe("Do the attached orbit files say what the text says?");
    // The block made from the file agrees with it.
    expect(flags.find((f) => f.blockId === `file:${fromFile.attrs.blockId}:${a.id}`)!.status).toBe("consistent");

    const opm = await exportBlockOpm(asSessionUser(cast.chair), cast.board.id, proposal.id, { version: 1, blockId: fromFile.attrs.blockId });
    expect(opm.filename).toBe("the-operational-orbit.opm");
    const back = parseOrbitFile(opm.text);
    expect(back.ok).toBe(true);
    if (back.ok && back.file.format === "opm") expect(back.file.state.epoch.iso).toBe(view.summaries[0]!.epoch);
  });
});
