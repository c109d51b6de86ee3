import "server-only";
import { and, asc, desc, eq } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { calls, type FileTolerancePolicy, type TolerancePolicy } from "@/db/schema";
import { authorize } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { notFound } from "@/lib/errors";
import { recordAudit } from "./audit";
import { boardRole, isUuid } from "./boards";
import type { CallInput } from "@/lib/validation/dossier";
import { effectiveFileTolerance } from "@/lib/orbit-files/tolerance";

export type CallState = "upcoming" | "open" | "closed";

export interface CallView {
  id: string;
  boardId: string;
  title: string;
  description: string;
  opensAt: string;
  closesAt: string;
  tolerance: TolerancePolicy;
  /** Bounds for comparing attached orbit files with the text (the defaults unless the chair set them). */
  fileTolerance: FileTolerancePolicy;
  fileToleranceIsDefault: boolean;
  requiredSections: string[];
  reviewersPerProposal: number;
  rubricTemplateId: string | null;
  state: CallState;
}

const callColumns = {
  id: calls.id,
  boardId: calls.boardId,
  title: calls.title,
  description: calls.description,
  opensAt: calls.opensAt,
  closesAt: calls.closesAt,
  tolerance: calls.tolerance,
  fileTolerance: calls.fileTolerance,
  requiredSections: calls.requiredSections,
  reviewersPerProposal: calls.reviewersPerProposal,
  rubricTemplateId: calls.rubricTemplateId,
};

type CallRow = { opensAt: Date; closesAt: Date; fileTolerance: FileTolerancePolicy | null } & Omit<
  CallView,
  "opensAt" | "closesAt" | "state" | "fileTolerance" | "fileToleranceIsDefault"
>;

export function callState(call: { opensAt: Date; closesAt: Date }, now = new Date()): CallState {
  if (now.getTime() < call.opensAt.getTime()) return "upcoming";
  if (now.getTime() >= call.closesAt.getTime()) return "closed";
  return "open";
}

function toView(row: CallRow): CallView {
  return {
    ...row,
    opensAt: row.opensAt.toISOString(),
    closesAt: row.closesAt.toISOString(),
    fileTolerance: effectiveFileTolerance(row.fileTolerance),
    fileToleranceIsDefault: row.fileTolerance === null,
    state: callState(row),
  };
}

/** Loads a call of a board without any policy check (callers check first). */
export async function loadCall(boardId: string, callId: string, tx: Database | Transaction = db()): Promise<CallRow | null> {
  if (!isUuid(boardId) || !isUuid(callId)) return null;
  const [row] = await tx
    .select(callColumns)
    .from(calls)
    .where(and(eq(calls.boardId, boardId), eq(calls.id, callId)))
    .limit(1);
  return row ?? null;
}

/** Calls of a board, newest closing date first; any member may see them. */
export async function listCalls(user: SessionUser, boardId: string): Promise<CallView[]> {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId);
  authorize(user, "board.view", { role }, "That board");
  const rows = await db().select(callColumns).from(calls).where(eq(calls.boardId, boardId)).orderBy(desc(calls.closesAt), asc(calls.title));
  return rows.map(toView);
}

export async function getCall(user: SessionUser, boardId: string, callId: string): Promise<CallView> {
  const role = await boardRole(user.id, boardId);
  authorize(user, "board.view", { role }, "That board");
  const row = await loadCall(boardId, callId);
  if (!row) throw notFound("That call");
  return toView(row);
}

function uniqueSections(sections: string[]): string[] {
  const seen = new Set<string>();
  return sections.filter((s) => {
    const k = s.trim().toLowerCase();
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}

export async function createCall(user: SessionUser, boardId: string, input: CallInput): Promise<CallView> {
  const role = await boardRole(user.id, boardId);
  authorize(user, "call.manage", { role }, "That board");
  return db().transaction(async (tx) => {
    const [row] = await tx
      .insert(calls)
      .values({ boardId, ...callValues(input) })
      .returning(callColumns);
    await recordAudit({ action: "call.create", actorId: user.id, actorEmail: user.email, boardId, target: row!.id, details: { title: input.title } }, tx);
    return toView(row!);
  });
}

/** The columns a call form sets, on create and on update alike. */
function callValues(input: CallInput) {
  return {
    title: input.title,
    description: input.description,
    opensAt: input.opensAt,
    closesAt: input.closesAt,
    tolerance: input.tolerance,
    requiredSections: uniqueSections(input.requiredSections),
    reviewersPerProposal: input.reviewersPerProposal,
    // Absent: left as it is; null: back to the product's defaults.
    ...(input.fileTolerance !== undefined ? { fileTolerance: input.fileTolerance } : {}),
  };
}

export async function updateCall(user: SessionUser, boardId: string, callId: string, input: CallInput): Promise<CallView> {
  const role = await boardRole(user.id, boardId);
  authorize(user, "call.manage", { role }, "That board");
  return db().transaction(async (tx) => {
    const [row] = await tx
      .update(calls)
      .set(callValues(input))
      .where(and(eq(calls.boardId, boardId), eq(calls.id, callId)))
      .returning(callColumns);
    if (!row) throw notFound("That call");
    await recordAudit(
      {
        action: "call.update",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: callId,
        details: { title: input.title, ...(input.fileTolerance !== undefined ? { fileTolerance: input.fileTolerance } : {}) },
      },
      tx,
    );
    return toView(row);
  });
}

/** The call's tolerance policy: any member of the board may read it (proposers see what they are checked at). */
export async function getCallTolerance(user: SessionUser, boardId: string, callId: string): Promise<{ callId: string; tolerance: TolerancePolicy }> {
  const call = await getCall(user, boardId, callId);
  return { callId: call.id, tolerance: call.tolerance };
}

/**
 * Chairs set the policy the server applies to orbit checks at submission from now on.
 * Versions already submitted keep their recorded results (and the policy they were checked at).
 */
export async function updateCallTolerance(
  user: SessionUser,
  boardId: string,
  callId: string,
  tolerance: TolerancePolicy,
): Promise<{ callId: string; tolerance: TolerancePolicy }> {
  const role = await boardRole(user.id, boardId);
  authorize(user, "call.manage", { role }, "That board");
  return db().transaction(async (tx) => {
    const before = await loadCall(boardId, callId, tx);
    if (!before) throw notFound("That call");
    const [row] = await tx
      .update(calls)
      .set({ tolerance })
      .where(and(eq(calls.boardId, boardId), eq(calls.id, callId)))
      .returning({ id: calls.id, tolerance: calls.tolerance });
    await recordAudit(
      { action: "call.tolerance", actorId: user.id, actorEmail: user.email, boardId, target: callId, details: { before: before.tolerance, after: tolerance } },
      tx,
    );
    return { callId: row!.id, tolerance: row!.tolerance };
  });
}
