import "server-only";
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { assignments, boardMembers, checkResults, proposals, proposalVersions, reviewItems, reviews, users } from "@/db/schema";
import type { Tx } from "./transaction";

/**
 * Reads about submitted versions of a proposal and what hangs off them (reviews, review items,
 * stored check results, assigned reviewers), for the decision workspace, the letter and the
 * version comparison. No authorization here: the use cases check access first.
 */

/** Every assignment of the version with its review (if started), in assignment order. */
export async function reviewRowsOfVersion(boardId: string, versionId: string, tx: Tx = db()) {
  return tx
    .select({
      assignmentId: assignments.id,
      reviewerName: users.name,
      status: reviews.status,
      weightedTotal: reviews.weightedTotal,
      summary: reviews.summary,
      submittedAt: reviews.submittedAt,
      scores: reviews.scores,
      rubricTemplateId: reviews.rubricTemplateId,
    })
    .from(assignments)
    .innerJoin(users, eq(users.id, assignments.reviewerId))
    .leftJoin(reviews, eq(reviews.assignmentId, assignments.id))
    .where(and(eq(assignments.boardId, boardId), eq(assignments.versionId, versionId)))
    .orderBy(asc(assignments.createdAt));
}

export async function reviewItemsOfVersion(boardId: string, versionId: string, tx: Tx = db()) {
  return tx
    .select({
      id: reviewItems.id,
      severity: reviewItems.severity,
      title: reviewItems.title,
      body: reviewItems.body,
      status: reviewItems.status,
      authorName: users.name,
    })
    .from(reviewItems)
    .innerJoin(users, eq(users.id, reviewItems.authorId))
    .where(and(eq(reviewItems.boardId, boardId), eq(reviewItems.versionId, versionId)))
    .orderBy(asc(reviewItems.createdAt));
}

/** The review items of the version among `ids`, in creation order. */
export async function selectedReviewItems(boardId: string, versionId: string, ids: string[], tx: Tx = db()) {
  if (!ids.length) return [];
  return tx
    .select({ id: reviewItems.id, severity: reviewItems.severity, title: reviewItems.title, body: reviewItems.body })
    .from(reviewItems)
    .where(and(eq(reviewItems.boardId, boardId), eq(reviewItems.versionId, versionId), inArray(reviewItems.id, ids)))
    .orderBy(asc(reviewItems.createdAt));
}

export async function openReviewItemCount(versionId: string, tx: Tx = db()): Promise<number> {
  const [row] = await tx
    .select({ n: sql<number>`count(*)::int` })
    .from(reviewItems)
    .where(and(eq(reviewItems.versionId, versionId), eq(reviewItems.status, "open")));
  return row?.n ?? 0;
}

/** The stored check results of one version, in creation order. */
export async function checkResultsOfVersion(boardId: string, versionId: string, tx: Tx = db()) {
  return tx
    .select({
      blockId: checkResults.blockId,
      label: checkResults.label,
      kind: checkResults.kind,
      status: checkResults.status,
      claim: checkResults.claim,
      result: checkResults.result,
      requirements: checkResults.requirements,
      contractVersion: checkResults.contractVersion,
      tolerance: checkResults.tolerance,
    })
    .from(checkResults)
    .where(and(eq(checkResults.boardId, boardId), eq(checkResults.versionId, versionId)))
    .orderBy(asc(checkResults.createdAt));
}

/** The stored check results of some versions, in creation order. */
export async function checkResultsOfVersions(boardId: string, versionIds: string[], tx: Tx = db()) {
  return tx
    .select({
      versionId: checkResults.versionId,
      blockId: checkResults.blockId,
      label: checkResults.label,
      kind: checkResults.kind,
      status: checkResults.status,
      claim: checkResults.claim,
      result: checkResults.result,
    })
    .from(checkResults)
    .where(and(eq(checkResults.boardId, boardId), inArray(checkResults.versionId, versionIds)))
    .orderBy(asc(checkResults.createdAt));
}

/** Every submitted version of the proposal with its document, oldest first. */
export async function versionsWithDocuments(boardId: string, proposalId: string, tx: Tx = db()) {
  return tx
    .select({ id: proposalVersions.id, number: proposalVersions.number, submittedAt: proposalVersions.submittedAt, document: proposalVersions.document })
    .from(proposalVersions)
    .where(and(eq(proposalVersions.proposalId, proposalId), eq(proposalVersions.boardId, boardId)))
    .orderBy(asc(proposalVersions.number));
}

export async function versionIdByNumber(boardId: string, proposalId: string, number: number, tx: Tx = db()): Promise<string | null> {
  const [row] = await tx
    .select({ id: proposalVersions.id })
    .from(proposalVersions)
    .where(and(eq(proposalVersions.proposalId, proposalId), eq(proposalVersions.boardId, boardId), eq(proposalVersions.number, number)));
  return row?.id ?? null;
}

/** The reviewers assigned to some versions of the proposal, with their board membership, in assignment order. */
export async function reviewersOfVersions(boardId: string, proposalId: string, versionIds: string[], tx: Tx = db()) {
  return tx
    .select({
      id: users.id,
      name: users.name,
      versionId: assignments.versionId,
      memberStatus: boardMembers.status,
      userStatus: users.status,
      role: boardMembers.role,
    })
    .from(assignments)
    .innerJoin(users, eq(users.id, assignments.reviewerId))
    .leftJoin(boardMembers, and(eq(boardMembers.boardId, boardId), eq(boardMembers.userId, assignments.reviewerId)))
    .where(and(eq(assignments.boardId, boardId), eq(assignments.proposalId, proposalId), inArray(assignments.versionId, versionIds)))
    .orderBy(asc(assignments.createdAt));
}

/** The reviewers assigned to one version (any proposal of the board), with their board membership. */
export async function reviewersOfVersion(boardId: string, versionId: string, tx: Tx = db()) {
  return tx
    .select({ id: users.id, name: users.name, memberStatus: boardMembers.status, userStatus: users.status, role: boardMembers.role })
    .from(assignments)
    .innerJoin(users, eq(users.id, assignments.reviewerId))
    .leftJoin(boardMembers, and(eq(boardMembers.boardId, boardId), eq(boardMembers.userId, assignments.reviewerId)))
    .where(and(eq(assignments.boardId, boardId), eq(assignments.versionId, versionId)))
    .orderBy(asc(assignments.createdAt));
}

export async function proposalHeadline(proposalId: string, tx: Tx = db()): Promise<{ title: string; status: string; latestVersion: number } | null> {
  const [p] = await tx
    .select({ title: proposals.title, status: proposals.status, latestVersion: proposals.latestVersion })
    .from(proposals)
    .where(eq(proposals.id, proposalId));
  return p ?? null;
}
