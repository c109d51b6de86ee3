import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { attachmentOrbitFiles, attachments, checkResults } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/session";
import { notFound, unprocessable } from "@/lib/errors";
import { extractOrbitChecks } from "@/lib/dossier/claims";
import { opmForBlock } from "@/lib/orbit-files/export-opm";
import { LIMITS, detectOrbitFormat, parseOrbitFile, type OrbitFile } from "@/lib/orbit-files";
import { FILE_QUESTION, compareFilesWithText, type ComparedBlock, type FileComparison, type LinkedFile } from "@/lib/orbit-files/compare";
import { effectiveFileTolerance, type FileComparisonTolerance } from "@/lib/orbit-files/tolerance";
import { summarizeOrbitFile, type OrbitSummary } from "@/lib/orbit-files/summary";
import { readObjectStream } from "@/storage/object-store";
import { isUuid } from "./boards";
import { getDraft, getVersion, proposalFor } from "./proposals";

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

/** Orbit files of a proposal's confirmed attachments, for comparisons (no authorization: callers have checked). */
async function linkedFiles(tx: Database | Transaction, boardId: string, proposalId: string): Promise<LinkedFile[]> {
  const rows = await tx
    .select(viewColumns)
    .from(attachmentOrbitFiles)
    .innerJoin(attachments, eq(attachments.id, attachmentOrbitFiles.attachmentId))
    .where(
      and(
        eq(attachmentOrbitFiles.boardId, boardId),
        eq(attachments.boardId, boardId),
        eq(attachments.proposalId, proposalId),
        eq(attachments.status, "confirmed"),
      ),
    );
  return rows.map((r) => {
    const v = toView(r as ViewRow);
    return { attachmentId: v.attachmentId, filename: v.filename, sha256: v.sha256, format: v.format, status: v.status, error: v.error, summaries: v.summaries };
  });
}

/** Stored check results of file comparisons use block ids of this form (never a uuid, so never a block's). */
export function fileComparisonBlockId(blockId: string, attachmentId: string | null): string {
  return `file:${blockId}:${attachmentId ?? "missing"}`;
}

/**
 * The file against the text at submission: compares every named, linked orbit of the
 * version with its orbit files under the call's file-comparison tolerance and stores each
 * comparison as a check result (kind "fileAgainstText"), so disagreements count and show as
 * flags wherever the server's other flags do. Runs in the submission's transaction.
 */
export async function recordFileComparisons(
  tx: Transaction,
  input: { versionId: string; boardId: string; proposalId: string; blocks: ComparedBlock[]; fileTolerance: Partial<FileComparisonTolerance> | null },
): Promise<FileComparison[]> {
  const files = await linkedFiles(tx, input.boardId, input.proposalId);
  const tolerance = effectiveFileTolerance(input.fileTolerance);
  const comparisons = compareFilesWithText(input.blocks, files, tolerance);
  if (comparisons.length > 0) {
    await tx.insert(checkResults).values(
      comparisons.map((c) => ({
        versionId: input.versionId,
        boardId: input.boardId,
        blockId: fileComparisonBlockId(c.blockId, c.attachmentId),
        label: `${c.label} against ${c.filename}`,
        kind: "fileAgainstText",
        status: c.status,
        claim: { blockId: c.blockId, attachmentId: c.attachmentId, filename: c.filename, tolerance } as Record<string, unknown>,
        result: {
          id: c.blockId,
          kind: "fileAgainstText",
          question: FILE_QUESTION,
          status: c.status,
          computed: {},
          checks: c.rows.map((r) => ({
            quantity: r.quantity,
            claimed: r.text,
            computed: r.file,
            unit: r.unit,
            relativeError: r.text !== 0 ? Math.abs(r.difference / r.text) : null,
            absoluteError: Math.abs(r.difference),
            ok: r.ok,
          })),
          messages: c.messages,
        } as Record<string, unknown>,
      })),
    );
  }
  return comparisons;
}

/**
 * A block's orbit as a CCSDS OPM (KVN): from the draft (authors) or a submitted version
 * (anyone who may view the proposal). The epoch is the linked file's, when the block was
 * made from one.
 */
export async function exportBlockOpm(
  user: SessionUser,
  boardId: string,
  proposalId: string,
  where: { version: number | null; blockId: string },
): Promise<{ text: string; filename: string }> {
  const document =
    where.version === null ? (await getDraft(user, boardId, proposalId)).document : (await getVersion(user, boardId, proposalId, where.version)).document;
  const block = extractOrbitChecks(document).find((b) => b.blockId === where.blockId);
  if (!block) throw notFound("That orbit-check block");
  let epochIso: string | null = null;
  let timeSystem: string | undefined;
  if (block.source) {
    const files = await linkedFiles(db(), boardId, proposalId);
    const file = files.find((f) => f.attachmentId === block.source!.attachmentId);
    const summary = file?.summaries[block.source.index] ?? null;
    if (summary) {
      epochIso = summary.epoch;
      timeSystem = summary.timeSystem;
    }
  }
  const out = opmForBlock(block, { epochIso, timeSystem });
  if (!out.ok) throw unprocessable(`This block cannot be exported as an OPM: ${out.error}.`);
  return { text: out.text, filename: out.filename };
}
