// Orbit files: parsed attachments, the proposal's list, and OPM exports of blocks.
import crypto from "node:crypto";
import { db } from "@/db/client";
import { attachments } from "@/db/schema";
import { recordOrbitFile } from "@/lib/dal/orbit-files";
import { saveDraft, submitProposal } from "@/lib/dal/proposals";
import { tleChecksum } from "@/lib/orbit-files";
import { writeObject } from "@/storage/object-store";
import { asSessionUser } from "../../support/factories";
import { dossierDoc, makeProposal, orbitBlock } from "./dossiers";
import type { MatrixCast, MatrixRole, RouteCase } from "./types";

/** An element set for the invented satellite 99004 ("VV-MATRIX"). */
export function matrixTle(): string {
  const l1 = "1 99004U 26003A   26060.50000000  .00000000  00000-0  00000-0 0  999";
  const l2 = "2 99004  97.6000  10.0000 0001000  90.0000   0.0000 15.06000000    1";
  return `VV-MATRIX\n${l1}${tleChecksum(l1)}\n${l2}${tleChecksum(l2)}\n`;
}

/** A confirmed, parsed element-set attachment on a fresh proposal. */
async function orbitAttachment(cast: MatrixCast) {
  const { proposal } = await makeProposal({ cast });
  const id = crypto.randomUUID();
  const objectKey = `boards/${cast.board.id}/proposals/${proposal.id}/attachments/${id}`;
  const text = matrixTle();
  const sha256 = crypto.createHash("sha256").update(text).digest("hex");
  await writeObject(objectKey, text, "text/plain");
  await db().insert(attachments).values({
    id,
    proposalId: proposal.id,
    boardId: cast.board.id,
    objectKey,
    filename: "matrix.tle",
    declaredType: "text/plain",
    detectedType: "text/plain",
    declaredSize: text.length,
    size: text.length,
    sha256,
    status: "confirmed",
    confirmedAt: new Date(),
  });
  await recordOrbitFile({ attachmentId: id, boardId: cast.board.id, objectKey, sha256, filename: "matrix.tle" });
  return { proposal, attachmentId: id };
}

async function draftWithBlock(cast: MatrixCast, submit: boolean) {
  const { proposal } = await makeProposal({ cast });
  const block = orbitBlock("the operational orbit", { kind: "orbit", body: "earth", given: { altitude: 540 }, claimed: {} });
  const proposer = asSessionUser(cast.proposer);
  await saveDraft(proposer, cast.board.id, proposal.id, { revision: 1, document: dossierDoc([block]) });
  if (submit) await submitProposal(proposer, cast.board.id, proposal.id);
  return { proposal, blockId: block.attrs.blockId };
}

const board = (cast: MatrixCast) => `/api/v1/boards/${cast.board.id}`;
const viewers: Record<MatrixRole, number | number[]> = { anonymous: 401, outsider: 404, proposer: 200, reviewer: 404, chair: 200, admin: 200 };
const authors: Record<MatrixRole, number | number[]> = { anonymous: 401, outsider: 404, proposer: 200, reviewer: 404, chair: 404, admin: 200 };

export const orbitFileRouteCases: RouteCase[] = [
  {
    operationId: "getAttachmentOrbitFile",
    prepare: async (cast) => ({ path: `${board(cast)}/attachments/${(await orbitAttachment(cast)).attachmentId}/orbit` }),
    expect: viewers,
  },
  {
    operationId: "listProposalOrbitFiles",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await orbitAttachment(cast)).proposal.id}/orbit-files` }),
    expect: viewers,
  },
  {
    operationId: "exportDraftBlockOpm",
    prepare: async (cast) => {
      const { proposal, blockId } = await draftWithBlock(cast, false);
      return { path: `${board(cast)}/proposals/${proposal.id}/draft/orbit-checks/${blockId}/opm` };
    },
    expect: authors,
  },
  {
    operationId: "exportVersionBlockOpm",
    prepare: async (cast) => {
      const { proposal, blockId } = await draftWithBlock(cast, true);
      return { path: `${board(cast)}/proposals/${proposal.id}/versions/1/orbit-checks/${blockId}/opm` };
    },
    expect: viewers,
  },
];
