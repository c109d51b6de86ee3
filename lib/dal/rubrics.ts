import "server-only";
import { and, eq, sql } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { calls, rubricTemplates, type RubricCriterion } from "@/db/schema";
import { authorize } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { notFound, unprocessable } from "@/lib/errors";
import { rubricProblems } from "@/lib/review/rubric";
import type { RubricInput } from "@/lib/validation/review";
import { recordAudit } from "./audit";
import { boardRole, isUuid } from "./boards";

type Db = Database | Transaction;

export interface RubricView {
  id: string;
  callId: string;
  version: number;
  name: string;
  criteria: RubricCriterion[];
  frozenAt: string | null;
}

export interface CallRubric {
  call: { id: string; title: string; reviewersPerProposal: number };
  /** The template version the call uses now; null before the chair sets one up. */
  rubric: RubricView | null;
  /** Earlier versions, newest first (kept because submitted reviews point at them). */
  history: { id: string; version: number; name: string; frozenAt: string | null; createdAt: string }[];
}

const templateColumns = {
  id: rubricTemplates.id,
  callId: rubricTemplates.callId,
  version: rubricTemplates.version,
  name: rubricTemplates.name,
  criteria: rubricTemplates.criteria,
  frozenAt: rubricTemplates.frozenAt,
};

function toView(row: { id: string; callId: string; version: number; name: string; criteria: RubricCriterion[]; frozenAt: Date | null }): RubricView {
  return { ...row, frozenAt: row.frozenAt?.toISOString() ?? null };
}

/** A template by id, within a board (no policy check: callers check). */
export async function loadTemplate(boardId: string, templateId: string, tx: Db = db()): Promise<RubricView | null> {
  const [row] = await tx
    .select(templateColumns)
    .from(rubricTemplates)
    .where(and(eq(rubricTemplates.id, templateId), eq(rubricTemplates.boardId, boardId)));
  return row ? toView(row) : null;
}

/** Marks a template as in use: from now on an edit makes a new version instead. */
export async function freezeTemplate(templateId: string, tx: Db = db()): Promise<void> {
  await tx
    .update(rubricTemplates)
    .set({ frozenAt: sql`coalesce(${rubricTemplates.frozenAt}, now())` })
    .where(eq(rubricTemplates.id, templateId));
}

async function loadCallRow(boardId: string, callId: string, tx: Db) {
  if (!isUuid(callId)) return null;
  const [row] = await tx
    .select({ id: calls.id, title: calls.title, reviewersPerProposal: calls.reviewersPerProposal, rubricTemplateId: calls.rubricTemplateId })
    .from(calls)
    .where(and(eq(calls.id, callId), eq(calls.boardId, boardId)));
  return row ?? null;
}

/** The call's rubric, readable by every member of the board (proposers may see what they are judged on). */
export async function getCallRubric(user: SessionUser, boardId: string, callId: string): Promise<CallRubric> {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId);
  authorize(user, "board.view", { role }, "That board");
  const call = await loadCallRow(boardId, callId, db());
  if (!call) throw notFound("That call");
  const rubric = call.rubricTemplateId ? await loadTemplate(boardId, call.rubricTemplateId) : null;
  const history = await db()
    .select({
      id: rubricTemplates.id,
      version: rubricTemplates.version,
      name: rubricTemplates.name,
      frozenAt: rubricTemplates.frozenAt,
      createdAt: rubricTemplates.createdAt,
    })
    .from(rubricTemplates)
    .where(and(eq(rubricTemplates.callId, callId), eq(rubricTemplates.boardId, boardId)))
    .orderBy(sql`${rubricTemplates.version} desc`);
  return {
    call: { id: call.id, title: call.title, reviewersPerProposal: call.reviewersPerProposal },
    rubric,
    history: history.map((h) => ({ ...h, frozenAt: h.frozenAt?.toISOString() ?? null, createdAt: h.createdAt.toISOString() })),
  };
}

/**
 * Saves the chair's rubric for a call. While no review has started the current template is
 * edited in place; once it is frozen, the edit becomes a new template version and the call
 * points at it (reviews already started keep the version they were scored against).
 */
export async function saveCallRubric(
  user: SessionUser,
  boardId: string,
  callId: string,
  input: RubricInput,
): Promise<RubricView & { createdVersion: boolean }> {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId);
  authorize(user, "rubric.manage", { role }, "That board");
  const criteria: RubricCriterion[] = input.criteria.map((c) => ({
    ...c,
    description: c.description ?? "",
    commentRequiredBelow: c.commentRequiredBelow ?? null,
  }));
  const problems = rubricProblems(criteria);
  if (problems.length) throw unprocessable(problems.map((p) => p.message).join(" "), { issues: problems });
  if (!isUuid(callId)) throw notFound("That call");

  return db().transaction(async (tx) => {
    const [call] = await tx
      .select({ id: calls.id, rubricTemplateId: calls.rubricTemplateId })
      .from(calls)
      .where(and(eq(calls.id, callId), eq(calls.boardId, boardId)))
      .for("update");
    if (!call) throw notFound("That call");
    const current = call.rubricTemplateId ? await loadTemplate(boardId, call.rubricTemplateId, tx) : null;
    let saved: RubricView;
    let createdVersion = false;
    if (current && !current.frozenAt) {
      const [row] = await tx
        .update(rubricTemplates)
        .set({ name: input.name, criteria })
        .where(and(eq(rubricTemplates.id, current.id), eq(rubricTemplates.boardId, boardId)))
        .returning(templateColumns);
      saved = toView(row!);
    } else {
      const [max] = await tx
        .select({ v: sql<number>`coalesce(max(${rubricTemplates.version}), 0)::int` })
        .from(rubricTemplates)
        .where(eq(rubricTemplates.callId, callId));
      const [row] = await tx
        .insert(rubricTemplates)
        .values({ boardId, callId, version: (max?.v ?? 0) + 1, name: input.name, criteria })
        .returning(templateColumns);
      await tx
        .update(calls)
        .set({ rubricTemplateId: row!.id })
        .where(and(eq(calls.id, callId), eq(calls.boardId, boardId)));
      saved = toView(row!);
      createdVersion = true;
    }
    await recordAudit(
      {
        action: "rubric.save",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: saved.id,
        details: { callId, version: saved.version, createdVersion },
      },
      tx,
    );
    return { ...saved, createdVersion };
  });
}
