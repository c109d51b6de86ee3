import "server-only";
import { and, asc, count, desc, eq, ilike, inArray, or, sql, type SQL } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import {
  assignments,
  attachments,
  boardMembers,
  boards,
  calls,
  checkResults,
  decisions,
  proposalCoauthors,
  proposalDrafts,
  proposals,
  proposalVersions,
  users,
  type ProposalStatus,
  type VersionAttachment,
} from "@/db/schema";
import { authorize, type ResourceFacts } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { badRequest, conflict, notFound, unprocessable } from "@/lib/errors";
import { z } from "zod";
import {
  EMPTY_DOSSIER,
  MAX_DOCUMENT_BYTES,
  evaluateBlocks,
  extractOrbitChecks,
  ORBIT_CHECK_CONTRACT_VERSION,
  renderDossierHtml,
  submissionProblems,
  validateDossier,
  type BlockVerdict,
  type DossierDoc,
} from "@/lib/dossier";
import { proposalSortColumns, type DraftSaveInput, type ProposalCreateInput, type ProposalListQuery, type ProposalUpdateInput } from "@/lib/validation/dossier";
import { deleteObject, writeObject } from "@/storage/object-store";
import { recordAudit } from "./audit";
import { recordFileComparisons } from "./orbit-files";
import { boardRole, isUuid } from "./boards";
import { callState, loadCall } from "./calls";
import { effectiveFileTolerance, type FileComparisonTolerance } from "@/lib/orbit-files/tolerance";
import { isConflicted as reviewerIsConflicted } from "./conflicts";
import { enqueueSubmissionReceipt } from "@/lib/mail/notices";
import { formatDateTime } from "@/lib/format/dates";
import { countOutcomes, judgeBlocks } from "@/lib/dossier/requirements";
import type { RequirementOutcome } from "@/lib/requirements";
import { loadRequirements, type CallRequirementView } from "./requirements";
import { rerunWithTodaysRules, type Rerun } from "@/lib/dossier/rerun";

type Db = Database | Transaction;

export interface ProposalRecord {
  id: string;
  boardId: string;
  callId: string;
  ownerId: string;
  title: string;
  missionType: string;
  status: ProposalStatus;
  latestVersion: number;
  createdAt: Date;
  updatedAt: Date;
}

const proposalColumns = {
  id: proposals.id,
  boardId: proposals.boardId,
  callId: proposals.callId,
  ownerId: proposals.ownerId,
  title: proposals.title,
  missionType: proposals.missionType,
  status: proposals.status,
  latestVersion: proposals.latestVersion,
  createdAt: proposals.createdAt,
  updatedAt: proposals.updatedAt,
};

export async function loadProposal(boardId: string, proposalId: string, tx: Db = db()): Promise<ProposalRecord | null> {
  if (!isUuid(boardId) || !isUuid(proposalId)) return null;
  const [row] = await tx
    .select(proposalColumns)
    .from(proposals)
    .where(and(eq(proposals.boardId, boardId), eq(proposals.id, proposalId)))
    .limit(1);
  return row ?? null;
}

/** What the caller is to a proposal, for the policy. */
export async function proposalFacts(userId: string, proposal: ProposalRecord, tx: Db = db()): Promise<ResourceFacts> {
  const role = await boardRole(userId, proposal.boardId, tx);
  let isAuthor = proposal.ownerId === userId;
  if (!isAuthor) {
    const [co] = await tx
      .select({ userId: proposalCoauthors.userId })
      .from(proposalCoauthors)
      .where(and(eq(proposalCoauthors.proposalId, proposal.id), eq(proposalCoauthors.userId, userId)))
      .limit(1);
    isAuthor = Boolean(co);
  }
  // Authorship counts only while the author is still an active member of the board.
  if (isAuthor && role === null) isAuthor = false;
  let isAssigned = false;
  let isConflicted = false;
  if (role === "reviewer") {
    const [a] = await tx
      .select({ id: assignments.id })
      .from(assignments)
      .where(and(eq(assignments.boardId, proposal.boardId), eq(assignments.proposalId, proposal.id), eq(assignments.reviewerId, userId)))
      .limit(1);
    isAssigned = Boolean(a);
    // The same conflict rules as assignment: declared (proposal or organisation) or the same organisation as an author.
    isConflicted = await reviewerIsConflicted(proposal.boardId, userId, proposal.id, tx);
  }
  return { role, isAuthor, isAssigned, isConflicted };
}

/**
 * Blind review: the board hides proposers' names from reviewers. Chairs, admins and the
 * proposal's own authors still see them.
 */
export async function proposerNamesHiddenFor(user: SessionUser, boardId: string, facts: ResourceFacts, tx: Db = db()): Promise<boolean> {
  if (user.isAdmin || facts.isAuthor || facts.role !== "reviewer") return false;
  const [board] = await tx.select({ hide: boards.hideProposerNames }).from(boards).where(eq(boards.id, boardId)).limit(1);
  return board?.hide === true;
}

/**
 * The version ids a reviewer may read: the ones assigned to them, unless the board lets
 * reviewers read every submitted version. null means no limit (authors, chairs, admins).
 */
export async function readableVersionIds(user: SessionUser, proposal: ProposalRecord, facts: ResourceFacts, tx: Db = db()): Promise<Set<string> | null> {
  if (user.isAdmin || facts.isAuthor || facts.role !== "reviewer") return null;
  const [board] = await tx.select({ all: boards.reviewersSeeAllVersions }).from(boards).where(eq(boards.id, proposal.boardId)).limit(1);
  if (board?.all) return null;
  const rows = await tx
    .select({ versionId: assignments.versionId })
    .from(assignments)
    .where(and(eq(assignments.boardId, proposal.boardId), eq(assignments.proposalId, proposal.id), eq(assignments.reviewerId, user.id)));
  return new Set(rows.map((r) => r.versionId));
}

/** Loads a proposal and checks one permission on it; unknown and hidden proposals are 404. */
export async function proposalFor(
  user: SessionUser,
  boardId: string,
  proposalId: string,
  permission: "proposal.view" | "proposal.edit",
  tx: Db = db(),
): Promise<{ proposal: ProposalRecord; facts: ResourceFacts }> {
  const proposal = await loadProposal(boardId, proposalId, tx);
  if (!proposal) {
    // Same answer for "no such proposal" and "a board you are not on".
    throw notFound("That proposal");
  }
  const facts = await proposalFacts(user.id, proposal, tx);
  authorize(user, permission, facts, "That proposal");
  return { proposal, facts };
}

async function latestDecisionOutcome(proposalId: string, tx: Db): Promise<string | null> {
  const [row] = await tx
    .select({ outcome: decisions.outcome })
    .from(decisions)
    .where(eq(decisions.proposalId, proposalId))
    .orderBy(desc(decisions.decidedAt))
    .limit(1);
  return row?.outcome ?? null;
}

/** Whether authors may change the draft and submit: a draft, or a decision asked for a revision. */
export async function editableState(proposal: ProposalRecord, tx: Db = db()): Promise<{ editable: boolean; reason: string | null }> {
  switch (proposal.status) {
    case "draft":
      return { editable: true, reason: null };
    case "decided":
      if ((await latestDecisionOutcome(proposal.id, tx)) === "revise") return { editable: true, reason: null };
      return { editable: false, reason: "A final decision has been issued on this proposal; it can no longer be changed." };
    case "withdrawn":
      return { editable: false, reason: "This proposal was withdrawn." };
    default:
      return {
        editable: false,
        reason: `Version ${proposal.latestVersion} is with the board for review; you can change the dossier again if the board asks for a revision.`,
      };
  }
}

async function assertEditable(proposal: ProposalRecord, tx: Db) {
  const { editable, reason } = await editableState(proposal, tx);
  if (!editable) throw conflict(reason ?? "This proposal cannot be changed now.");
}

// ---------------------------------------------------------------------------------------
// Listing and creation

export interface ProposalRow {
  id: string;
  title: string;
  missionType: string;
  status: ProposalStatus;
  callId: string;
  callTitle: string;
  latestVersion: number;
  isOwner: boolean;
  createdAt: string;
  updatedAt: string;
}

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

// Keyset paging: a cursor names the sort, its direction, the last row's sort value (as
// PostgreSQL prints it, so timestamps keep their microseconds) and its id. It is opaque to
// clients; a cursor made for another sort or direction is refused with a 400.
// `b: 1` marks a cursor that reads backwards (the page before the row it names: the UI's Previous).
const cursorSchema = z.object({ s: z.enum(proposalSortColumns), d: z.enum(["asc", "desc"]), v: z.string().max(1000), i: z.uuid(), b: z.literal(1).optional() });
type ProposalCursor = z.infer<typeof cursorSchema>;

export function encodeProposalCursor(cursor: ProposalCursor): string {
  return Buffer.from(JSON.stringify(cursor), "utf8").toString("base64url");
}

function decodeProposalCursor(text: string, query: ProposalListQuery): ProposalCursor {
  let parsed: unknown;
  try {
    parsed = JSON.parse(Buffer.from(text, "base64url").toString("utf8"));
  } catch {
    parsed = null;
  }
  const result = cursorSchema.safeParse(parsed);
  if (!result.success) throw badRequest("That cursor is not one this list gave out; start again from the first page.", { field: "cursor" });
  if (result.data.s !== query.sort || result.data.d !== query.dir)
    throw badRequest("That cursor belongs to another sort order; start again from the first page of this one.", { field: "cursor" });
  if ((query.sort === "updatedAt" || query.sort === "createdAt") && !/^\d{4}-\d\d-\d\d \d\d:\d\d:\d\d(\.\d{1,6})?[+-]\d\d(:\d\d){0,2}$/.test(result.data.v))
    throw badRequest("That cursor is not one this list gave out; start again from the first page.", { field: "cursor" });
  if (query.sort === "latestVersion" && !/^\d{1,9}$/.test(result.data.v))
    throw badRequest("That cursor is not one this list gave out; start again from the first page.", { field: "cursor" });
  return result.data;
}

export interface ProposalPage {
  rows: ProposalRow[];
  page: number;
  pageSize: number;
  /** Whether at least one more row follows this page (one extra row is fetched; no count). */
  hasMore: boolean;
  /** Pass as `cursor` to get the next page by keyset; null on the last page. */
  nextCursor: string | null;
  /** Pass as `cursor` to get the page before this one by keyset; null on the first page. */
  prevCursor: string | null;
}

/** The list's statement, also used by the plan check in the tests. */
export function proposalListStatement(user: SessionUser, boardId: string, role: string | null, query: ProposalListQuery) {
  const conditions: SQL[] = [eq(proposals.boardId, boardId)];
  if (role !== "chair" && !user.isAdmin) {
    const coauthored = db().select({ id: proposalCoauthors.proposalId }).from(proposalCoauthors).where(eq(proposalCoauthors.userId, user.id));
    conditions.push(or(eq(proposals.ownerId, user.id), inArray(proposals.id, coauthored))!);
  }
  if (query.status) conditions.push(eq(proposals.status, query.status));
  if (query.callId) conditions.push(eq(proposals.callId, query.callId));
  if (query.q) {
    const pattern = `%${escapeLike(query.q)}%`;
    const callsMatching = db()
      .select({ id: calls.id })
      .from(calls)
      .where(and(eq(calls.boardId, boardId), ilike(calls.title, pattern)));
    conditions.push(or(ilike(proposals.title, pattern), ilike(proposals.missionType, pattern), inArray(proposals.callId, callsMatching))!);
  }
  // The call's title comes from a lookup per returned row rather than a join: with a join the
  // planner guesses the rows per call and may sort the whole board instead of reading the index.
  const callTitle = sql<string>`(select ${calls.title} from ${calls} where ${calls.id} = ${proposals.callId} and ${calls.boardId} = ${proposals.boardId})`;
  const sortColumn = {
    title: proposals.title,
    status: proposals.status,
    updatedAt: proposals.updatedAt,
    createdAt: proposals.createdAt,
    callTitle,
    latestVersion: proposals.latestVersion,
  }[query.sort];
  // A backward cursor walks the same index the other way; listProposals puts its rows back in order.
  const backward = query.cursor ? decodeProposalCursor(query.cursor, query).b === 1 : false;
  const ascending = (query.dir === "asc") !== backward;
  if (query.cursor) {
    const cursor = decodeProposalCursor(query.cursor, query);
    const type = query.sort === "updatedAt" || query.sort === "createdAt" ? "timestamptz" : query.sort === "latestVersion" ? "integer" : "text";
    // A row comparison, so (board, column, id) is one index range in either direction.
    conditions.push(sql`(${sortColumn}, ${proposals.id}) ${sql.raw(ascending ? ">" : "<")} (${cursor.v}::${sql.raw(type)}, ${cursor.i}::uuid)`);
  }
  // The id tie-break runs in the sort's direction so one index (board, column, id) serves both directions.
  const order = ascending ? [asc(sortColumn), asc(proposals.id)] : [desc(sortColumn), desc(proposals.id)];
  return db()
    .select({
      id: proposals.id,
      title: proposals.title,
      missionType: proposals.missionType,
      status: proposals.status,
      callId: proposals.callId,
      callTitle,
      latestVersion: proposals.latestVersion,
      ownerId: proposals.ownerId,
      createdAt: proposals.createdAt,
      updatedAt: proposals.updatedAt,
      sortValue: sql<string>`${sortColumn}::text`,
    })
    .from(proposals)
    .where(and(...conditions))
    .orderBy(...order)
    .limit(query.pageSize + 1)
    .offset(query.cursor ? 0 : (query.page - 1) * query.pageSize);
}

/**
 * Proposals of a board the caller may see: all of them for chairs, their own and co-authored
 * ones for others. Pages by `cursor` (keyset) when given, else by `page` (offset, for the UI);
 * fetches one row more than the page to say whether another follows, and counts nothing.
 */
export async function listProposals(user: SessionUser, boardId: string, query: ProposalListQuery): Promise<ProposalPage> {
  if (!isUuid(boardId)) throw notFound("That board");
  const role = await boardRole(user.id, boardId);
  authorize(user, "board.view", { role }, "That board");
  const fetched = await proposalListStatement(user, boardId, role, query);
  const backward = query.cursor ? decodeProposalCursor(query.cursor, query).b === 1 : false;
  // The extra row lies beyond the page in the direction read: after it going forward, before it going back.
  const extra = fetched.length > query.pageSize;
  const page = extra ? fetched.slice(0, query.pageSize) : fetched;
  const rows = backward ? page.reverse() : page;
  // Going back, the page we came from follows; going forward, a page precedes unless this is the first.
  const hasMore = backward ? true : extra;
  const hasBefore = backward ? extra : Boolean(query.cursor) || query.page > 1;
  const first = rows.at(0);
  const last = rows.at(-1);
  return {
    rows: rows.map((r) => ({
      id: r.id,
      title: r.title,
      missionType: r.missionType,
      status: r.status,
      callId: r.callId,
      callTitle: r.callTitle,
      latestVersion: r.latestVersion,
      isOwner: r.ownerId === user.id,
      createdAt: r.createdAt.toISOString(),
      updatedAt: r.updatedAt.toISOString(),
    })),
    page: query.page,
    pageSize: query.pageSize,
    hasMore,
    nextCursor: hasMore && last ? encodeProposalCursor({ s: query.sort, d: query.dir, v: last.sortValue, i: last.id }) : null,
    prevCursor: hasBefore && first ? encodeProposalCursor({ s: query.sort, d: query.dir, v: first.sortValue, i: first.id, b: 1 }) : null,
  };
}

/**
 * Co-authors by the full addresses a proposer typed: the active proposers of the board with
 * exactly those addresses (the board's proposers are never listed to a proposer). An address
 * that is not one is refused with 422, naming only what the caller typed.
 */
export async function coauthorIdsForEmails(user: SessionUser, boardId: string, emails: string[], tx: Db = db()): Promise<string[]> {
  const role = await boardRole(user.id, boardId, tx);
  authorize(user, "board.view", { role }, "That board");
  const wanted = [...new Set(emails.map((e) => e.trim().toLowerCase()).filter(Boolean))];
  if (wanted.length === 0) return [];
  const rows = await tx
    .select({ id: users.id, email: users.email })
    .from(boardMembers)
    .innerJoin(users, eq(users.id, boardMembers.userId))
    .where(
      and(
        eq(boardMembers.boardId, boardId),
        eq(boardMembers.role, "proposer"),
        eq(boardMembers.status, "active"),
        eq(users.status, "active"),
        inArray(sql`lower(${users.email})`, wanted),
      ),
    );
  const found = new Map(rows.map((r) => [r.email.toLowerCase(), r.id]));
  const missing = wanted.filter((e) => !found.has(e));
  if (missing.length > 0)
    throw unprocessable(
      `${missing.join(", ")} ${missing.length === 1 ? "is" : "are"} not a proposer of this board. Check the spelling, or ask the chair to invite them.`,
      {
        field: "coauthorEmails",
      },
    );
  return [...found.values()];
}

async function checkCoauthors(boardId: string, ownerId: string, ids: string[], tx: Db): Promise<string[]> {
  const wanted = [...new Set(ids)].filter((id) => id !== ownerId);
  if (wanted.length === 0) return [];
  const rows = await tx
    .select({ userId: boardMembers.userId })
    .from(boardMembers)
    .where(and(eq(boardMembers.boardId, boardId), inArray(boardMembers.userId, wanted), eq(boardMembers.role, "proposer"), eq(boardMembers.status, "active")));
  const found = new Set(rows.map((r) => r.userId));
  const missing = wanted.filter((id) => !found.has(id));
  if (missing.length > 0) throw unprocessable("Co-authors must be active proposers of this board.", { notProposers: missing });
  return wanted;
}

/** A starting document: the call's required sections as headings, each with an empty paragraph. */
export function seedDocument(requiredSections: readonly string[]): DossierDoc {
  if (requiredSections.length === 0) return EMPTY_DOSSIER;
  return {
    type: "doc",
    content: requiredSections.flatMap((s) => [{ type: "heading", attrs: { level: 2 }, content: [{ type: "text", text: s }] }, { type: "paragraph" }]),
  };
}

export async function createProposal(user: SessionUser, boardId: string, input: ProposalCreateInput): Promise<ProposalRecord> {
  const role = await boardRole(user.id, boardId);
  authorize(user, "proposal.create", { role }, "That board");
  const call = await loadCall(boardId, input.callId);
  if (!call) throw unprocessable("That call is not one of this board's calls.", { field: "callId" });
  if (callState(call) === "closed")
    throw unprocessable(`The call "${call.title}" closed on ${formatDateTime(call.closesAt)}; choose an open call.`, { field: "callId" });
  return db().transaction(async (tx) => {
    const byEmail = await coauthorIdsForEmails(user, boardId, input.coauthorEmails ?? [], tx);
    const coauthors = await checkCoauthors(boardId, user.id, [...input.coauthorIds, ...byEmail], tx);
    const [row] = await tx
      .insert(proposals)
      .values({ boardId, callId: call.id, ownerId: user.id, title: input.title, missionType: input.missionType })
      .returning(proposalColumns);
    if (coauthors.length > 0) await tx.insert(proposalCoauthors).values(coauthors.map((userId) => ({ proposalId: row!.id, userId })));
    await tx
      .insert(proposalDrafts)
      .values({ proposalId: row!.id, document: seedDocument(call.requiredSections) as unknown as Record<string, unknown>, updatedBy: user.id });
    await recordAudit(
      { action: "proposal.create", actorId: user.id, actorEmail: user.email, boardId, target: row!.id, details: { title: input.title, callId: call.id } },
      tx,
    );
    return row!;
  });
}

export interface ProposalDetail extends Omit<ProposalRecord, "ownerId"> {
  /** null when proposer names are hidden from the caller (blind review). */
  ownerId: string | null;
  callTitle: string;
  callClosesAt: string;
  callState: "upcoming" | "open" | "closed";
  requiredSections: string[];
  tolerance: { relative: number; absolute?: Record<string, number> };
  /** The call's bounds for comparing attached orbit files with the text (defaults unless the chair set them). */
  fileTolerance: FileComparisonTolerance;
  /** The call's requirements, shown to proposers with their rationale and judged live in the rail. */
  requirements: CallRequirementView[];
  owner: { id: string; name: string } | null;
  coauthors: { id: string; name: string }[];
  /** The board hides proposers' names from this caller: owner and co-authors are left out. */
  proposerNamesHidden: boolean;
  canEdit: boolean;
  editBlockedReason: string | null;
}

export async function getProposal(user: SessionUser, boardId: string, proposalId: string): Promise<ProposalDetail> {
  const { proposal, facts } = await proposalFor(user, boardId, proposalId, "proposal.view");
  const call = await loadCall(boardId, proposal.callId);
  if (!call) throw notFound("That proposal's call");
  const [owner] = await db().select({ id: users.id, name: users.name }).from(users).where(eq(users.id, proposal.ownerId)).limit(1);
  const coauthors = await db()
    .select({ id: users.id, name: users.name })
    .from(proposalCoauthors)
    .innerJoin(users, eq(users.id, proposalCoauthors.userId))
    .where(eq(proposalCoauthors.proposalId, proposal.id))
    .orderBy(asc(users.name));
  const state = await editableState(proposal);
  const isAuthor = facts.isAuthor === true || user.isAdmin;
  const hidden = await proposerNamesHiddenFor(user, boardId, facts);
  return {
    ...proposal,
    ownerId: hidden ? null : proposal.ownerId,
    callTitle: call.title,
    callClosesAt: call.closesAt.toISOString(),
    callState: callState(call),
    requiredSections: call.requiredSections,
    tolerance: call.tolerance,
    fileTolerance: effectiveFileTolerance(call.fileTolerance),
    requirements: await loadRequirements(boardId, proposal.callId),
    owner: hidden ? null : (owner ?? { id: proposal.ownerId, name: "(unknown)" }),
    coauthors: hidden ? [] : coauthors,
    proposerNamesHidden: hidden,
    canEdit: isAuthor && state.editable,
    editBlockedReason: isAuthor ? state.reason : "Only the proposal's authors can change it.",
  };
}

export async function updateProposal(user: SessionUser, boardId: string, proposalId: string, input: ProposalUpdateInput): Promise<ProposalRecord> {
  return db().transaction(async (tx) => {
    const { proposal } = await proposalFor(user, boardId, proposalId, "proposal.edit", tx);
    await assertEditable(proposal, tx);
    const [row] = await tx
      .update(proposals)
      .set({
        ...(input.title !== undefined ? { title: input.title } : {}),
        ...(input.missionType !== undefined ? { missionType: input.missionType } : {}),
        updatedAt: new Date(),
      })
      .where(and(eq(proposals.boardId, boardId), eq(proposals.id, proposalId)))
      .returning(proposalColumns);
    if (input.coauthorIds) {
      const coauthors = await checkCoauthors(boardId, proposal.ownerId, input.coauthorIds, tx);
      await tx.delete(proposalCoauthors).where(eq(proposalCoauthors.proposalId, proposalId));
      if (coauthors.length > 0) await tx.insert(proposalCoauthors).values(coauthors.map((userId) => ({ proposalId, userId })));
    }
    await recordAudit({ action: "proposal.update", actorId: user.id, actorEmail: user.email, boardId, target: proposalId, details: { ...input } }, tx);
    return row!;
  });
}

// ---------------------------------------------------------------------------------------
// Drafts (autosave with optimistic concurrency)

export interface DraftView {
  proposalId: string;
  revision: number;
  basedOnVersion: number;
  document: Record<string, unknown>;
  updatedAt: string;
  dropped?: string[];
}

async function confirmedAttachmentIds(proposalId: string, tx: Db): Promise<Set<string>> {
  const rows = await tx
    .select({ id: attachments.id })
    .from(attachments)
    .where(and(eq(attachments.proposalId, proposalId), eq(attachments.status, "confirmed")));
  return new Set(rows.map((r) => r.id.toLowerCase()));
}

export async function getDraft(user: SessionUser, boardId: string, proposalId: string): Promise<DraftView> {
  const { proposal } = await proposalFor(user, boardId, proposalId, "proposal.edit");
  const [row] = await db()
    .select({
      revision: proposalDrafts.revision,
      basedOnVersion: proposalDrafts.basedOnVersion,
      document: proposalDrafts.document,
      updatedAt: proposalDrafts.updatedAt,
    })
    .from(proposalDrafts)
    .where(eq(proposalDrafts.proposalId, proposal.id))
    .limit(1);
  if (!row)
    return {
      proposalId,
      revision: 0,
      basedOnVersion: 0,
      document: EMPTY_DOSSIER as unknown as Record<string, unknown>,
      updatedAt: proposal.createdAt.toISOString(),
    };
  return { proposalId, ...row, updatedAt: row.updatedAt.toISOString() };
}

/**
 * Saves the draft when `revision` is still the stored one; otherwise 409 with the current
 * revision, so the editor can offer to reload and reapply (the caller keeps its text).
 */
export async function saveDraft(user: SessionUser, boardId: string, proposalId: string, input: DraftSaveInput): Promise<DraftView> {
  const size = Buffer.byteLength(JSON.stringify(input.document), "utf8");
  if (size > MAX_DOCUMENT_BYTES)
    throw unprocessable(`The document is larger than ${MAX_DOCUMENT_BYTES / 1024 / 1024} MB; move large tables or data into attachments.`);
  return db().transaction(async (tx) => {
    const { proposal } = await proposalFor(user, boardId, proposalId, "proposal.edit", tx);
    await assertEditable(proposal, tx);
    const checked = validateDossier(input.document, { boardId, attachmentIds: await confirmedAttachmentIds(proposalId, tx) });
    if (!checked.ok) throw unprocessable(checked.message, { dropped: checked.dropped });
    const now = new Date();
    const [row] = await tx
      .update(proposalDrafts)
      .set({ document: checked.doc as unknown as Record<string, unknown>, revision: sql`${proposalDrafts.revision} + 1`, updatedAt: now, updatedBy: user.id })
      .where(and(eq(proposalDrafts.proposalId, proposalId), eq(proposalDrafts.revision, input.revision)))
      .returning({ revision: proposalDrafts.revision, basedOnVersion: proposalDrafts.basedOnVersion, updatedAt: proposalDrafts.updatedAt });
    if (!row) {
      const [current] = await tx
        .select({ revision: proposalDrafts.revision, updatedAt: proposalDrafts.updatedAt, updatedBy: users.name })
        .from(proposalDrafts)
        .leftJoin(users, eq(users.id, proposalDrafts.updatedBy))
        .where(eq(proposalDrafts.proposalId, proposalId))
        .limit(1);
      throw conflict(
        `This draft was changed elsewhere${current?.updatedBy ? ` by ${current.updatedBy}` : ""} since you loaded it (you have revision ${input.revision}, the latest is ${current?.revision ?? "unknown"}). Your text is kept: reload the latest and reapply your changes.`,
        { currentRevision: current?.revision ?? null, yourRevision: input.revision },
      );
    }
    await tx.update(proposals).set({ updatedAt: now }).where(eq(proposals.id, proposalId));
    return {
      proposalId,
      ...row,
      document: checked.doc as unknown as Record<string, unknown>,
      updatedAt: row.updatedAt.toISOString(),
      dropped: checked.dropped,
    };
  });
}

// ---------------------------------------------------------------------------------------
// Submission

export function versionObjectKey(boardId: string, proposalId: string, n: number, file: "document.json" | "document.html"): string {
  return `boards/${boardId}/proposals/${proposalId}/versions/${n}/${file}`;
}

export interface SubmissionResult {
  versionId: string;
  number: number;
  counts: { consistent: number; inconsistent: number; invalid: number };
  /** The call's requirements judged on the claims (second axis). */
  requirementCounts: { met: number; notMet: number; notEvaluated: number };
  results: {
    blockId: string;
    label: string;
    kind: string;
    status: "consistent" | "inconsistent" | "invalid";
    requirements: { requirementId: string; status: "met" | "notMet" | "notEvaluated"; reason: string }[];
  }[];
}

/**
 * Submits the saved draft as the next immutable version: required sections and evaluable
 * claims first (422 listing what to fix), the call must be open, then the JSON and HTML go
 * to the object store and, in one transaction, the version, the server's check results and
 * the new status. Objects written for a transaction that fails are deleted again.
 */
export async function submitProposal(user: SessionUser, boardId: string, proposalId: string, input: { revision?: number } = {}): Promise<SubmissionResult> {
  const written: string[] = [];
  try {
    return await db().transaction(async (tx) => {
      await proposalFor(user, boardId, proposalId, "proposal.edit", tx);
      // Serialise submissions of one proposal: the second waits here and then sees the new status.
      await tx.execute(sql`select 1 from ${proposals} where ${proposals.id} = ${proposalId} for update`);
      const fresh = (await loadProposal(boardId, proposalId, tx))!;
      await assertEditable(fresh, tx);
      const call = await loadCall(boardId, fresh.callId, tx);
      if (!call) throw notFound("That proposal's call");
      const state = callState(call);
      if (state === "closed")
        throw conflict(
          `The call "${call.title}" closed on ${call.closesAt.toISOString().replace("T", " ").slice(0, 16)} UTC; it no longer accepts submissions. Contact the board's chair.`,
        );
      if (state === "upcoming") throw conflict(`The call "${call.title}" opens on ${formatDateTime(call.opensAt)}; submit once it is open.`);

      const [draft] = await tx
        .select({ document: proposalDrafts.document, revision: proposalDrafts.revision })
        .from(proposalDrafts)
        .where(eq(proposalDrafts.proposalId, proposalId))
        .limit(1);
      if (!draft) throw unprocessable("There is no draft to submit yet; write the dossier first.");
      if (input.revision !== undefined && input.revision !== draft.revision) {
        throw conflict(
          `The saved draft changed since you loaded it (revision ${draft.revision}, you have ${input.revision}). Reload, check the text, and submit again.`,
          { currentRevision: draft.revision },
        );
      }
      const attachmentRows = await tx
        .select({
          id: attachments.id,
          filename: attachments.filename,
          contentType: attachments.detectedType,
          size: attachments.size,
          sha256: attachments.sha256,
        })
        .from(attachments)
        .where(and(eq(attachments.proposalId, proposalId), eq(attachments.boardId, boardId), eq(attachments.status, "confirmed")))
        .orderBy(asc(attachments.createdAt));
      const checked = validateDossier(draft.document, { boardId, attachmentIds: new Set(attachmentRows.map((a) => a.id.toLowerCase())) });
      if (!checked.ok) throw unprocessable(checked.message);
      const doc = checked.doc;

      const evaluations = evaluateBlocks(extractOrbitChecks(doc), call.tolerance);
      const problems = submissionProblems(doc, call.requiredSections, evaluations);
      if (problems.length > 0) {
        throw unprocessable(`The dossier is not ready to submit: ${problems.map((p) => p.message).join(" ")}`, { problems });
      }

      const number = fresh.latestVersion + 1;
      // The second axis: the call's requirements judged on each claim, stored with it.
      const outcomes = judgeBlocks(evaluations, await loadRequirements(boardId, fresh.callId, tx));
      const verdicts: Record<string, BlockVerdict> = Object.fromEntries(
        evaluations.map((e) => [
          e.block.blockId,
          { status: e.result.status, checks: e.result.checks, messages: e.result.messages, requirements: outcomes[e.block.blockId] ?? [] },
        ]),
      );
      const html = renderDossierHtml(doc, { verdicts, tolerance: call.tolerance });
      const documentKey = versionObjectKey(boardId, proposalId, number, "document.json");
      const htmlKey = versionObjectKey(boardId, proposalId, number, "document.html");
      written.push(documentKey);
      await writeObject(documentKey, JSON.stringify(doc), "application/json; charset=utf-8");
      written.push(htmlKey);
      await writeObject(
        htmlKey,
        `<!doctype html><meta charset="utf-8"><title>${fresh.title.replace(/[<&>]/g, "")} (version ${number})</title>\n<article class="prose-dossier">\n${html}\n</article>\n`,
        "text/html; charset=utf-8",
      );

      const versionAttachments: VersionAttachment[] = attachmentRows.map((a) => ({
        attachmentId: a.id,
        filename: a.filename,
        contentType: a.contentType ?? "application/octet-stream",
        size: a.size ?? 0,
        sha256: a.sha256 ?? "",
      }));
      const [version] = await tx
        .insert(proposalVersions)
        .values({
          proposalId,
          boardId,
          number,
          title: fresh.title,
          document: doc as unknown as Record<string, unknown>,
          documentKey,
          htmlKey,
          attachments: versionAttachments,
          submittedBy: user.id,
        })
        .returning({ id: proposalVersions.id });
      if (evaluations.length > 0) {
        await tx.insert(checkResults).values(
          evaluations.map((e) => ({
            versionId: version!.id,
            boardId,
            blockId: e.block.blockId,
            label: e.block.label,
            kind: e.block.claim.kind,
            status: e.result.status,
            claim: e.claim as unknown as Record<string, unknown>,
            result: e.result as unknown as Record<string, unknown>,
            requirements: outcomes[e.block.blockId] ?? [],
            contractVersion: ORBIT_CHECK_CONTRACT_VERSION,
            tolerance: call.tolerance,
          })),
        );
      }
      // The file against the text: named orbits linked to attached orbit files become flags too.
      await recordFileComparisons(tx, { versionId: version!.id, boardId, proposalId, blocks: extractOrbitChecks(doc), fileTolerance: call.fileTolerance });
      await tx.update(proposals).set({ status: "submitted", latestVersion: number, updatedAt: new Date() }).where(eq(proposals.id, proposalId));
      await tx.update(proposalDrafts).set({ basedOnVersion: number }).where(eq(proposalDrafts.proposalId, proposalId));
      const counts = { consistent: 0, inconsistent: 0, invalid: 0 };
      for (const e of evaluations) counts[e.result.status] += 1;
      await recordAudit(
        {
          action: "proposal.submit",
          actorId: user.id,
          actorEmail: user.email,
          boardId,
          target: proposalId,
          details: { version: number, ...counts, requirementsNotMet: countOutcomes(Object.values(outcomes)).notMet },
        },
        tx,
      );
      // The receipt commits with the version, so every submitted version gets exactly one.
      const authors = await tx
        .select({ email: users.email })
        .from(users)
        .where(
          or(
            eq(users.id, fresh.ownerId),
            inArray(users.id, tx.select({ id: proposalCoauthors.userId }).from(proposalCoauthors).where(eq(proposalCoauthors.proposalId, proposalId))),
          ),
        );
      const [board] = await tx.select({ name: boards.name }).from(boards).where(eq(boards.id, boardId)).limit(1);
      await enqueueSubmissionReceipt(tx, {
        boardId,
        proposalId,
        versionId: version!.id,
        versionNumber: number,
        boardName: board?.name ?? "",
        callTitle: call.title,
        proposalTitle: fresh.title,
        submittedAt: new Date(),
        to: authors.map((a) => a.email),
      });
      return {
        versionId: version!.id,
        number,
        counts,
        requirementCounts: countOutcomes(Object.values(outcomes)),
        results: evaluations.map((e) => ({
          blockId: e.block.blockId,
          label: e.block.label,
          kind: e.block.claim.kind,
          status: e.result.status,
          requirements: (outcomes[e.block.blockId] ?? []).map((o) => ({ requirementId: o.requirementId, status: o.status, reason: o.reason })),
        })),
      };
    });
  } catch (error) {
    // No orphans: whatever was written for a submission that did not commit goes again.
    await Promise.all(written.map((key) => deleteObject(key).catch(() => undefined)));
    throw error;
  }
}

/**
 * Seeds the draft from the latest submitted version, so authors revise what the board
 * decided on. The decisions area calls this (inside its transaction) on a "revise" decision.
 */
export async function startRevisionDraft(proposalId: string, tx: Db = db()): Promise<{ revision: number; basedOnVersion: number }> {
  const [latest] = await tx
    .select({ number: proposalVersions.number, document: proposalVersions.document })
    .from(proposalVersions)
    .where(eq(proposalVersions.proposalId, proposalId))
    .orderBy(desc(proposalVersions.number))
    .limit(1);
  if (!latest) throw notFound("A submitted version of that proposal");
  const [row] = await tx
    .insert(proposalDrafts)
    .values({ proposalId, document: latest.document, basedOnVersion: latest.number, revision: 1 })
    .onConflictDoUpdate({
      target: proposalDrafts.proposalId,
      set: { document: latest.document, basedOnVersion: latest.number, revision: sql`${proposalDrafts.revision} + 1`, updatedAt: new Date() },
    })
    .returning({ revision: proposalDrafts.revision, basedOnVersion: proposalDrafts.basedOnVersion });
  return row!;
}

// ---------------------------------------------------------------------------------------
// Versions and check results

export interface VersionSummary {
  id: string;
  number: number;
  title: string;
  submittedAt: string;
  attachments: VersionAttachment[];
  counts: { consistent: number; inconsistent: number; invalid: number };
}

export async function listVersions(user: SessionUser, boardId: string, proposalId: string): Promise<VersionSummary[]> {
  const { proposal, facts } = await proposalFor(user, boardId, proposalId, "proposal.view");
  const readable = await readableVersionIds(user, proposal, facts);
  const all = await db()
    .select({
      id: proposalVersions.id,
      number: proposalVersions.number,
      title: proposalVersions.title,
      submittedAt: proposalVersions.submittedAt,
      attachments: proposalVersions.attachments,
    })
    .from(proposalVersions)
    .where(and(eq(proposalVersions.boardId, boardId), eq(proposalVersions.proposalId, proposalId)))
    .orderBy(desc(proposalVersions.number));
  const rows = readable ? all.filter((r) => readable.has(r.id)) : all;
  const countRows = rows.length
    ? await db()
        .select({ versionId: checkResults.versionId, status: checkResults.status, n: count() })
        .from(checkResults)
        .where(
          and(
            eq(checkResults.boardId, boardId),
            inArray(
              checkResults.versionId,
              rows.map((r) => r.id),
            ),
          ),
        )
        .groupBy(checkResults.versionId, checkResults.status)
    : [];
  return rows.map((r) => {
    const counts = { consistent: 0, inconsistent: 0, invalid: 0 };
    for (const c of countRows) if (c.versionId === r.id) counts[c.status] = c.n;
    return { ...r, submittedAt: r.submittedAt.toISOString(), counts };
  });
}

export interface VersionDetail extends VersionSummary {
  proposalId: string;
  document: Record<string, unknown>;
  documentKey: string;
  htmlKey: string;
  checkResults: CheckResultView[];
}

export interface CheckResultView {
  blockId: string;
  label: string;
  kind: string;
  status: "consistent" | "inconsistent" | "invalid";
  claim: Record<string, unknown>;
  result: Record<string, unknown>;
  /** The call's requirements judged on this claim at submission. */
  requirements: RequirementOutcome[];
  /** The contract version whose rules produced the stored result. */
  contractVersion: number;
  /** The tolerance policy applied at submission, when recorded. */
  tolerance: { relative: number; absolute?: Record<string, number> } | null;
}

async function loadVersion(boardId: string, proposalId: string, n: number, tx: Db = db()) {
  const [row] = await tx
    .select({
      id: proposalVersions.id,
      proposalId: proposalVersions.proposalId,
      number: proposalVersions.number,
      title: proposalVersions.title,
      submittedAt: proposalVersions.submittedAt,
      attachments: proposalVersions.attachments,
      document: proposalVersions.document,
      documentKey: proposalVersions.documentKey,
      htmlKey: proposalVersions.htmlKey,
    })
    .from(proposalVersions)
    .where(and(eq(proposalVersions.boardId, boardId), eq(proposalVersions.proposalId, proposalId), eq(proposalVersions.number, n)))
    .limit(1);
  return row ?? null;
}

/** The server's results for one version, in document order. */
export async function versionCheckResults(boardId: string, versionId: string, tx: Db = db()): Promise<CheckResultView[]> {
  const rows = await tx
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
      document: proposalVersions.document,
    })
    .from(checkResults)
    .innerJoin(proposalVersions, eq(proposalVersions.id, checkResults.versionId))
    .where(and(eq(checkResults.boardId, boardId), eq(checkResults.versionId, versionId)));
  const order = rows[0] ? extractOrbitChecks(rows[0].document).map((b) => b.blockId) : [];
  return rows
    .map((r) => ({
      blockId: r.blockId,
      label: r.label,
      kind: r.kind,
      status: r.status,
      claim: r.claim,
      result: r.result,
      requirements: r.requirements,
      contractVersion: r.contractVersion,
      tolerance: r.tolerance ?? null,
    }))
    .sort((a, b) => order.indexOf(a.blockId) - order.indexOf(b.blockId));
}

export async function getVersion(user: SessionUser, boardId: string, proposalId: string, n: number): Promise<VersionDetail> {
  const { proposal, facts } = await proposalFor(user, boardId, proposalId, "proposal.view");
  const row = await loadVersion(boardId, proposalId, n);
  // A reviewer reads the versions assigned to them (unless the board opts in to all): others are 404.
  const readable = row ? await readableVersionIds(user, proposal, facts) : null;
  if (!row || (readable && !readable.has(row.id))) throw notFound(`Version ${n} of that proposal`);
  const results = await versionCheckResults(boardId, row.id);
  const counts = { consistent: 0, inconsistent: 0, invalid: 0 };
  for (const r of results) counts[r.status] += 1;
  return { ...row, submittedAt: row.submittedAt.toISOString(), counts, checkResults: results };
}

export async function getVersionCheckResults(user: SessionUser, boardId: string, proposalId: string, n: number): Promise<CheckResultView[]> {
  return (await getVersion(user, boardId, proposalId, n)).checkResults;
}

/** Rendered HTML of a version (from its JSON, with the server's verdicts beside each block). */
export async function getVersionHtml(user: SessionUser, boardId: string, proposalId: string, n: number): Promise<string> {
  const version = await getVersion(user, boardId, proposalId, n);
  const verdicts = Object.fromEntries(
    version.checkResults.map((r) => [r.blockId, { ...(r.result as unknown as BlockVerdict), status: r.status, requirements: r.requirements }]),
  );
  const tolerance = version.checkResults.find((r) => r.tolerance)?.tolerance ?? undefined;
  return renderDossierHtml(version.document, { boardId, verdicts, tolerance });
}

/**
 * Chairs only: the version's stored record beside a recomputation with today's engine and
 * the call's current tolerance policy. Reads only; the record is never changed.
 */
export async function rerunVersionWithTodaysRules(user: SessionUser, boardId: string, proposalId: string, n: number): Promise<Rerun> {
  const { proposal, facts } = await proposalFor(user, boardId, proposalId, "proposal.view");
  authorize(user, "decision.make", facts, "Today's rules on a submitted version");
  const row = await loadVersion(boardId, proposalId, n);
  if (!row) throw notFound(`Version ${n} of that proposal`);
  const call = await loadCall(boardId, proposal.callId);
  if (!call) throw notFound("That proposal's call");
  const stored = await versionCheckResults(boardId, row.id);
  return rerunWithTodaysRules(row.document, stored, call.tolerance);
}
