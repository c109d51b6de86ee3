import "server-only";
import { and, asc, eq, inArray } from "drizzle-orm";
import type { Database, Transaction } from "@/db/client";
import { proposalVersions, responseWindows, reviewItemAnswers, reviewItemDispositions, type DispositionCode } from "@/db/schema";
import { DISPOSITION_LABELS, windowState, type WindowState } from "@/lib/review/responses";

// Read side of the response round, shared by review-items.ts (which shows answers and
// dispositions with each item) and responses.ts (which writes them). No policy checks here:
// callers have checked the item is visible to the viewer.

type Db = Database | Transaction;

export interface ResponseWindowRow {
  id: string;
  boardId: string;
  callId: string;
  opensAt: Date;
  closesAt: Date;
  openingMailedAt: Date | null;
  reminderMailedAt: Date | null;
  closingMailedAt: Date | null;
}

export const windowColumns = {
  id: responseWindows.id,
  boardId: responseWindows.boardId,
  callId: responseWindows.callId,
  opensAt: responseWindows.opensAt,
  closesAt: responseWindows.closesAt,
  openingMailedAt: responseWindows.openingMailedAt,
  reminderMailedAt: responseWindows.reminderMailedAt,
  closingMailedAt: responseWindows.closingMailedAt,
};

/** The call's response window (null: none set). No policy check. */
export async function loadResponseWindow(boardId: string, callId: string, tx: Db): Promise<ResponseWindowRow | null> {
  const [row] = await tx
    .select(windowColumns)
    .from(responseWindows)
    .where(and(eq(responseWindows.boardId, boardId), eq(responseWindows.callId, callId)))
    .limit(1);
  return row ?? null;
}

export function responseWindowFacts(window: ResponseWindowRow | null, now = new Date()): { state: WindowState | null; started: boolean; open: boolean } {
  if (!window) return { state: null, started: false, open: false };
  const state = windowState(window, now);
  return { state, started: state !== "upcoming", open: state === "open" };
}

export interface ReviewItemAnswerView {
  id: string;
  body: string;
  authorId: string;
  /** A newer version the answer points at, with the heading of the section there. */
  section: { versionId: string; versionNumber: number; heading: string } | null;
  createdAt: string;
  updatedAt: string;
}

export interface DispositionView {
  id: string;
  disposition: DispositionCode;
  label: string;
  reason: string;
  actorId: string | null;
  actorRole: "reviewer" | "chair";
  createdAt: string;
}

/** Answers (one per item) and disposition histories (oldest first) of the given items. */
export async function itemResponses(
  itemIds: string[],
  tx: Db,
): Promise<{ answers: Map<string, ReviewItemAnswerView>; dispositions: Map<string, DispositionView[]> }> {
  const answers = new Map<string, ReviewItemAnswerView>();
  const dispositions = new Map<string, DispositionView[]>();
  if (itemIds.length === 0) return { answers, dispositions };
  const answerRows = await tx
    .select({
      id: reviewItemAnswers.id,
      itemId: reviewItemAnswers.reviewItemId,
      body: reviewItemAnswers.body,
      authorId: reviewItemAnswers.authorId,
      sectionVersionId: reviewItemAnswers.sectionVersionId,
      sectionVersionNumber: proposalVersions.number,
      sectionHeading: reviewItemAnswers.sectionHeading,
      createdAt: reviewItemAnswers.createdAt,
      updatedAt: reviewItemAnswers.updatedAt,
    })
    .from(reviewItemAnswers)
    .leftJoin(proposalVersions, eq(proposalVersions.id, reviewItemAnswers.sectionVersionId))
    .where(inArray(reviewItemAnswers.reviewItemId, itemIds));
  for (const a of answerRows)
    answers.set(a.itemId, {
      id: a.id,
      body: a.body,
      authorId: a.authorId,
      section:
        a.sectionVersionId && a.sectionVersionNumber !== null && a.sectionHeading
          ? { versionId: a.sectionVersionId, versionNumber: a.sectionVersionNumber, heading: a.sectionHeading }
          : null,
      createdAt: a.createdAt.toISOString(),
      updatedAt: a.updatedAt.toISOString(),
    });
  const dispositionRows = await tx
    .select({
      id: reviewItemDispositions.id,
      itemId: reviewItemDispositions.reviewItemId,
      disposition: reviewItemDispositions.disposition,
      reason: reviewItemDispositions.reason,
      actorId: reviewItemDispositions.actorId,
      actorRole: reviewItemDispositions.actorRole,
      createdAt: reviewItemDispositions.createdAt,
    })
    .from(reviewItemDispositions)
    .where(inArray(reviewItemDispositions.reviewItemId, itemIds))
    .orderBy(asc(reviewItemDispositions.createdAt), asc(reviewItemDispositions.id));
  for (const d of dispositionRows) {
    const list = dispositions.get(d.itemId) ?? [];
    list.push({
      id: d.id,
      disposition: d.disposition,
      label: DISPOSITION_LABELS[d.disposition],
      reason: d.reason,
      actorId: d.actorId,
      actorRole: d.actorRole,
      createdAt: d.createdAt.toISOString(),
    });
    dispositions.set(d.itemId, list);
  }
  return { answers, dispositions };
}
