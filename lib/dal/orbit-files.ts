import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import { db } from "@/db/client";
import { attachmentOrbitFiles, attachments } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/session";
import { notFound } from "@/lib/errors";
import { LIMITS, detectOrbitFormat, parseOrbitFile, type OrbitFile } from "@/lib/orbit-files";
import { summarizeOrbitFile, type OrbitSummary } from "@/lib/orbit-files/summary";
import { readObjectStream } from "@/storage/object-store";
import { isUuid } from "./boards";
import { proposalFor } from "./proposals";

export interface OrbitFileView {
  attachmentId: string;
  proposalId: string;
  filename: string;
  sha256: string;
  status: "parsed" | "unparsed";
  format: string | null;
  error: { line: number | null; message: string } | null;
  file: OrbitFile | null;
  summaries: OrbitSummary[];
  parsedAt: string;
}

/** Reads at most `max` bytes of an object (more means the parser would refuse it anyway). */
async function readTextCapped(objectKey: string, max: number): Promise<{ text: string; truncated: boolean }> {
  const chunks: Buffer[] = [];
  let total = 0;
  const stream = await readObjectStream(objectKey);
  for await (const chunk of stream) {
    const buf = Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk as Uint8Array);
    chunks.push(buf);
    total += buf.length;
    if (total > max) {
      stream.destroy();
      return { text: "", truncated: true };
    }
  }
  return { text: Buffer.concat(chunks).toString("utf8"), truncated: false };
}

const ORBIT_ENDINGS = [".oem", ".opm", ".omm", ".kvn", ".tle", ".3le", ".xml"];

/**
 * Parses a confirmed text attachment as an orbit file and stores the outcome beside it.
 * Files that neither look like an orbit file nor carry an orbit file's ending get no row.
 * Never throws: an unreadable object is logged and left unparsed.
 */
export async function recordOrbitFile(input: {
  attachmentId: string;
  boardId: string;
  objectKey: string;
  sha256: string;
  filename: string;
}): Promise<OrbitFileView["status"] | null> {
  try {
    const { text, truncated } = await readTextCapped(input.objectKey, LIMITS.maxChars);
    const ending = input.filename.slice(input.filename.lastIndexOf(".")).toLowerCase();
    const detected = truncated ? null : detectOrbitFormat(text);
    if (!detected && !ORBIT_ENDINGS.includes(ending)) return null;
    const outcome = truncated
      ? ({ ok: false, error: { line: null, message: `the file is larger than ${LIMITS.maxChars} bytes; orbit files are read up to that size` } } as const)
      : parseOrbitFile(text);
    const values = outcome.ok
      ? {
          status: "parsed" as const,
          format: outcome.file.format,
          parsed: outcome.file as unknown as Record<string, unknown>,
          summaries: summarizeOrbitFile(outcome.file) as unknown as Record<string, unknown>[],
          errorLine: null,
          error: null,
        }
      : {
          status: "unparsed" as const,
          format: detected?.format ?? null,
          parsed: null,
          summaries: null,
          errorLine: outcome.error.line,
          error: outcome.error.message,
        };
    await db()
      .insert(attachmentOrbitFiles)
      .values({ attachmentId: input.attachmentId, boardId: input.boardId, sha256: input.sha256, ...values })
      .onConflictDoUpdate({ target: attachmentOrbitFiles.attachmentId, set: { sha256: input.sha256, ...values, parsedAt: new Date() } });
    return values.status;
  } catch (error) {
    console.error("[orbit-files] could not parse attachment", input.attachmentId, error);
    return null;
  }
}

const viewColumns = {
  attachmentId: attachmentOrbitFiles.attachmentId,
  proposalId: attachments.proposalId,
  filename: attachments.filename,
  attachmentStatus: attachments.status,
  sha256: attachmentOrbitFiles.sha256,
  status: attachmentOrbitFiles.status,
  format: attachmentOrbitFiles.format,
  parsed: attachmentOrbitFiles.parsed,
  summaries: attachmentOrbitFiles.summaries,
  errorLine: attachmentOrbitFiles.errorLine,
  error: attachmentOrbitFiles.error,
  parsedAt: attachmentOrbitFiles.parsedAt,
};

type ViewRow = { [K in keyof typeof viewColumns]: (typeof viewColumns)[K]["_"]["data"] | null };

function toView(row: ViewRow): OrbitFileView {
  return {
    attachmentId: row.attachmentId!,
    proposalId: row.proposalId!,
    filename: row.filename!,
    sha256: row.sha256!,
    status: row.status!,
    format: row.format,
    error: row.status === "unparsed" ? { line: row.errorLine, message: row.error ?? "the file could not be read" } : null,
    file: (row.parsed as unknown as OrbitFile | null) ?? null,
    summaries: (row.summaries as unknown as OrbitSummary[] | null) ?? [],
    parsedAt: row.parsedAt!.toISOString(),
  };
}

/** The parsed orbit of one attachment the caller may see (404 when it is no orbit file). */
export async function getOrbitFile(user: SessionUser, boardId: string, attachmentId: string): Promise<OrbitFileView> {
  if (!isUuid(boardId) || !isUuid(attachmentId)) throw notFound("That orbit file");
  const [row] = await db()
    .select(viewColumns)
    .from(attachmentOrbitFiles)
    .innerJoin(attachments, eq(attachments.id, attachmentOrbitFiles.attachmentId))
    .where(and(eq(attachmentOrbitFiles.boardId, boardId), eq(attachments.boardId, boardId), eq(attachmentOrbitFiles.attachmentId, attachmentId)))
    .limit(1);
  if (!row) {
    // Same answer for a hidden attachment and one that is not an orbit file, after the proposal check when the attachment exists.
    const [a] = await db()
      .select({ proposalId: attachments.proposalId })
      .from(attachments)
      .where(and(eq(attachments.boardId, boardId), eq(attachments.id, attachmentId)))
      .limit(1);
    if (a) await proposalFor(user, boardId, a.proposalId, "proposal.view");
    throw notFound("That orbit file");
  }
  await proposalFor(user, boardId, row.proposalId!, "proposal.view");
  if (row.attachmentStatus === "pending") throw notFound("That orbit file");
  return toView(row as ViewRow);
}

/** Orbit files among the given attachments of one proposal (already authorized by the caller's listing). */
export async function orbitFilesOfProposal(user: SessionUser, boardId: string, proposalId: string, attachmentIds?: string[]): Promise<OrbitFileView[]> {
  await proposalFor(user, boardId, proposalId, "proposal.view");
  const rows = await db()
    .select(viewColumns)
    .from(attachmentOrbitFiles)
    .innerJoin(attachments, eq(attachments.id, attachmentOrbitFiles.attachmentId))
    .where(
      and(
        eq(attachmentOrbitFiles.boardId, boardId),
        eq(attachments.boardId, boardId),
        eq(attachments.proposalId, proposalId),
        eq(attachments.status, "confirmed"),
        ...(attachmentIds ? [inArray(attachments.id, attachmentIds.filter(isUuid))] : []),
      ),
    );
  return rows.map((r) => toView(r as ViewRow));
}
