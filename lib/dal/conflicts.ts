import "server-only";
import { and, asc, desc, eq, inArray } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { boards, conflicts, proposalCoauthors, proposals, users } from "@/db/schema";
import { authorize } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { notFound } from "@/lib/errors";
import { findConflicts, hasHardConflict, type ConflictFinding, type Declaration, type Person } from "@/lib/review/conflicts";
import type { ConflictInput } from "@/lib/validation/review";
import { recordAudit } from "./audit";
import { boardRole, isUuid } from "./boards";

type Db = Database | Transaction;

/** The owner and co-authors of each proposal, with what the conflict rules compare. */
export async function authorsOf(proposalIds: string[], tx: Db = db()): Promise<Map<string, Person[]>> {
  const out = new Map<string, Person[]>();
  if (proposalIds.length === 0) return out;
  const owners = await tx
    .select({ proposalId: proposals.id, id: users.id, email: users.email, name: users.name, organisation: users.organisation })
    .from(proposals)
    .innerJoin(users, eq(users.id, proposals.ownerId))
    .where(inArray(proposals.id, proposalIds));
  const coauthors = await tx
    .select({ proposalId: proposalCoauthors.proposalId, id: users.id, email: users.email, name: users.name, organisation: users.organisation })
    .from(proposalCoauthors)
    .innerJoin(users, eq(users.id, proposalCoauthors.userId))
    .where(inArray(proposalCoauthors.proposalId, proposalIds));
  for (const { proposalId, ...person } of [...owners, ...coauthors]) {
    const list = out.get(proposalId) ?? [];
    list.push(person);
    out.set(proposalId, list);
  }
  return out;
}

/**
 * Conflict findings for every (reviewer, proposal) pair of a board: declared conflicts,
 * same organisation (hard) and same e-mail domain (likely). Keyed "reviewerId:proposalId".
 */
export async function conflictMatrix(boardId: string, reviewerIds: string[], proposalIds: string[], tx: Db = db()): Promise<Map<string, ConflictFinding[]>> {
  const out = new Map<string, ConflictFinding[]>();
  if (reviewerIds.length === 0 || proposalIds.length === 0) return out;
  const people = await tx
    .select({ id: users.id, email: users.email, name: users.name, organisation: users.organisation })
    .from(users)
    .where(inArray(users.id, reviewerIds));
  const declared = await tx
    .select({ reviewerId: conflicts.reviewerId, proposalId: conflicts.proposalId, organisation: conflicts.organisation, reason: conflicts.reason })
    .from(conflicts)
    .where(and(eq(conflicts.boardId, boardId), inArray(conflicts.reviewerId, reviewerIds)));
  const authors = await authorsOf(proposalIds, tx);
  for (const reviewer of people) {
    const declarations: Declaration[] = declared.filter((d) => d.reviewerId === reviewer.id);
    for (const proposalId of proposalIds) {
      const findings = findConflicts({ reviewer, authors: authors.get(proposalId) ?? [], proposalId, declarations });
      if (findings.length) out.set(`${reviewer.id}:${proposalId}`, findings);
    }
  }
  return out;
}

export async function conflictFindings(boardId: string, reviewerId: string, proposalId: string, tx: Db = db()): Promise<ConflictFinding[]> {
  return (await conflictMatrix(boardId, [reviewerId], [proposalId], tx)).get(`${reviewerId}:${proposalId}`) ?? [];
}

/**
 * Whether the user has a conflict with the proposal that keeps them from reviewing or opening
 * it (policy fact `isConflicted`). A likely conflict (same e-mail domain) alone does not.
 */
export async function isConflicted(boardId: string, userId: string, proposalId: string, tx: Db = db()): Promise<boolean> {
  return hasHardConflict(await conflictFindings(boardId, userId, proposalId, tx));
}

export interface ConflictView {
  id: string;
  reviewerId: string;
  reviewerName: string;
  proposalId: string | null;
  proposalTitle: string | null;
  organisation: string | null;
  reason: string;
  createdAt: string;
}

async function requireRole(user: SessionUser, boardId: string) {
  if (!isUuid(boardId)) throw notFound("That board");
  return boardRole(user.id, boardId);
}

/** A reviewer's own declarations; the chair (review.assign) sees every reviewer's. */
export async function listConflicts(user: SessionUser, boardId: string): Promise<ConflictView[]> {
  const role = await requireRole(user, boardId);
  authorize(user, "board.view", { role }, "That board");
  const all = role === "chair" || (user.isAdmin && role === null);
  if (!all) authorize(user, "conflict.declare", { role });
  const rows = await db()
    .select({
      id: conflicts.id,
      reviewerId: conflicts.reviewerId,
      reviewerName: users.name,
      proposalId: conflicts.proposalId,
      proposalTitle: proposals.title,
      organisation: conflicts.organisation,
      reason: conflicts.reason,
      createdAt: conflicts.createdAt,
    })
    .from(conflicts)
    .innerJoin(users, eq(users.id, conflicts.reviewerId))
    .leftJoin(proposals, and(eq(proposals.id, conflicts.proposalId), eq(proposals.boardId, boardId)))
    .where(all ? eq(conflicts.boardId, boardId) : and(eq(conflicts.boardId, boardId), eq(conflicts.reviewerId, user.id)))
    .orderBy(desc(conflicts.createdAt));
  return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }));
}

export interface ConflictCandidate {
  id: string;
  title: string;
  /** Authors' organisations; names only when the board shows proposers' names to reviewers. */
  organisations: string[];
  authors: string[] | null;
  declared: boolean;
}

/** The submitted proposals of a board a reviewer may declare a conflict with (titles and organisations only). */
export async function listConflictCandidates(user: SessionUser, boardId: string): Promise<ConflictCandidate[]> {
  const role = await requireRole(user, boardId);
  authorize(user, "conflict.declare", { role }, "That board");
  const [board] = await db().select({ hide: boards.hideProposerNames }).from(boards).where(eq(boards.id, boardId));
  const rows = await db()
    .select({ id: proposals.id, title: proposals.title })
    .from(proposals)
    .where(and(eq(proposals.boardId, boardId), inArray(proposals.status, ["submitted", "in_review", "decided"])))
    .orderBy(asc(proposals.title));
  const authors = await authorsOf(rows.map((r) => r.id));
  const mine = await db()
    .select({ proposalId: conflicts.proposalId })
    .from(conflicts)
    .where(and(eq(conflicts.boardId, boardId), eq(conflicts.reviewerId, user.id)));
  const declared = new Set(mine.map((m) => m.proposalId));
  return rows.map((r) => {
    const people = authors.get(r.id) ?? [];
    return {
      id: r.id,
      title: r.title,
      organisations: [...new Set(people.map((p) => p.organisation).filter((o): o is string => Boolean(o)))],
      authors: board?.hide ? null : people.map((p) => p.name ?? ""),
      declared: declared.has(r.id),
    };
  });
}

export async function declareConflict(user: SessionUser, boardId: string, input: ConflictInput): Promise<ConflictView> {
  const role = await requireRole(user, boardId);
  authorize(user, "conflict.declare", { role }, "That board");
  return db().transaction(async (tx) => {
    let proposalTitle: string | null = null;
    if (input.proposalId) {
      const [p] = await tx
        .select({ title: proposals.title })
        .from(proposals)
        .where(and(eq(proposals.id, input.proposalId), eq(proposals.boardId, boardId)));
      if (!p) throw notFound("That proposal");
      proposalTitle = p.title;
      const [existing] = await tx
        .select({ id: conflicts.id })
        .from(conflicts)
        .where(and(eq(conflicts.boardId, boardId), eq(conflicts.reviewerId, user.id), eq(conflicts.proposalId, input.proposalId)));
      if (existing) {
        const [updated] = await tx.update(conflicts).set({ reason: input.reason }).where(eq(conflicts.id, existing.id)).returning();
        return { ...toView(updated!, user.name), proposalTitle };
      }
    }
    const [row] = await tx
      .insert(conflicts)
      .values({
        boardId,
        reviewerId: user.id,
        proposalId: input.proposalId ?? null,
        organisation: input.proposalId ? null : (input.organisation ?? null),
        reason: input.reason,
      })
      .returning();
    await recordAudit(
      {
        action: "conflict.declare",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: row!.id,
        details: { proposalId: row!.proposalId, organisation: row!.organisation },
      },
      tx,
    );
    return { ...toView(row!, user.name), proposalTitle };
  });
}

function toView(row: typeof conflicts.$inferSelect, reviewerName: string): ConflictView {
  return {
    id: row.id,
    reviewerId: row.reviewerId,
    reviewerName,
    proposalId: row.proposalId,
    proposalTitle: null,
    organisation: row.organisation,
    reason: row.reason,
    createdAt: row.createdAt.toISOString(),
  };
}

/** Withdraws one of the caller's own declarations (audited: the chair may want to know). */
export async function withdrawConflict(user: SessionUser, boardId: string, conflictId: string): Promise<{ ok: true }> {
  const role = await requireRole(user, boardId);
  authorize(user, "conflict.declare", { role }, "That board");
  if (!isUuid(conflictId)) throw notFound("That declaration");
  return db().transaction(async (tx) => {
    const deleted = await tx
      .delete(conflicts)
      .where(and(eq(conflicts.id, conflictId), eq(conflicts.boardId, boardId), eq(conflicts.reviewerId, user.id)))
      .returning({ id: conflicts.id, proposalId: conflicts.proposalId, organisation: conflicts.organisation });
    if (!deleted[0]) throw notFound("That declaration");
    await recordAudit({ action: "conflict.withdraw", actorId: user.id, actorEmail: user.email, boardId, target: conflictId, details: deleted[0] }, tx);
    return { ok: true as const };
  });
}
