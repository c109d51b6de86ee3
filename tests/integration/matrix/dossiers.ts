// Dossier area: calls, proposals, drafts, submissions, versions, check results and
// attachments. Also the small builders the dossier tests share.
import crypto from "node:crypto";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { attachments } from "@/db/schema";
import { createCall } from "@/lib/dal/calls";
import { createProposal, saveDraft, submitProposal } from "@/lib/dal/proposals";
import { callInputSchema } from "@/lib/validation/dossier";
import { writeObject } from "@/storage/object-store";
import { asSessionUser, createBoardWithCast, unique } from "../../support/factories";
import type { MatrixCast, MatrixRole, RouteCase } from "./types";

type Cast = MatrixCast;

/** An open call on the cast's board (opened an hour ago, closes in a week). */
export async function makeCall(cast: Cast, options: { requiredSections?: string[]; tolerance?: { relative: number } } = {}) {
  return createCall(
    asSessionUser(cast.chair),
    cast.board.id,
    callInputSchema.parse({
      title: unique("Call"),
      opensAt: new Date(Date.now() - 3600_000).toISOString(),
      closesAt: new Date(Date.now() + 7 * 86400_000).toISOString(),
      requiredSections: options.requiredSections ?? [],
      tolerance: options.tolerance ?? { relative: 0.01 },
    }),
  );
}

/** A fresh cast, an open call and a draft proposal owned by the cast's proposer. */
export async function makeProposal(options: { requiredSections?: string[]; cast?: Cast } = {}) {
  const cast = options.cast ?? (await createBoardWithCast());
  const call = await makeCall(cast, options);
  const proposal = await createProposal(asSessionUser(cast.proposer), cast.board.id, {
    title: unique("Proposal"),
    missionType: "science",
    callId: call.id,
    coauthorIds: [],
  });
  return { cast, call, proposal };
}

export function dossierDoc(content: unknown[]): Record<string, unknown> {
  return { type: "doc", content };
}

export function orbitBlock(label: string, claim: Record<string, unknown>, initialFrom?: string) {
  return { type: "orbitCheck", attrs: { blockId: crypto.randomUUID(), label, claim, initialFrom: initialFrom ?? null } };
}

/** A proposal with one submitted version (a single consistent orbit block). */
async function submittedProposal(cast: Cast) {
  const { proposal } = await makeProposal({ cast });
  const proposer = asSessionUser(cast.proposer);
  await saveDraft(proposer, cast.board.id, proposal.id, {
    revision: 1,
    document: dossierDoc([orbitBlock("the parking orbit", { kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: 5677 } })]),
  });
  await submitProposal(proposer, cast.board.id, proposal.id);
  return proposal;
}

/** A confirmed text attachment on a fresh proposal of the cast's proposer. */
async function confirmedAttachment(cast: Cast) {
  const { proposal } = await makeProposal({ cast });
  const id = crypto.randomUUID();
  const objectKey = `boards/${cast.board.id}/proposals/${proposal.id}/attachments/${id}`;
  await writeObject(objectKey, "hello", "text/plain");
  await db()
    .insert(attachments)
    .values({
      id,
      proposalId: proposal.id,
      boardId: cast.board.id,
      objectKey,
      filename: "note.txt",
      declaredType: "text/plain",
      detectedType: "text/plain",
      declaredSize: 5,
      size: 5,
      sha256: crypto.createHash("sha256").update("hello").digest("hex"),
      status: "confirmed",
      confirmedAt: new Date(),
    });
  return { proposal, attachmentId: id };
}

async function pendingAttachment(cast: Cast) {
  const { proposal } = await makeProposal({ cast });
  const id = crypto.randomUUID();
  const objectKey = `boards/${cast.board.id}/proposals/${proposal.id}/attachments/${id}`;
  await writeObject(objectKey, "orbit notes\n", "text/plain");
  await db()
    .insert(attachments)
    .values({ id, proposalId: proposal.id, boardId: cast.board.id, objectKey, filename: "notes.txt", declaredType: "text/plain", declaredSize: 12 });
  return { proposal, attachmentId: id };
}

const board = (cast: Cast) => `/api/v1/boards/${cast.board.id}`;

const callBody = () => ({
  title: unique("Matrix call"),
  opensAt: new Date(Date.now() - 3600_000).toISOString(),
  closesAt: new Date(Date.now() + 86400_000).toISOString(),
  tolerance: { relative: 0.01 },
  requiredSections: [],
  reviewersPerProposal: 2,
});

const members: Record<MatrixRole, number | number[]> = { anonymous: 401, outsider: 404, proposer: 200, reviewer: 200, chair: 200, admin: 200 };
const chairOnly: Record<MatrixRole, number | number[]> = { anonymous: 401, outsider: 404, proposer: 403, reviewer: 403, chair: [200, 201], admin: [200, 201] };
const viewers: Record<MatrixRole, number | number[]> = { anonymous: 401, outsider: 404, proposer: 200, reviewer: 404, chair: 200, admin: 200 };
const authors: Record<MatrixRole, number | number[]> = { anonymous: 401, outsider: 404, proposer: 200, reviewer: 404, chair: 404, admin: 200 };

export const dossierRouteCases: RouteCase[] = [
  { operationId: "listCalls", prepare: async (cast) => ({ path: `${board(cast)}/calls` }), expect: members },
  { operationId: "createCall", prepare: async (cast) => ({ path: `${board(cast)}/calls`, body: callBody() }), expect: chairOnly },
  {
    operationId: "getCall",
    prepare: async (cast) => ({ path: `${board(cast)}/calls/${(await makeCall(cast)).id}` }),
    expect: members,
  },
  {
    operationId: "updateCall",
    prepare: async (cast) => ({ path: `${board(cast)}/calls/${(await makeCall(cast)).id}`, body: callBody() }),
    expect: { ...chairOnly, chair: 200, admin: 200 },
  },
  {
    operationId: "getCallTolerance",
    prepare: async (cast) => ({ path: `${board(cast)}/calls/${(await makeCall(cast)).id}/tolerance` }),
    expect: members,
  },
  {
    operationId: "updateCallTolerance",
    prepare: async (cast) => ({ path: `${board(cast)}/calls/${(await makeCall(cast)).id}/tolerance`, body: { relative: 0.0005, absolute: { deg: 0.02 } } }),
    expect: { ...chairOnly, chair: 200, admin: 200 },
  },
  { operationId: "listProposals", prepare: async (cast) => ({ path: `${board(cast)}/proposals`, query: { pageSize: "5" } }), expect: members },
  {
    operationId: "createProposal",
    prepare: async (cast) => ({
      path: `${board(cast)}/proposals`,
      body: { title: unique("Matrix proposal"), missionType: "science", callId: (await makeCall(cast)).id },
    }),
    expect: { anonymous: 401, outsider: 404, proposer: 201, reviewer: 403, chair: 403, admin: 201 },
  },
  {
    operationId: "getProposal",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await makeProposal({ cast })).proposal.id}` }),
    expect: viewers,
  },
  {
    operationId: "updateProposal",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await makeProposal({ cast })).proposal.id}`, body: { title: unique("Renamed") } }),
    expect: authors,
  },
  {
    operationId: "getDraft",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await makeProposal({ cast })).proposal.id}/draft` }),
    expect: authors,
  },
  {
    operationId: "saveDraft",
    prepare: async (cast) => ({
      path: `${board(cast)}/proposals/${(await makeProposal({ cast })).proposal.id}/draft`,
      body: { revision: 1, document: dossierDoc([{ type: "paragraph", content: [{ type: "text", text: "matrix" }] }]) },
    }),
    expect: authors,
  },
  {
    operationId: "submitProposal",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await makeProposal({ cast })).proposal.id}/submissions`, body: {} }),
    expect: { ...authors, proposer: 201, admin: 201 },
  },
  {
    operationId: "listVersions",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await submittedProposal(cast)).id}/versions` }),
    expect: viewers,
  },
  {
    operationId: "getVersion",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await submittedProposal(cast)).id}/versions/1` }),
    expect: viewers,
  },
  {
    operationId: "getVersionHtml",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await submittedProposal(cast)).id}/versions/1/html` }),
    expect: viewers,
  },
  {
    operationId: "listCheckResults",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await submittedProposal(cast)).id}/versions/1/check-results` }),
    expect: viewers,
  },
  {
    operationId: "rerunVersionWithTodaysRules",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await submittedProposal(cast)).id}/versions/1/todays-rules` }),
    expect: { anonymous: 401, outsider: 404, proposer: 403, reviewer: 404, chair: 200, admin: 200 },
  },
  {
    operationId: "listAttachments",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await makeProposal({ cast })).proposal.id}/attachments` }),
    expect: viewers,
  },
  {
    operationId: "presignAttachmentUpload",
    prepare: async (cast) => ({
      path: `${board(cast)}/proposals/${(await makeProposal({ cast })).proposal.id}/attachments`,
      body: { filename: "orbit.oem", contentType: "text/plain", size: 120 },
    }),
    expect: { ...authors, proposer: 201, admin: 201 },
  },
  {
    operationId: "confirmAttachment",
    prepare: async (cast) => ({ path: `${board(cast)}/attachments/${(await pendingAttachment(cast)).attachmentId}/confirm`, body: {} }),
    expect: authors,
  },
  {
    operationId: "downloadAttachment",
    prepare: async (cast) => ({ path: `${board(cast)}/attachments/${(await confirmedAttachment(cast)).attachmentId}/content` }),
    expect: { ...viewers, proposer: 302, chair: 302, admin: 302 },
  },
  {
    operationId: "deleteAttachment",
    prepare: async (cast) => ({ path: `${board(cast)}/attachments/${(await confirmedAttachment(cast)).attachmentId}` }),
    expect: authors,
  },
];

/** For tests that need the attachment row straight from the database. */
export async function attachmentRow(id: string) {
  const [row] = await db().select().from(attachments).where(eq(attachments.id, id));
  return row ?? null;
}
