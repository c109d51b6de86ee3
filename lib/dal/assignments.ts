import "server-only";
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { assignments, boardMembers, boards, proposalCoauthors, proposals, proposalVersions, reviews, users } from "@/db/schema";
import { authorize, type BoardRole, type ResourceFacts } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { conflict, notFound, unprocessable } from "@/lib/errors";
import { enqueueReviewerAssignment } from "@/lib/mail/notices";
import { hasHardConflict, type ConflictFinding } from "@/lib/review/conflicts";
import type { AssignInput } from "@/lib/validation/review";
import { recordAudit } from "./audit";
import { boardRole, isUuid } from "./boards";
import { authorsOf, conflictMatrix, isConflicted } from "./conflicts";
import { loadCall } from "./calls";

type Db = Database | Transaction;

export interface ProposalAccess {
  proposal: { id: string; boardId: string; callId: string; ownerId: string; title: string; status: string; latestVersion: number };
  board: { hideProposerNames: boolean; shareReviewItemsAfterSubmit: boolean };
  role: BoardRole | null;
  isAuthor: boolean;
  isConflicted: boolean;
  /** The caller's own assignments on this proposal (one per version they were asked to review). */
  myAssignments: { id: string; versionId: string; dueAt: Date }[];
  /** Policy facts for "may the caller open this proposal". */
  facts: ResourceFacts;
}

/**
 * What the caller is to one proposal: role, authorship, assignments and conflicts. Unknown
 * ids and proposals of other boards are 404, as is a board the caller is not a member of.
 */
export async function proposalAccess(user: SessionUser, boardId: string, proposalId: string, tx: Db = db()): Promise<ProposalAccess> {
  if (!isUuid(boardId) || !isUuid(proposalId)) throw notFound("That proposal");
  const [row] = await tx
    .select({
      id: proposals.id,
      boardId: proposals.boardId,
      callId: proposals.callId,
      ownerId: proposals.ownerId,
      title: proposals.title,
      status: proposals.status,
      latestVersion: proposals.latestVersion,
      hideProposerNames: boards.hideProposerNames,
      shareReviewItemsAfterSubmit: boards.shareReviewItemsAfterSubmit,
    })
    .from(proposals)
    .innerJoin(boards, eq(boards.id, proposals.boardId))
    .where(and(eq(proposals.id, proposalId), eq(proposals.boardId, boardId)));
  const role = await boardRole(user.id, boardId, tx);
  if (!row || (role === null && !user.isAdmin)) throw notFound("That proposal");
  const [co] = await tx
    .select({ userId: proposalCoauthors.userId })
    .from(proposalCoauthors)
    .where(and(eq(proposalCoauthors.proposalId, proposalId), eq(proposalCoauthors.userId, user.id)));
  // Authorship counts only while the author is still an active member of the board.
  const isAuthor = (row.ownerId === user.id || Boolean(co)) && role !== null;
  const myAssignments = await tx
    .select({ id: assignments.id, versionId: assignments.versionId, dueAt: assignments.dueAt })
    .from(assignments)
    .where(and(eq(assignments.proposalId, proposalId), eq(assignments.boardId, boardId), eq(assignments.reviewerId, user.id)))
    .orderBy(asc(assignments.createdAt));
  const conflicted = role === "reviewer" ? await isConflicted(boardId, user.id, proposalId, tx) : false;
  const { hideProposerNames, shareReviewItemsAfterSubmit, ...proposal } = row;
  return {
    proposal,
    board: { hideProposerNames, shareReviewItemsAfterSubmit },
    role,
    isAuthor,
    isConflicted: conflicted,
    myAssignments,
    facts: { role, isAuthor, isAssigned: myAssignments.length > 0, isConflicted: conflicted },
  };
}

export interface AssignmentBoard {
  call: { id: string; title: string; reviewersPerProposal: number; hasRubric: boolean };
  proposals: {
    id: string;
    title: string;
    status: string;
    versionId: string;
    versionNumber: number;
    submittedAt: string;
    authorOrganisations: string[];
    assigned: { assignmentId: string; reviewerId: string; reviewerName: string; dueAt: string; reviewStatus: "not started" | "draft" | "submitted" }[];
  }[];
  reviewers: { id: string; name: string; email: string; organisation: string | null; openLoad: number; submitted: number }[];
  /** Conflict findings keyed "reviewerId:proposalId" (only pairs that have any). */
  conflicts: Record<string, ConflictFinding[]>;
}

async function requireAssign(user: SessionUser, boardId: string, tx: Db = db()) {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId, tx);
  authorize(user, "review.assign", { role }, "That board");
}

/** The submitted proposals of a call (latest version) against the board's reviewers and their load. */
export async function getAssignmentBoard(user: SessionUser, boardId: string, callId: string): Promise<AssignmentBoard> {
  await requireAssign(user, boardId);
  const call = await loadCall(boardId, callId);
  if (!call) throw notFound("That call");
  const rows = await db()
    .select({
      id: proposals.id,
      title: proposals.title,
      status: proposals.status,
      versionId: proposalVersions.id,
      versionNumber: proposalVersions.number,
      submittedAt: proposalVersions.submittedAt,
    })
    .from(proposals)
    .innerJoin(proposalVersions, and(eq(proposalVersions.proposalId, proposals.id), eq(proposalVersions.number, proposals.latestVersion)))
    .where(and(eq(proposals.boardId, boardId), eq(proposals.callId, callId), inArray(proposals.status, ["submitted", "in_review", "decided"])))
    .orderBy(asc(proposalVersions.submittedAt));
  const versionIds = rows.map((r) => r.versionId);
  const assigned = versionIds.length
    ? await db()
        .select({
          assignmentId: assignments.id,
          versionId: assignments.versionId,
          reviewerId: assignments.reviewerId,
          reviewerName: users.name,
          dueAt: assignments.dueAt,
          reviewStatus: reviews.status,
        })
        .from(assignments)
        .innerJoin(users, eq(users.id, assignments.reviewerId))
        .leftJoin(reviews, eq(reviews.assignmentId, assignments.id))
        .where(and(eq(assignments.boardId, boardId), inArray(assignments.versionId, versionIds)))
        .orderBy(asc(assignments.createdAt))
    : [];
  const reviewerRows = await db()
    .select({ id: users.id, name: users.name, email: users.email, organisation: users.organisation })
    .from(boardMembers)
    .innerJoin(users, eq(users.id, boardMembers.userId))
    .where(and(eq(boardMembers.boardId, boardId), eq(boardMembers.role, "reviewer"), eq(boardMembers.status, "active"), eq(users.status, "active")))
    .orderBy(asc(users.name));
  const loads = await db()
    .select({
      reviewerId: assignments.reviewerId,
      open: sql<number>`count(*) filter (where ${reviews.status} is distinct from 'submitted')::int`,
      submitted: sql<number>`count(*) filter (where ${reviews.status} = 'submitted')::int`,
    })
    .from(assignments)
    .leftJoin(reviews, eq(reviews.assignmentId, assignments.id))
    .where(eq(assignments.boardId, boardId))
    .groupBy(assignments.reviewerId);
  const loadOf = new Map(loads.map((l) => [l.reviewerId, l]));
  const authors = await authorsOf(rows.map((r) => r.id));
  const matrix = await conflictMatrix(
    boardId,
    reviewerRows.map((r) => r.id),
    rows.map((r) => r.id),
  );
  return {
    call: { id: call.id, title: call.title, reviewersPerProposal: call.reviewersPerProposal, hasRubric: call.rubricTemplateId !== null },
    proposals: rows.map((r) => ({
      ...r,
      submittedAt: r.submittedAt.toISOString(),
      authorOrganisations: [...new Set((authors.get(r.id) ?? []).map((a) => a.organisation).filter((o): o is string => Boolean(o)))],
      assigned: assigned
        .filter((a) => a.versionId === r.versionId)
        .map((a) => ({
          assignmentId: a.assignmentId,
          reviewerId: a.reviewerId,
          reviewerName: a.reviewerName,
          dueAt: a.dueAt.toISOString(),
          reviewStatus: a.reviewStatus === null ? ("not started" as const) : a.reviewStatus,
        })),
    })),
    reviewers: reviewerRows.map((r) => ({ ...r, openLoad: loadOf.get(r.id)?.open ?? 0, submitted: loadOf.get(r.id)?.submitted ?? 0 })),
    conflicts: Object.fromEntries(matrix),
  };
}

export interface AssignResult {
  created: { assignmentId: string; proposalId: string; reviewerId: string }[];
  /** Pairs that were already assigned (left as they were). */
  existing: { proposalId: string; reviewerId: string }[];
}

/**
 * Assigns each reviewer to each proposal's latest version in one transaction: any conflict
 * (or an unconfirmed likely conflict) refuses the whole request and nothing is written.
 * Each new assignment e-mails the reviewer through the outbox (lib/mail/notices) and moves the proposal to
 * in_review.
 */
export async function assignReviewers(user: SessionUser, boardId: string, input: AssignInput): Promise<AssignResult> {
  await requireAssign(user, boardId);
  if (input.dueAt.getTime() <= Date.now())
    throw unprocessable("The due date must be in the future.", { issues: [{ path: "dueAt", message: "must be in the future" }] });
  const proposalIds = [...new Set(input.proposalIds)];
  const reviewerIds = [...new Set(input.reviewerIds)];
  return db().transaction(async (tx) => {
    const found = await tx
      .select({
        id: proposals.id,
        title: proposals.title,
        status: proposals.status,
        callId: proposals.callId,
        versionId: proposalVersions.id,
        versionNumber: proposalVersions.number,
      })
      .from(proposals)
      .leftJoin(proposalVersions, and(eq(proposalVersions.proposalId, proposals.id), eq(proposalVersions.number, proposals.latestVersion)))
      .where(and(eq(proposals.boardId, boardId), inArray(proposals.id, proposalIds)))
      .for("update", { of: proposals });
    if (found.length !== proposalIds.length) throw notFound("One of those proposals");
    const notReady = found.filter((p) => !p.versionId || !["submitted", "in_review"].includes(p.status));
    if (notReady.length)
      throw conflict(`Only submitted proposals can be assigned: ${notReady.map((p) => `"${p.title}" is ${p.status.replace("_", " ")}`).join("; ")}.`, {
        proposals: notReady.map((p) => p.id),
      });
    const people = await tx
      .select({ id: users.id, name: users.name, email: users.email })
      .from(boardMembers)
      .innerJoin(users, eq(users.id, boardMembers.userId))
      .where(
        and(
          eq(boardMembers.boardId, boardId),
          inArray(boardMembers.userId, reviewerIds),
          eq(boardMembers.role, "reviewer"),
          eq(boardMembers.status, "active"),
          eq(users.status, "active"),
        ),
      );
    people.sort((a, b) => reviewerIds.indexOf(a.id) - reviewerIds.indexOf(b.id));
    found.sort((a, b) => proposalIds.indexOf(a.id) - proposalIds.indexOf(b.id));
    if (people.length !== reviewerIds.length)
      throw unprocessable("Only active reviewers of this board can be assigned.", { reviewers: reviewerIds.filter((id) => !people.some((p) => p.id === id)) });

    const matrix = await conflictMatrix(boardId, reviewerIds, proposalIds, tx);
    const blocked: { proposalId: string; reviewerId: string; message: string; strength: "conflict" | "likely" }[] = [];
    for (const p of found)
      for (const r of people) {
        const findings = matrix.get(`${r.id}:${p.id}`) ?? [];
        if (hasHardConflict(findings))
          blocked.push({
            proposalId: p.id,
            reviewerId: r.id,
            strength: "conflict",
            message: `${r.name} has a conflict with "${p.title}": ${findings
              .filter((f) => f.strength === "conflict")
              .map((f) => f.message)
              .join(" ")}`,
          });
        else if (findings.length && !input.confirmLikelyConflicts)
          blocked.push({
            proposalId: p.id,
            reviewerId: r.id,
            strength: "likely",
            message: `${r.name} may have a conflict with "${p.title}": ${findings.map((f) => f.message).join(" ")}`,
          });
      }
    if (blocked.some((b) => b.strength === "conflict"))
      throw conflict(
        `Conflicted reviewers cannot be assigned. ${blocked
          .filter((b) => b.strength === "conflict")
          .map((b) => b.message)
          .join(" ")}`,
        { blocked },
      );
    if (blocked.length)
      throw conflict(`Confirm the likely conflicts to assign anyway. ${blocked.map((b) => b.message).join(" ")}`, { blocked, needsConfirmation: true });

    const result: AssignResult = { created: [], existing: [] };
    const [boardName] = await tx.select({ name: boards.name }).from(boards).where(eq(boards.id, boardId));
    for (const p of found)
      for (const r of people) {
        const [row] = await tx
          .insert(assignments)
          .values({ boardId, proposalId: p.id, versionId: p.versionId!, reviewerId: r.id, dueAt: input.dueAt, assignedBy: user.id })
          .onConflictDoNothing({ target: [assignments.versionId, assignments.reviewerId] })
          .returning({ id: assignments.id });
        if (!row) {
          result.existing.push({ proposalId: p.id, reviewerId: r.id });
          continue;
        }
        result.created.push({ assignmentId: row.id, proposalId: p.id, reviewerId: r.id });
        await enqueueReviewerAssignment(tx, {
          assignmentId: row.id,
          boardId,
          proposalId: p.id,
          boardName: boardName?.name ?? "",
          proposalTitle: p.title,
          versionNumber: p.versionNumber ?? 1,
          dueAt: input.dueAt,
          to: r.email,
          resubmission: (p.versionNumber ?? 1) > 1,
        });
      }
    await tx
      .update(proposals)
      .set({ status: "in_review", updatedAt: new Date() })
      .where(and(eq(proposals.boardId, boardId), inArray(proposals.id, proposalIds), eq(proposals.status, "submitted")));
    await recordAudit(
      {
        action: "review.assign",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: proposalIds.join(","),
        details: {
          created: result.created.length,
          reviewerIds,
          dueAt: input.dueAt.toISOString(),
          confirmedLikelyConflicts: input.confirmLikelyConflicts && matrix.size > 0,
        },
      },
      tx,
    );
    return result;
  });
}

/** Takes an assignment back while its review is not submitted (a submitted review is evidence). */
export async function removeAssignment(user: SessionUser, boardId: string, assignmentId: string): Promise<{ ok: true }> {
  await requireAssign(user, boardId);
  if (!isUuid(assignmentId)) throw notFound("That assignment");
  return db().transaction(async (tx) => {
    const [row] = await tx
      .select({ id: assignments.id, proposalId: assignments.proposalId, reviewerId: assignments.reviewerId, reviewStatus: reviews.status })
      .from(assignments)
      .leftJoin(reviews, eq(reviews.assignmentId, assignments.id))
      .where(and(eq(assignments.id, assignmentId), eq(assignments.boardId, boardId)))
      .for("update", { of: assignments });
    if (!row) throw notFound("That assignment");
    if (row.reviewStatus === "submitted") throw conflict("This review is already submitted; reopen it instead of removing the assignment.");
    await tx.delete(assignments).where(and(eq(assignments.id, assignmentId), eq(assignments.boardId, boardId)));
    await recordAudit(
      {
        action: "review.unassign",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: assignmentId,
        details: { proposalId: row.proposalId, reviewerId: row.reviewerId },
      },
      tx,
    );
    return { ok: true as const };
  });
}
