import "server-only";
import { and, asc, eq, gt, inArray, isNull, lte, sql } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import {
  assignments,
  boardMembers,
  boards,
  calls,
  proposalCoauthors,
  proposals,
  proposalVersions,
  responseWindows,
  reviewItemAnswers,
  reviewItemDispositions,
  reviewItems,
  users,
  type DispositionCode,
} from "@/db/schema";
import { authorize, can } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { dossierHeadings } from "@/lib/dossier";
import { env } from "@/lib/env";
import { conflict, forbidden, notFound, unprocessable } from "@/lib/errors";
import { formatDateTime } from "@/lib/format/dates";
import { enqueueMail } from "@/lib/mail/outbox";
import { renderResponseWindowMail } from "@/lib/mail/templates/response-round";
import { windowState, type WindowState } from "@/lib/review/responses";
import { recordAudit } from "./audit";
import { boardRole, isUuid } from "./boards";
import { loadCall } from "./calls";
import { loadResponseWindow, windowColumns, type ResponseWindowRow } from "./item-responses";
import { getReviewItem, loadReviewItem, presentReviewItems, type DispositionEntry, type ReviewItemView } from "./review-items";
import { proposalAccess } from "./assignments";

export type { DispositionEntry, ReviewItemAnswerEntry } from "./review-items";

type Db = Database | Transaction;

const DAY = 86_400_000;
/** The reminder goes out this long before the window closes. */
export const RESPONSE_REMINDER_BEFORE_MS = 2 * DAY;

export interface ResponseWindowView {
  id: string;
  callId: string;
  opensAt: string;
  closesAt: string;
  state: WindowState;
  openingMailedAt: string | null;
  reminderMailedAt: string | null;
  closingMailedAt: string | null;
}

function toView(row: ResponseWindowRow, now = new Date()): ResponseWindowView {
  return {
    id: row.id,
    callId: row.callId,
    opensAt: row.opensAt.toISOString(),
    closesAt: row.closesAt.toISOString(),
    state: windowState(row, now),
    openingMailedAt: row.openingMailedAt?.toISOString() ?? null,
    reminderMailedAt: row.reminderMailedAt?.toISOString() ?? null,
    closingMailedAt: row.closingMailedAt?.toISOString() ?? null,
  };
}

async function callFor(user: SessionUser, boardId: string, callId: string, permission: "board.view" | "call.manage", tx: Db) {
  if (!isUuid(boardId) || !isUuid(callId)) throw notFound("That call");
  const role = await boardRole(user.id, boardId, tx);
  authorize(user, "board.view", { role }, "That board");
  const call = await loadCall(boardId, callId, tx);
  if (!call) throw notFound("That call");
  if (permission === "call.manage") authorize(user, "call.manage", { role });
  return { call, role };
}

/** The call's response window, for any member of the board (null: the chair has not opened one). */
export async function getResponseWindow(user: SessionUser, boardId: string, callId: string): Promise<ResponseWindowView | null> {
  const tx = db();
  await callFor(user, boardId, callId, "board.view", tx);
  const row = await loadResponseWindow(boardId, callId, tx);
  return row ? toView(row) : null;
}

/** The response window of the call a proposal belongs to, for anyone who may see the proposal. */
export async function getProposalResponseWindow(user: SessionUser, boardId: string, proposalId: string): Promise<ResponseWindowView | null> {
  const tx = db();
  const access = await proposalAccess(user, boardId, proposalId, tx);
  authorize(user, "proposal.view", access.facts, "That proposal");
  const row = await loadResponseWindow(boardId, access.proposal.callId, tx);
  return row ? toView(row) : null;
}

/**
 * Opens the call's response window, or moves its dates (chair). The end must lie in the
 * future and after the start. Moving the end re-arms the reminder and closing e-mails; the
 * opening e-mail goes out once, in this transaction when the window opens now.
 */
export async function setResponseWindow(
  user: SessionUser,
  boardId: string,
  callId: string,
  input: { opensAt: Date; closesAt: Date },
  now = new Date(),
): Promise<ResponseWindowView> {
  if (input.closesAt.getTime() <= input.opensAt.getTime())
    throw unprocessable("The response window must end after it starts: choose a later end date.", {
      issues: [{ path: "closesAt", message: "must be after the start" }],
    });
  if (input.closesAt.getTime() <= now.getTime())
    throw unprocessable(`The end date ${formatDateTime(input.closesAt)} has passed: choose an end date in the future.`, {
      issues: [{ path: "closesAt", message: "must be in the future" }],
    });
  return db().transaction(async (tx) => {
    await callFor(user, boardId, callId, "call.manage", tx);
    const existing = await loadResponseWindow(boardId, callId, tx);
    let row: ResponseWindowRow;
    if (!existing) {
      [row] = (await tx
        .insert(responseWindows)
        .values({ boardId, callId, opensAt: input.opensAt, closesAt: input.closesAt, openedBy: user.id })
        .returning(windowColumns)) as [ResponseWindowRow];
    } else {
      const endMoved = existing.closesAt.getTime() !== input.closesAt.getTime();
      [row] = (await tx
        .update(responseWindows)
        .set({
          opensAt: input.opensAt,
          closesAt: input.closesAt,
          updatedAt: now,
          ...(endMoved ? { reminderMailedAt: null, closingMailedAt: null } : {}),
        })
        .where(and(eq(responseWindows.id, existing.id), eq(responseWindows.boardId, boardId)))
        .returning(windowColumns)) as [ResponseWindowRow];
    }
    await recordAudit(
      {
        action: existing ? "response-window.update" : "response-window.open",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: row.id,
        details: { callId, opensAt: input.opensAt.toISOString(), closesAt: input.closesAt.toISOString() },
      },
      tx,
    );
    const mailed = await sendDueWindowMails(row.id, now, tx);
    return toView(mailed ?? row, now);
  });
}

/** Closes the window now (chair); the closing e-mails go out in the same transaction. */
export async function closeResponseWindow(user: SessionUser, boardId: string, callId: string, now = new Date()): Promise<ResponseWindowView> {
  return db().transaction(async (tx) => {
    await callFor(user, boardId, callId, "call.manage", tx);
    const existing = await loadResponseWindow(boardId, callId, tx);
    if (!existing) throw notFound("That call's response window");
    if (windowState(existing, now) === "closed") throw conflict(`The response window closed on ${formatDateTime(existing.closesAt)} already.`);
    const opensAt = existing.opensAt.getTime() > now.getTime() ? now : existing.opensAt;
    const [row] = (await tx
      .update(responseWindows)
      .set({ opensAt, closesAt: now, updatedAt: now })
      .where(and(eq(responseWindows.id, existing.id), eq(responseWindows.boardId, boardId)))
      .returning(windowColumns)) as [ResponseWindowRow];
    await recordAudit({ action: "response-window.close", actorId: user.id, actorEmail: user.email, boardId, target: row.id, details: { callId } }, tx);
    const mailed = await sendDueWindowMails(row.id, now, tx);
    return toView(mailed ?? row, now);
  });
}

// ---------- e-mails (opening, 2 days before the end, closing): each once per window ----------

interface ProposalRound {
  proposalId: string;
  title: string;
  items: number;
  unanswered: number;
}

/** Proposals of the call under review, with their released items and how many lack an answer. */
async function roundProposals(boardId: string, callId: string, tx: Db): Promise<ProposalRound[]> {
  const released = sql`not exists (
    select 1 from ${assignments} a left join reviews r on r.assignment_id = a.id
    where a.version_id = ${reviewItems.versionId} and a.reviewer_id = ${reviewItems.authorId} and r.status is distinct from 'submitted')`;
  const rows = await tx
    .select({
      proposalId: proposals.id,
      title: proposals.title,
      items: sql<number>`count(${reviewItems.id}) filter (where ${released})`.mapWith(Number),
      unanswered: sql<number>`count(${reviewItems.id}) filter (where ${released} and ${reviewItemAnswers.id} is null)`.mapWith(Number),
    })
    .from(proposals)
    .leftJoin(reviewItems, and(eq(reviewItems.proposalId, proposals.id), eq(reviewItems.boardId, boardId)))
    .leftJoin(reviewItemAnswers, eq(reviewItemAnswers.reviewItemId, reviewItems.id))
    .where(and(eq(proposals.boardId, boardId), eq(proposals.callId, callId), inArray(proposals.status, ["submitted", "in_review"])))
    .groupBy(proposals.id, proposals.title)
    .orderBy(asc(proposals.title));
  return rows;
}

/** Active members' addresses among the given user ids. */
async function activeAddresses(boardId: string, userIds: string[], tx: Db): Promise<Map<string, string>> {
  const out = new Map<string, string>();
  if (userIds.length === 0) return out;
  const rows = await tx
    .select({ id: users.id, email: users.email })
    .from(users)
    .innerJoin(boardMembers, and(eq(boardMembers.userId, users.id), eq(boardMembers.boardId, boardId), eq(boardMembers.status, "active")))
    .where(and(inArray(users.id, userIds), eq(users.status, "active")));
  for (const r of rows) out.set(r.id, r.email);
  return out;
}

async function authorIdsOf(proposalIds: string[], tx: Db): Promise<Map<string, string[]>> {
  const out = new Map<string, string[]>();
  if (proposalIds.length === 0) return out;
  const owners = await tx.select({ proposalId: proposals.id, userId: proposals.ownerId }).from(proposals).where(inArray(proposals.id, proposalIds));
  const coauthors = await tx
    .select({ proposalId: proposalCoauthors.proposalId, userId: proposalCoauthors.userId })
    .from(proposalCoauthors)
    .where(inArray(proposalCoauthors.proposalId, proposalIds));
  for (const r of [...owners, ...coauthors]) out.set(r.proposalId, [...new Set([...(out.get(r.proposalId) ?? []), r.userId])]);
  return out;
}

type Stage = "opening" | "reminder" | "closing";

function dueStage(w: ResponseWindowRow, now: Date): Stage | null {
  const t = now.getTime();
  if (t >= w.closesAt.getTime()) return w.closingMailedAt ? null : "closing";
  if (t < w.opensAt.getTime()) return null;
  if (!w.openingMailedAt) return "opening";
  // A window shorter than the reminder lead gets no reminder (the opening mail says the end date).
  const remindAt = w.closesAt.getTime() - RESPONSE_REMINDER_BEFORE_MS;
  if (!w.reminderMailedAt && t >= remindAt && remindAt > w.opensAt.getTime()) return "reminder";
  return null;
}

/**
 * Sends whatever e-mails of one window are due at `now`, inside `tx`. A stage is claimed by
 * setting its `*_mailed_at` column where it is still null, so two runs never both send it;
 * the dedupe keys (window, stage, end date, proposal, recipient) make a second enqueue a no-op.
 * A window that closed before its opening mail went out sends only the closing one.
 */
async function sendDueWindowMails(windowId: string, now: Date, tx: Transaction): Promise<ResponseWindowRow | null> {
  let latest: ResponseWindowRow | null = null;
  for (let guard = 0; guard < 3; guard++) {
    const [w] = (await tx.select(windowColumns).from(responseWindows).where(eq(responseWindows.id, windowId)).for("update")) as ResponseWindowRow[];
    if (!w) return latest;
    latest = w;
    const stage = dueStage(w, now);
    if (!stage) return w;
    const column = stage === "opening" ? "openingMailedAt" : stage === "reminder" ? "reminderMailedAt" : "closingMailedAt";
    // The closing mail settles the earlier stages too: nobody needs an opening mail for a closed round.
    const set =
      stage === "closing"
        ? { closingMailedAt: now, openingMailedAt: w.openingMailedAt ?? now, reminderMailedAt: w.reminderMailedAt ?? now }
        : { [column]: now };
    await tx.update(responseWindows).set(set).where(eq(responseWindows.id, w.id));
    if (stage === "closing" && !w.openingMailedAt) continue;
    await enqueueStageMails(w, stage, tx);
  }
  return latest;
}

async function enqueueStageMails(w: ResponseWindowRow, stage: Stage, tx: Transaction) {
  const [meta] = await tx
    .select({ boardName: boards.name, callTitle: calls.title })
    .from(calls)
    .innerJoin(boards, eq(boards.id, calls.boardId))
    .where(and(eq(calls.id, w.callId), eq(calls.boardId, w.boardId)));
  if (!meta) return;
  const round = await roundProposals(w.boardId, w.callId, tx);
  const authors = await authorIdsOf(
    round.map((p) => p.proposalId),
    tx,
  );
  const base = env().APP_URL.replace(/\/$/, "");
  const endKey = w.closesAt.toISOString();
  for (const p of round) {
    if (stage === "reminder" && p.unanswered === 0) continue;
    const addresses = await activeAddresses(w.boardId, authors.get(p.proposalId) ?? [], tx);
    if (addresses.size > 0) {
      const mail = await renderResponseWindowMail({
        stage,
        audience: "proposer",
        boardName: meta.boardName,
        callTitle: meta.callTitle,
        proposalTitle: p.title,
        closesAt: w.closesAt,
        itemCount: p.items,
        unanswered: p.unanswered,
        url: `${base}/boards/${w.boardId}/proposals/${p.proposalId}/responses`,
      });
      await enqueueMail(
        {
          kind: `response-${stage}`,
          dedupeKey: `response-${stage}:${w.id}:${endKey}:${p.proposalId}`,
          to: [...addresses.values()].sort(),
          boardId: w.boardId,
          ...mail,
        },
        tx,
      );
    }
    if (stage !== "closing") continue;
    const reviewerRows = await tx
      .selectDistinct({ reviewerId: assignments.reviewerId })
      .from(assignments)
      .where(and(eq(assignments.proposalId, p.proposalId), eq(assignments.boardId, w.boardId)));
    const reviewers = await activeAddresses(
      w.boardId,
      reviewerRows.map((r) => r.reviewerId),
      tx,
    );
    for (const [reviewerId, email] of reviewers) {
      const mail = await renderResponseWindowMail({
        stage,
        audience: "reviewer",
        boardName: meta.boardName,
        callTitle: meta.callTitle,
        proposalTitle: p.title,
        closesAt: w.closesAt,
        itemCount: p.items,
        unanswered: p.unanswered,
        url: `${base}/boards/${w.boardId}/proposals/${p.proposalId}/responses`,
      });
      await enqueueMail(
        { kind: "response-closing", dedupeKey: `response-closing:${w.id}:${endKey}:${p.proposalId}:${reviewerId}`, to: [email], boardId: w.boardId, ...mail },
        tx,
      );
    }
  }
}

/**
 * The job: sends every response-window e-mail due at `now` (lib/jobs/response-windows.ts runs
 * it with the outbox worker). Safe to run as often as one likes and on several instances.
 */
export async function enqueueResponseWindowMails(now: Date = new Date()): Promise<{ windows: number }> {
  const remindFrom = new Date(now.getTime() + RESPONSE_REMINDER_BEFORE_MS);
  const due = await db()
    .select({ id: responseWindows.id })
    .from(responseWindows)
    .where(
      sql`(${and(lte(responseWindows.opensAt, now), isNull(responseWindows.openingMailedAt))})
        or (${and(lte(responseWindows.closesAt, remindFrom), gt(responseWindows.closesAt, now), isNull(responseWindows.reminderMailedAt))})
        or (${and(lte(responseWindows.closesAt, now), isNull(responseWindows.closingMailedAt))})`,
    );
  for (const w of due) await db().transaction((tx) => sendDueWindowMails(w.id, now, tx));
  return { windows: due.length };
}

// ---------- answers ----------

export interface AnswerInput {
  body: string;
  /** A newer version of the same proposal, and a heading in it. Both or neither. */
  sectionVersionId?: string | null;
  sectionHeading?: string | null;
}

const normalise = (s: string) => s.trim().replace(/\s+/g, " ").toLowerCase();

/**
 * The proposer's answer to a review item (one per item; a second call replaces it while
 * the window is open). Only an author of the proposal, only while the call's window is open,
 * only on items released to them; a decided version takes no answers.
 */
export async function answerReviewItem(user: SessionUser, boardId: string, itemId: string, input: AnswerInput, now = new Date()): Promise<ReviewItemView> {
  return db().transaction(async (tx) => {
    const { row, access, facts } = await loadReviewItem(user, boardId, itemId, tx);
    if (!access.isAuthor) throw forbidden("Only the proposal's authors can answer its review items.");
    const window = await loadResponseWindow(boardId, access.proposal.callId, tx);
    if (!window) throw conflict("The chair has not opened a response round for this call, so review items cannot be answered yet.");
    const state = windowState(window, now);
    if (state === "upcoming") throw conflict(`The response round opens on ${formatDateTime(window.opensAt)}; answers can be given from then.`);
    if (state === "closed") throw conflict(`The response round closed on ${formatDateTime(window.closesAt)}; answers can no longer be given or changed.`);
    if (facts.decisionIssued) throw conflict(`The board has decided on version ${row.versionNumber}; its review items take no more answers.`);
    authorize(user, "review-item.answer", facts);
    let sectionVersionId: string | null = null;
    let sectionHeading: string | null = null;
    if (input.sectionVersionId || input.sectionHeading) {
      if (!input.sectionVersionId || !input.sectionHeading)
        throw unprocessable("To point at a section, choose both the version and the section heading.", {
          issues: [{ path: input.sectionVersionId ? "sectionHeading" : "sectionVersionId", message: "choose both a version and a section" }],
        });
      if (!isUuid(input.sectionVersionId))
        throw unprocessable("That version is not one of this dossier's versions.", {
          issues: [{ path: "sectionVersionId", message: "not a version of this dossier" }],
        });
      const [version] = await tx
        .select({ id: proposalVersions.id, number: proposalVersions.number, document: proposalVersions.document })
        .from(proposalVersions)
        .where(and(eq(proposalVersions.id, input.sectionVersionId), eq(proposalVersions.proposalId, row.proposalId), eq(proposalVersions.boardId, boardId)));
      if (!version)
        throw unprocessable("That version is not one of this dossier's versions.", {
          issues: [{ path: "sectionVersionId", message: "not a version of this dossier" }],
        });
      if (version.number <= row.versionNumber)
        throw unprocessable(`An answer can point at a newer version than version ${row.versionNumber}, where the item was raised.`, {
          issues: [{ path: "sectionVersionId", message: "must be a newer version" }],
        });
      const heading = dossierHeadings(version.document).find((h) => normalise(h) === normalise(input.sectionHeading!));
      if (!heading)
        throw unprocessable(`Version ${version.number} has no section headed “${input.sectionHeading.slice(0, 120)}”.`, {
          issues: [{ path: "sectionHeading", message: "no such section in that version" }],
        });
      sectionVersionId = version.id;
      sectionHeading = heading;
    }
    await tx
      .insert(reviewItemAnswers)
      .values({ boardId, reviewItemId: row.id, windowId: window.id, authorId: user.id, body: input.body, sectionVersionId, sectionHeading })
      .onConflictDoUpdate({
        target: reviewItemAnswers.reviewItemId,
        set: { body: input.body, sectionVersionId, sectionHeading, authorId: user.id, windowId: window.id, updatedAt: now },
      });
    await recordAudit(
      {
        action: "review-item.answer",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: row.id,
        details: { proposalId: row.proposalId, sectionVersionId },
      },
      tx,
    );
    return (await presentReviewItems(user, access, [row], tx))[0]!;
  });
}

export interface AnswerSectionChoice {
  versionId: string;
  versionNumber: number;
  headings: string[];
}

/** Versions of the proposal newer than `afterVersion`, with their headings: what an answer may point at. Authors and the chair. */
export async function listAnswerSections(user: SessionUser, boardId: string, proposalId: string, afterVersion: number): Promise<AnswerSectionChoice[]> {
  const tx = db();
  const access = await proposalAccess(user, boardId, proposalId, tx);
  authorize(user, "proposal.view", access.facts, "That proposal");
  const rows = await tx
    .select({ id: proposalVersions.id, number: proposalVersions.number, document: proposalVersions.document })
    .from(proposalVersions)
    .where(and(eq(proposalVersions.boardId, boardId), eq(proposalVersions.proposalId, proposalId), gt(proposalVersions.number, afterVersion)))
    .orderBy(asc(proposalVersions.number));
  return rows.map((v) => ({ versionId: v.id, versionNumber: v.number, headings: [...new Set(dossierHeadings(v.document).filter(Boolean))] }));
}

// ---------- dispositions ----------

export interface DispositionInput {
  disposition: DispositionCode;
  reason?: string;
}

/**
 * Records what became of a review item: the reviewer who raised it or the chair. Appends to
 * the item's history (never rewrites it). "Not accepted" needs a reason. A decided version's
 * items take no more dispositions.
 */
export async function recordDisposition(user: SessionUser, boardId: string, itemId: string, input: DispositionInput): Promise<ReviewItemView> {
  return db().transaction(async (tx) => {
    const { row, access, facts } = await loadReviewItem(user, boardId, itemId, tx);
    if (!can(user, "review-item.dispose", facts)) throw forbidden("Only the reviewer who raised this item or the chair can record its disposition.");
    if (facts.decisionIssued) throw conflict(`The board has decided on version ${row.versionNumber}; its review items are settled.`);
    const reason = (input.reason ?? "").trim();
    if (input.disposition === "not-accepted" && reason.length === 0)
      throw unprocessable("Say why the answer is not accepted: a reason is required.", { issues: [{ path: "reason", message: "required when not accepted" }] });
    const actorRole = access.role === "chair" || (user.isAdmin && access.role !== "reviewer") ? "chair" : "reviewer";
    await tx.insert(reviewItemDispositions).values({ boardId, reviewItemId: row.id, disposition: input.disposition, reason, actorId: user.id, actorRole });
    await recordAudit(
      {
        action: "review-item.disposition",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: row.id,
        details: { proposalId: row.proposalId, disposition: input.disposition },
      },
      tx,
    );
    return (await presentReviewItems(user, access, [row], tx))[0]!;
  });
}

/** The item's disposition history, oldest first, for anyone who may see the item. */
export async function listDispositions(user: SessionUser, boardId: string, itemId: string): Promise<DispositionEntry[]> {
  return (await getReviewItem(user, boardId, itemId)).dispositionHistory;
}
