import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { callRequirements } from "@/db/schema";
import { authorize } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { notFound } from "@/lib/errors";
import { requirementSummary, type CallRequirement } from "@/lib/requirements";
import type { RequirementInput } from "@/lib/validation/requirements";
import { recordAudit } from "./audit";
import { boardRole, isUuid } from "./boards";
import { loadCall } from "./calls";

export interface CallRequirementView extends CallRequirement {
  callId: string;
  /** What the call demands, in one line. */
  summary: string;
  createdAt: string;
}

const columns = {
  id: callRequirements.id,
  callId: callRequirements.callId,
  type: callRequirements.type,
  params: callRequirements.params,
  rationale: callRequirements.rationale,
  createdAt: callRequirements.createdAt,
};

type Row = { createdAt: Date } & Omit<CallRequirementView, "createdAt" | "summary">;

function toView(row: Row): CallRequirementView {
  return { ...row, summary: requirementSummary(row), createdAt: row.createdAt.toISOString() };
}

/** The requirements of a call, without a policy check (submission and callers that checked first). */
export async function loadRequirements(boardId: string, callId: string, tx: Database | Transaction = db()): Promise<CallRequirementView[]> {
  if (!isUuid(boardId) || !isUuid(callId)) return [];
  const rows = await tx
    .select(columns)
    .from(callRequirements)
    .where(and(eq(callRequirements.boardId, boardId), eq(callRequirements.callId, callId)))
    .orderBy(asc(callRequirements.createdAt), asc(callRequirements.id));
  return rows.map(toView);
}

/** Any member of the board sees a call's requirements (proposers must know what is asked). */
export async function listRequirements(user: SessionUser, boardId: string, callId: string): Promise<CallRequirementView[]> {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId);
  authorize(user, "board.view", { role }, "That board");
  if (!(await loadCall(boardId, callId))) throw notFound("That call");
  return loadRequirements(boardId, callId);
}

/** Chairs add a requirement (input already validated by requirementInputSchema). */
export async function addRequirement(user: SessionUser, boardId: string, callId: string, input: RequirementInput): Promise<CallRequirementView> {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId);
  authorize(user, "call.manage", { role }, "That board");
  return db().transaction(async (tx) => {
    if (!(await loadCall(boardId, callId, tx))) throw notFound("That call");
    const [row] = await tx
      .insert(callRequirements)
      .values({ boardId, callId, type: input.type, params: input.params, rationale: input.rationale, createdBy: user.id })
      .returning(columns);
    await recordAudit(
      {
        action: "call.requirement.add",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: callId,
        details: { type: input.type, params: input.params },
      },
      tx,
    );
    return toView(row!);
  });
}

/** Chairs remove a requirement; versions already judged keep their stored outcomes. */
export async function removeRequirement(user: SessionUser, boardId: string, callId: string, requirementId: string): Promise<void> {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId);
  authorize(user, "call.manage", { role }, "That board");
  if (!isUuid(callId) || !isUuid(requirementId)) throw notFound("That requirement");
  await db().transaction(async (tx) => {
    const [row] = await tx
      .delete(callRequirements)
      .where(and(eq(callRequirements.boardId, boardId), eq(callRequirements.callId, callId), eq(callRequirements.id, requirementId)))
      .returning({ type: callRequirements.type });
    if (!row) throw notFound("That requirement");
    await recordAudit(
      { action: "call.requirement.remove", actorId: user.id, actorEmail: user.email, boardId, target: callId, details: { requirementId, type: row.type } },
      tx,
    );
  });
}
