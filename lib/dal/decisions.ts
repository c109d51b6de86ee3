import "server-only";
import { and, desc, eq, inArray, sql } from "drizzle-orm";
import { db } from "@/db/client";
import {
  boardMembers,
  boards,
  calls,
  decisions,
  outboxMessages,
  proposalCoauthors,
  proposals,
  proposalVersions,
  reviews,
  users,
  type DecisionOutcome,
} from "@/db/schema";
import { OUTCOME_LABELS } from "@/lib/decisions/template";
import { notFound } from "@/lib/errors";
import type { Transaction, Tx as Db } from "./transaction";

export interface DecisionView {
  id: string;
  proposalId: string;
  versionNumber: number;
  outcome: DecisionOutcome;
  outcomeLabel: string;
  letterHtml: string;
  letterText: string;
  weightedScore: number | null;
  overrideReason: string | null;
  decidedAt: string;
  decidedByName: string | null;
  hasPdf: boolean;
  /** The review report PDF went with the letter e-mail. */
  hasReportPdf: boolean;
  /** The letter e-mail's state in the outbox (null for readers who may not see it). */
  mail: { status: string; attempts: number; lastError: string | null; nextAttemptAt: string | null; sentAt: string | null } | null;
}

/** The board, proposal, call and latest version a decision is about. */
export interface DecisionContext {
  board: { id: string; name: string; letterTemplate: Record<string, unknown> | null };
  proposal: { id: string; title: string; missionType: string; status: string; latestVersion: number; ownerId: string; ownerName: string };
  call: { id: string; title: string; reviewersPerProposal: number };
  version: { id: string; number: number; title: string; submittedAt: Date } | null;
}

export async function loadDecisionContext(boardId: string, proposalId: string, tx: Db = db()): Promise<DecisionContext> {
  const [row] = await tx
    .select({
      boardName: boards.name,
      letterTemplate: boards.letterTemplate,
      title: proposals.title,
      missionType: proposals.missionType,
      status: proposals.status,
      latestVersion: proposals.latestVersion,
      ownerId: proposals.ownerId,
      ownerName: users.name,
      callId: calls.id,
      callTitle: calls.title,
      reviewersPerProposal: calls.reviewersPerProposal,
    })
    .from(proposals)
    .innerJoin(boards, eq(boards.id, proposals.boardId))
    .innerJoin(calls, eq(calls.id, proposals.callId))
    .innerJoin(users, eq(users.id, proposals.ownerId))
    .where(and(eq(proposals.id, proposalId), eq(proposals.boardId, boardId)));
  if (!row) throw notFound("That proposal");
  const [version] =
    row.latestVersion > 0
      ? await tx
          .select({ id: proposalVersions.id, number: proposalVersions.number, title: proposalVersions.title, submittedAt: proposalVersions.submittedAt })
          .from(proposalVersions)
          .where(and(eq(proposalVersions.proposalId, proposalId), eq(proposalVersions.boardId, boardId), eq(proposalVersions.number, row.latestVersion)))
      : [];
  return {
    board: { id: boardId, name: row.boardName, letterTemplate: row.letterTemplate ?? null },
    proposal: {
      id: proposalId,
      title: row.title,
      missionType: row.missionType,
      status: row.status,
      latestVersion: row.latestVersion,
      ownerId: row.ownerId,
      ownerName: row.ownerName,
    },
    call: { id: row.callId, title: row.callTitle, reviewersPerProposal: row.reviewersPerProposal },
    version: version ?? null,
  };
}

/** The proposal's decisions, newest version first; with the letter e-mail's state and the override reason when `withMail` (chairs). */
export async function decisionViews(boardId: string, proposalId: string, withMail: boolean, tx: Db = db()): Promise<DecisionView[]> {
  const rows = await tx
    .select({
      id: decisions.id,
      proposalId: decisions.proposalId,
      versionNumber: proposalVersions.number,
      outcome: decisions.outcome,
      letterHtml: decisions.letterHtml,
      letterText: decisions.letterText,
      weightedScore: decisions.weightedScore,
      overrideReason: decisions.overrideReason,
      decidedAt: decisions.decidedAt,
      decidedByName: users.name,
      pdfKey: decisions.pdfKey,
      reportPdfKey: decisions.reportPdfKey,
    })
    .from(decisions)
    .innerJoin(proposalVersions, eq(proposalVersions.id, decisions.versionId))
    .leftJoin(users, eq(users.id, decisions.decidedBy))
    .where(and(eq(decisions.boardId, boardId), eq(decisions.proposalId, proposalId)))
    .orderBy(desc(proposalVersions.number));
  const mail = new Map<string, NonNullable<DecisionView["mail"]>>();
  if (withMail && rows.length) {
    const found = await tx
      .select({
        dedupeKey: outboxMessages.dedupeKey,
        status: outboxMessages.status,
        attempts: outboxMessages.attempts,
        lastError: outboxMessages.lastError,
        nextAttemptAt: outboxMessages.nextAttemptAt,
        sentAt: outboxMessages.sentAt,
      })
      .from(outboxMessages)
      .where(
        inArray(
          outboxMessages.dedupeKey,
          rows.map((r) => `decision:${r.id}`),
        ),
      );
    for (const m of found)
      mail.set(m.dedupeKey, {
        status: m.status,
        attempts: m.attempts,
        lastError: m.lastError,
        nextAttemptAt: m.nextAttemptAt.toISOString(),
        sentAt: m.sentAt?.toISOString() ?? null,
      });
  }
  return rows.map(({ pdfKey, reportPdfKey, decidedAt, ...r }) => ({
    ...r,
    hasReportPdf: Boolean(reportPdfKey),
    outcomeLabel: OUTCOME_LABELS[r.outcome],
    decidedAt: decidedAt.toISOString(),
    hasPdf: Boolean(pdfKey),
    overrideReason: withMail ? r.overrideReason : null,
    mail: withMail ? (mail.get(`decision:${r.id}`) ?? null) : null,
  }));
}

export async function submittedReviewCount(versionId: string, tx: Db = db()): Promise<number> {
  const [row] = await tx
    .select({ n: sql<number>`count(*)::int` })
    .from(reviews)
    .where(and(eq(reviews.versionId, versionId), eq(reviews.status, "submitted")));
  return row?.n ?? 0;
}

/** The decision already issued on a version, if any. */
export async function decisionIdOfVersion(versionId: string, tx: Db = db()): Promise<string | null> {
  const [existing] = await tx.select({ id: decisions.id }).from(decisions).where(eq(decisions.versionId, versionId));
  return existing?.id ?? null;
}

/** Locks the proposal row for the rest of the transaction (serialises decisions on one proposal). */
export async function lockProposalForDecision(tx: Transaction, boardId: string, proposalId: string): Promise<{ status: string; latestVersion: number } | null> {
  const [locked] = await tx
    .select({ status: proposals.status, latestVersion: proposals.latestVersion })
    .from(proposals)
    .where(and(eq(proposals.id, proposalId), eq(proposals.boardId, boardId)))
    .for("update");
  return locked ?? null;
}

/** Writes the decision row and marks the proposal decided. */
export async function insertDecision(tx: Transaction, row: typeof decisions.$inferInsert & { decidedAt: Date }): Promise<void> {
  await tx.insert(decisions).values(row);
  await tx.update(proposals).set({ status: "decided", updatedAt: row.decidedAt }).where(eq(proposals.id, row.proposalId));
}

/** The owner and co-authors who are still active members of the board. */
export async function authorEmails(proposalId: string, boardId: string, tx: Db = db()): Promise<string[]> {
  const [owner] = await tx.select({ ownerId: proposals.ownerId }).from(proposals).where(eq(proposals.id, proposalId));
  const co = await tx.select({ userId: proposalCoauthors.userId }).from(proposalCoauthors).where(eq(proposalCoauthors.proposalId, proposalId));
  const ids = [...new Set([owner?.ownerId, ...co.map((c) => c.userId)].filter((id): id is string => Boolean(id)))];
  if (!ids.length) return [];
  const rows = await tx
    .select({ email: users.email })
    .from(users)
    .innerJoin(boardMembers, and(eq(boardMembers.userId, users.id), eq(boardMembers.boardId, boardId), eq(boardMembers.status, "active")))
    .where(and(inArray(users.id, ids), eq(users.status, "active")));
  return rows.map((r) => r.email);
}

/** A decision of the board with its version's title and number (no authorization: callers check). */
export async function decisionRecord(
  boardId: string,
  decisionId: string,
  tx: Db = db(),
): Promise<{ id: string; proposalId: string; pdfKey: string | null; title: string; versionNumber: number } | null> {
  const [row] = await tx
    .select({
      id: decisions.id,
      proposalId: decisions.proposalId,
      pdfKey: decisions.pdfKey,
      title: proposalVersions.title,
      versionNumber: proposalVersions.number,
    })
    .from(decisions)
    .innerJoin(proposalVersions, eq(proposalVersions.id, decisions.versionId))
    .where(and(eq(decisions.id, decisionId), eq(decisions.boardId, boardId)));
  return row ?? null;
}

/** Outcomes of the decisions on some versions of a proposal. */
export async function decisionsOfVersions(proposalId: string, versionIds: string[], tx: Db = db()): Promise<{ versionId: string; outcome: DecisionOutcome }[]> {
  return tx
    .select({ versionId: decisions.versionId, outcome: decisions.outcome })
    .from(decisions)
    .where(and(eq(decisions.proposalId, proposalId), inArray(decisions.versionId, versionIds)));
}
