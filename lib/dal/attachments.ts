import "server-only";
import crypto from "node:crypto";
import { and, asc, eq, inArray, lt, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { attachments, proposalVersions } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/session";
import { attachmentContentPath } from "@/lib/dossier/schema";
import { env } from "@/lib/env";
import { conflict, notFound, unprocessable } from "@/lib/errors";
import { ATTACHMENT_TYPES, type PresignUploadInput } from "@/lib/validation/dossier";
import { copyObject, deleteObject, presignDownload, presignUpload, readObjectHead, readObjectStream, statObjectOrNull } from "@/storage/object-store";
import { recordAudit } from "./audit";
import { recordOrbitFile } from "./orbit-files";
import { isUuid } from "./boards";
import { editableState, proposalFor, readableVersionIds } from "./proposals";

/**
 * Presigned upload URLs live this long; the browser starts the PUT right away. They point at
 * a staging key only: confirm copies the object to its final key, for which no URL exists.
 */
export const UPLOAD_URL_SECONDS = 5 * 60;
/** Pending uploads older than this are removed (object and row). */
export const UNCONFIRMED_UPLOAD_MAX_AGE_MS = 60 * 60 * 1000;

export interface AttachmentView {
  id: string;
  proposalId: string;
  filename: string;
  contentType: string;
  size: number | null;
  sha256: string | null;
  status: "pending" | "confirmed" | "removed";
  textKind: string | null;
  createdAt: string;
  contentPath: string;
}

const attachmentColumns = {
  id: attachments.id,
  proposalId: attachments.proposalId,
  boardId: attachments.boardId,
  objectKey: attachments.objectKey,
  filename: attachments.filename,
  declaredType: attachments.declaredType,
  detectedType: attachments.detectedType,
  declaredSize: attachments.declaredSize,
  size: attachments.size,
  sha256: attachments.sha256,
  status: attachments.status,
  createdAt: attachments.createdAt,
};

type AttachmentRow = {
  id: string;
  proposalId: string;
  boardId: string;
  objectKey: string;
  filename: string;
  declaredType: string;
  detectedType: string | null;
  declaredSize: number;
  size: number | null;
  sha256: string | null;
  status: "pending" | "confirmed" | "removed";
  createdAt: Date;
};

function toView(row: AttachmentRow, textKind: string | null = null): AttachmentView {
  return {
    id: row.id,
    proposalId: row.proposalId,
    filename: row.filename,
    contentType: row.detectedType ?? row.declaredType,
    size: row.size ?? row.declaredSize,
    sha256: row.sha256,
    status: row.status,
    textKind,
    createdAt: row.createdAt.toISOString(),
    contentPath: attachmentContentPath(row.boardId, row.id),
  };
}

export function uploadMaxBytes(): number {
  return env().UPLOAD_MAX_BYTES;
}

function formatBytes(n: number): string {
  if (n >= 1024 * 1024) return `${(n / 1024 / 1024).toFixed(n % (1024 * 1024) === 0 ? 0 : 1)} MB`;
  if (n >= 1024) return `${(n / 1024).toFixed(0)} KB`;
  return `${n} bytes`;
}

function extensionOf(filename: string): string {
  const i = filename.lastIndexOf(".");
  return i >= 0 ? filename.slice(i).toLowerCase() : "";
}

const ALLOWED_DESCRIPTION = "PDF, PNG, JPEG, CSV or plain text (including CCSDS OEM/OPM/OMM messages, in KVN or XML, and two-line element sets)";

/** Checks a declared file against the allow-list and the cap; returns the normalised type. */
export function checkDeclaredFile(input: PresignUploadInput, maxBytes = uploadMaxBytes()): string {
  const type = input.contentType.split(";")[0]!.trim().toLowerCase();
  const endings = ATTACHMENT_TYPES[type];
  if (!endings) throw unprocessable(`Files of type "${type || "unknown"}" cannot be attached. Attach ${ALLOWED_DESCRIPTION}.`, { field: "contentType" });
  const ext = extensionOf(input.filename);
  if (!endings.includes(ext)) {
    throw unprocessable(`"${input.filename}" does not end in ${endings.join(", ")} as a ${type} file should. Rename it or attach it as the right type.`, {
      field: "filename",
    });
  }
  if (input.size > maxBytes)
    throw unprocessable(`"${input.filename}" is ${formatBytes(input.size)}; attachments are limited to ${formatBytes(maxBytes)}.`, { field: "size", maxBytes });
  return type;
}

export function attachmentObjectKey(boardId: string, proposalId: string, id: string): string {
  return `boards/${boardId}/proposals/${proposalId}/attachments/${id}`;
}

/**
 * Where the browser PUTs an upload before it is confirmed. Presigned URLs are only ever
 * issued for this key; the final key (attachmentObjectKey) is written by the server alone.
 */
export function stagingObjectKey(finalKey: string): string {
  return `staging/${finalKey}`;
}

/**
 * Registers a pending upload and returns a short-lived presigned PUT URL for it. Only an
 * author of an editable proposal gets one; the server names the object key.
 */
export async function presignAttachmentUpload(
  user: SessionUser,
  boardId: string,
  proposalId: string,
  input: PresignUploadInput,
): Promise<{ attachment: AttachmentView; uploadUrl: string; method: "PUT"; headers: Record<string, string>; expiresAt: string }> {
  const { proposal } = await proposalFor(user, boardId, proposalId, "proposal.edit");
  const state = await editableState(proposal);
  if (!state.editable) throw conflict(state.reason ?? "This proposal cannot be changed now.");
  const type = checkDeclaredFile(input);
  // Opportunistic housekeeping: old unconfirmed uploads go whenever someone starts a new one.
  void cleanUpUnconfirmedUploads(new Date(Date.now() - UNCONFIRMED_UPLOAD_MAX_AGE_MS)).catch((error) => console.error("[attachments] cleanup failed", error));
  const id = crypto.randomUUID();
  const objectKey = attachmentObjectKey(boardId, proposalId, id);
  const [row] = await db()
    .insert(attachments)
    .values({ id, proposalId, boardId, objectKey, filename: input.filename, declaredType: type, declaredSize: input.size, uploadedBy: user.id })
    .returning(attachmentColumns);
  const uploadUrl = await presignUpload(stagingObjectKey(objectKey), UPLOAD_URL_SECONDS);
  return {
    attachment: toView(row!),
    uploadUrl,
    method: "PUT",
    headers: { "Content-Type": type },
    expiresAt: new Date(Date.now() + UPLOAD_URL_SECONDS * 1000).toISOString(),
  };
}

const MAGIC: { type: string; bytes: number[] }[] = [
  { type: "application/pdf", bytes: [0x25, 0x50, 0x44, 0x46, 0x2d] }, // %PDF-
  { type: "image/png", bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] },
  { type: "image/jpeg", bytes: [0xff, 0xd8, 0xff] },
];

/** The binary type the first bytes announce, or null (then it may be text). */
export function sniffBinaryType(head: Uint8Array): string | null {
  for (const m of MAGIC) if (m.bytes.every((b, i) => head[i] === b)) return m.type;
  return null;
}

/** What kind of orbit text a plain-text file holds, from its first lines (for display). */
export function textKindOf(head: string): string | null {
  const start = head.replace(/^\uFEFF/, "").trimStart();
  const ccsds = /^CCSDS_(OEM|OPM|OMM)_VERS\s*=/.exec(start);
  if (ccsds) return `CCSDS ${ccsds[1]}`;
  const lines = start.split(/\r?\n/).map((l) => l.trimEnd());
  const tleAt = lines.findIndex((l) => /^1 [0-9A-Z ]{5}[A-Z ] /.test(l));
  if (tleAt >= 0 && /^2 [0-9A-Z ]{5} /.test(lines[tleAt + 1] ?? "")) return "two-line element set";
  return null;
}

const HEAD_BYTES = 4096;

/** The type the stored object gets and the download announces: sniffed, never the PUT header. */
function storedContentType(sniffedBinary: string | null, declaredType: string): string {
  if (sniffedBinary) return sniffedBinary;
  return declaredType.startsWith("text/") ? `${declaredType}; charset=utf-8` : "application/octet-stream";
}

/** What confirm learned from the final object; orbit-file parsing can build on it. */
export interface InspectedObject {
  objectKey: string;
  size: number;
  sha256: string;
  detectedType: string;
  head: Buffer;
  isText: boolean;
}

/**
 * Confirms an upload. The browser PUT it to a staging key; the server copies it to the final
 * key (no URL was ever issued for that one), deletes the staging object, and then checks only
 * the final object: within the cap and the declared size, bytes of the declared type (magic
 * numbers for PDF/PNG/JPEG; valid UTF-8 without NUL for text). Records size, sniffed type and
 * SHA-256 of the final object; otherwise deletes both objects and the row and answers 422.
 */
export async function confirmAttachment(
  user: SessionUser,
  boardId: string,
  attachmentId: string,
  options: { maxBytes?: number } = {},
): Promise<AttachmentView> {
  const row = await loadAttachment(boardId, attachmentId);
  if (!row || row.status === "removed") throw notFound("That attachment");
  await proposalFor(user, boardId, row.proposalId, "proposal.edit");
  if (row.status === "confirmed") return toView(row);
  const maxBytes = options.maxBytes ?? uploadMaxBytes();
  const stagingKey = stagingObjectKey(row.objectKey);

  const reject = async (message: string, details?: unknown): Promise<never> => {
    await deleteObject(stagingKey).catch(() => undefined);
    await deleteObject(row.objectKey).catch(() => undefined);
    await db().transaction(async (tx) => {
      await tx.delete(attachments).where(and(eq(attachments.id, row.id), eq(attachments.boardId, boardId)));
      await recordAudit(
        {
          action: "attachment.reject",
          actorId: user.id,
          actorEmail: user.email,
          boardId,
          target: row.id,
          details: { filename: row.filename, reason: message },
        },
        tx,
      );
    });
    throw unprocessable(message, details);
  };

  // 1. Move the upload out of reach: server-side copy to the final key, then drop the staging
  //    object. A confirm interrupted after the copy finds the final object and carries on.
  const staged = await statObjectOrNull(stagingKey);
  if (staged) {
    if (staged.size > maxBytes)
      await reject(`"${row.filename}" is ${formatBytes(staged.size)}; attachments are limited to ${formatBytes(maxBytes)}. It was removed.`, {
        size: staged.size,
        maxBytes,
      });
    const stagedHead = await readObjectHead(stagingKey, Math.min(HEAD_BYTES, staged.size));
    await copyObject(stagingKey, row.objectKey, storedContentType(sniffBinaryType(stagedHead), row.declaredType));
    await deleteObject(stagingKey).catch((error) => console.error("[attachments] could not delete staging object", stagingKey, error));
  }
  const stat = await statObjectOrNull(row.objectKey);
  if (!stat) throw unprocessable(`"${row.filename}" has not arrived in storage yet. Upload it again (retry), then confirm.`);

  // 2. Hash and sniff the final object: the only bytes the record will describe.
  const inspected = await inspectFinalObject(row, stat.size, maxBytes, reject);

  // 3. The final object is known and checked here (inspected.objectKey, .detectedType, .head):
  //    further checks of its content belong at this point, before the row is confirmed.

  // The row and its audit event commit together.
  const updated = await db().transaction(async (tx) => {
    const [confirmed] = await tx
      .update(attachments)
      .set({ status: "confirmed", size: inspected.size, sha256: inspected.sha256, detectedType: inspected.detectedType, confirmedAt: new Date() })
      .where(and(eq(attachments.id, row.id), eq(attachments.boardId, boardId), eq(attachments.status, "pending")))
      .returning(attachmentColumns);
    if (confirmed)
      await recordAudit(
        {
          action: "attachment.confirm",
          actorId: user.id,
          actorEmail: user.email,
          boardId,
          target: row.id,
          details: { filename: row.filename, size: inspected.size, sha256: inspected.sha256 },
        },
        tx,
      );
    return confirmed;
  });
  if (!updated) {
    const again = await loadAttachment(boardId, attachmentId);
    if (again?.status === "confirmed") return toView(again);
    throw notFound("That attachment");
  }
  // Orbit files (element sets, CCSDS OPM/OMM/OEM) are parsed now; the attachment stays even when unparsed.
  if (inspected.isText)
    await recordOrbitFile({ attachmentId: row.id, boardId, objectKey: updated.objectKey, sha256: inspected.sha256, filename: row.filename });
  return toView(updated, inspected.isText ? textKindOf(inspected.head.toString("utf8")) : null);
}

/** Size, type and SHA-256 of the final object in one pass; `reject` (which throws) otherwise. */
async function inspectFinalObject(
  row: AttachmentRow,
  size: number,
  maxBytes: number,
  reject: (message: string, details?: unknown) => Promise<never>,
): Promise<InspectedObject> {
  if (size > maxBytes)
    await reject(`"${row.filename}" is ${formatBytes(size)}; attachments are limited to ${formatBytes(maxBytes)}. It was removed.`, {
      size,
      maxBytes,
    });
  if (size !== row.declaredSize)
    await reject(`"${row.filename}" is ${size} bytes but was declared as ${row.declaredSize}. It was removed; upload it again.`, { size });

  const head = await readObjectHead(row.objectKey, Math.min(HEAD_BYTES, size));
  const binary = sniffBinaryType(head);
  const isText = row.declaredType.startsWith("text/");
  if (!isText && binary !== row.declaredType) {
    await reject(
      `"${row.filename}" was declared as ${row.declaredType} but its content is ${binary ?? "not a file of that type"}. It was removed; attach the real file.`,
      { declaredType: row.declaredType, detectedType: binary },
    );
  }
  if (isText && binary)
    await reject(`"${row.filename}" was declared as text but its content is ${binary}. It was removed.`, {
      declaredType: row.declaredType,
      detectedType: binary,
    });

  // One pass over the whole object: SHA-256, and for text files UTF-8 validity and no NUL.
  const hash = crypto.createHash("sha256");
  const decoder = new TextDecoder("utf-8", { fatal: true });
  let textProblem: string | null = null;
  let total = 0;
  for await (const chunk of await readObjectStream(row.objectKey)) {
    const buf = Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk as Uint8Array);
    total += buf.length;
    hash.update(buf);
    if (isText && !textProblem) {
      if (buf.includes(0)) textProblem = "contains NUL bytes (it is a binary file)";
      else {
        try {
          decoder.decode(buf, { stream: true });
        } catch {
          textProblem = "is not valid UTF-8 text";
        }
      }
    }
  }
  if (isText && !textProblem) {
    try {
      decoder.decode();
    } catch {
      textProblem = "is not valid UTF-8 text";
    }
  }
  if (textProblem) await reject(`"${row.filename}" was declared as text but ${textProblem}. It was removed.`, { declaredType: row.declaredType });
  if (total !== size) await reject(`"${row.filename}" changed while it was checked. It was removed; upload it again.`);
  return { objectKey: row.objectKey, size, sha256: hash.digest("hex"), detectedType: binary ?? row.declaredType, head, isText };
}

async function loadAttachment(boardId: string, attachmentId: string): Promise<AttachmentRow | null> {
  if (!isUuid(boardId) || !isUuid(attachmentId)) return null;
  const [row] = await db()
    .select(attachmentColumns)
    .from(attachments)
    .where(and(eq(attachments.boardId, boardId), eq(attachments.id, attachmentId)))
    .limit(1);
  return row ?? null;
}

/** Confirmed attachments of a proposal (and the caller's pending ones when they may edit). */
export async function listAttachments(user: SessionUser, boardId: string, proposalId: string): Promise<AttachmentView[]> {
  const { proposal, facts } = await proposalFor(user, boardId, proposalId, "proposal.view");
  // A reviewer limited to their assigned versions sees only the files those versions list.
  const readable = await readableVersionIds(user, proposal, facts);
  if (readable) {
    const listed = await attachmentIdsOfVersions(proposalId, readable);
    const rows = await db()
      .select(attachmentColumns)
      .from(attachments)
      .where(and(eq(attachments.boardId, boardId), eq(attachments.proposalId, proposalId)))
      .orderBy(asc(attachments.createdAt));
    return rows.filter((r) => r.status !== "pending" && listed.has(r.id)).map((r) => toView(r));
  }
  const rows = await db()
    .select(attachmentColumns)
    .from(attachments)
    .where(and(eq(attachments.boardId, boardId), eq(attachments.proposalId, proposalId), eq(attachments.status, "confirmed")))
    .orderBy(asc(attachments.createdAt));
  return rows.map((r) => toView(r));
}

/**
 * A short-lived presigned GET (Content-Disposition: attachment) for an attachment the caller
 * may see: confirmed ones of proposals they may view, including ones kept only by a version.
 */
export async function attachmentDownloadUrl(user: SessionUser, boardId: string, attachmentId: string): Promise<string> {
  const row = await loadAttachment(boardId, attachmentId);
  if (!row) throw notFound("That attachment");
  const { proposal, facts } = await proposalFor(user, boardId, row.proposalId, "proposal.view");
  if (row.status === "pending") throw notFound("That attachment");
  const readable = await readableVersionIds(user, proposal, facts);
  if (readable && !(await attachmentIdsOfVersions(row.proposalId, readable)).has(row.id)) throw notFound("That attachment");
  if (row.status === "removed" && !(await referencedByVersion(row))) throw notFound("That attachment");
  const sniffed = row.detectedType;
  const type = !sniffed ? "application/octet-stream" : sniffed.startsWith("text/") ? `${sniffed}; charset=utf-8` : sniffed;
  return presignDownload(row.objectKey, row.filename, 300, type);
}

/** The attachment ids the given versions of a proposal list. */
async function attachmentIdsOfVersions(proposalId: string, versionIds: Set<string>): Promise<Set<string>> {
  if (versionIds.size === 0) return new Set();
  const rows = await db()
    .select({ attachments: proposalVersions.attachments })
    .from(proposalVersions)
    .where(and(eq(proposalVersions.proposalId, proposalId), inArray(proposalVersions.id, [...versionIds])));
  return new Set(rows.flatMap((r) => r.attachments.map((a) => a.attachmentId)));
}

async function referencedByVersion(row: AttachmentRow): Promise<boolean> {
  const [hit] = await db()
    .select({ id: proposalVersions.id })
    .from(proposalVersions)
    .where(and(eq(proposalVersions.proposalId, row.proposalId), sql`${proposalVersions.attachments} @> ${JSON.stringify([{ attachmentId: row.id }])}::jsonb`))
    .limit(1);
  return Boolean(hit);
}

/**
 * Removes an attachment from the draft. Its object stays when a submitted version lists it
 * (versions are immutable); otherwise object and row both go.
 */
export async function deleteAttachment(user: SessionUser, boardId: string, attachmentId: string): Promise<{ removed: true }> {
  const row = await loadAttachment(boardId, attachmentId);
  if (!row || row.status === "removed") throw notFound("That attachment");
  const { proposal } = await proposalFor(user, boardId, row.proposalId, "proposal.edit");
  const state = await editableState(proposal);
  if (!state.editable) throw conflict(state.reason ?? "This proposal cannot be changed now.");
  const referenced = await referencedByVersion(row);
  // The row change and its audit event commit together; the object goes only after that.
  await db().transaction(async (tx) => {
    if (referenced)
      await tx
        .update(attachments)
        .set({ status: "removed" })
        .where(and(eq(attachments.id, row.id), eq(attachments.boardId, boardId)));
    else await tx.delete(attachments).where(and(eq(attachments.id, row.id), eq(attachments.boardId, boardId)));
    await recordAudit(
      { action: "attachment.remove", actorId: user.id, actorEmail: user.email, boardId, target: row.id, details: { filename: row.filename } },
      tx,
    );
  });
  if (!referenced) await deleteObject(row.objectKey).catch(() => undefined);
  return { removed: true };
}

/**
 * Deletes uploads never confirmed and created before `olderThan`: the object (if it arrived)
 * and the row. Called opportunistically when uploads start; returns how many went.
 */
export async function cleanUpUnconfirmedUploads(olderThan: Date): Promise<number> {
  const stale = await db()
    .select({ id: attachments.id, objectKey: attachments.objectKey })
    .from(attachments)
    .where(and(eq(attachments.status, "pending"), lt(attachments.createdAt, olderThan)))
    .limit(500);
  let removed = 0;
  for (const a of stale) {
    await deleteObject(stagingObjectKey(a.objectKey)).catch(() => undefined);
    try {
      await deleteObject(a.objectKey);
    } catch (error) {
      const code = (error as { code?: string }).code;
      if (code !== "NoSuchKey" && code !== "NotFound") {
        console.error("[attachments] could not delete", a.objectKey, error);
        continue;
      }
    }
    const deleted = await db()
      .delete(attachments)
      .where(and(eq(attachments.id, a.id), eq(attachments.status, "pending")))
      .returning({ id: attachments.id });
    removed += deleted.length;
  }
  await removeLateStagingObjects(olderThan);
  return removed;
}

/**
 * A PUT URL can still be used after its upload was confirmed (until it expires). Such late
 * staging objects are never read; this removes them for uploads started in the two hours before
 * `olderThan` (their URLs have long expired).
 */
async function removeLateStagingObjects(olderThan: Date): Promise<void> {
  const rows = await db()
    .select({ objectKey: attachments.objectKey })
    .from(attachments)
    .where(
      and(
        sql`${attachments.status} <> 'pending'`,
        lt(attachments.createdAt, olderThan),
        sql`${attachments.createdAt} > ${new Date(olderThan.getTime() - 2 * 3600_000)}`,
      ),
    )
    .limit(200);
  for (const r of rows) await deleteObject(stagingObjectKey(r.objectKey)).catch(() => undefined);
}
