import "server-only";
import { and, asc, eq, inArray } from "drizzle-orm";
import { db, type Database, type Transaction } from "@/db/client";
import { assignments, decisions, proposalVersions, reviewItemReplies, reviewItems, reviews, users, type ReviewItemAnchor } from "@/db/schema";
import { authorize, can, type ResourceFacts } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { dossierPlainText } from "@/lib/dossier";
import { conflict, forbidden, notFound, unprocessable } from "@/lib/errors";
import { anchorInBounds, makeAnchor, resolveAnchor } from "@/lib/review/anchors";
import type { ReviewItemInput } from "@/lib/validation/review";
import { proposalAccess, type ProposalAccess } from "./assignments";
import { authorsOf } from "./conflicts";
import { recordAudit } from "./audit";
import { isUuid } from "./boards";
import { itemResponses, loadResponseWindow, responseWindowFacts, type DispositionView, type ReviewItemAnswerView } from "./item-responses";

type Db = Database | Transaction;

export type Severity = "major" | "minor" | "comment";

export interface ReviewItemReplyView {
  id: string;
  body: string;
  authorLabel: string;
  mine: boolean;
  createdAt: string;
}

/** A proposer's answer as the viewer may see it (author named by the blind rules). */
export type ReviewItemAnswerEntry = Omit<ReviewItemAnswerView, "authorId"> & { authorLabel: string; mine: boolean };
/** One disposition of an item, its actor named by the blind rules. */
export type DispositionEntry = Omit<DispositionView, "actorId"> & { actorLabel: string; mine: boolean };

export interface ReviewItemView {
  id: string;
  proposalId: string;
  versionId: string;
  versionNumber: number;
  severity: Severity;
  title: string;
  body: string;
  anchor: ReviewItemAnchor;
  status: "open" | "resolved";
  authorLabel: string;
  mine: boolean;
  createdAt: string;
  replies: ReviewItemReplyView[];
  /** The proposer's answer in the response round (null: none yet). */
  answer: ReviewItemAnswerEntry | null;
  /** The current disposition (the latest of the history; null: none yet). */
  disposition: DispositionEntry | null;
  /** Every disposition, oldest first: who, when, why. */
  dispositionHistory: DispositionEntry[];
  /** The viewer may answer the item now (an author of the proposal while the response window is open). */
  canAnswer: boolean;
  /** The viewer may record a disposition (the item's reviewer or the chair, before the decision). */
  canDispose: boolean;
}

/**
 * Names as the viewer may see them. Proposers never see reviewers' names ("Reviewer 1",
 * numbered by when each was first assigned to the proposal); reviewers see each other the
 * same way; the board may hide proposers' names from reviewers. The chair sees everyone.
 */
async function labeller(access: ProposalAccess, viewer: SessionUser, tx: Db) {
  const proposalId = access.proposal.id;
  const order = await tx
    .select({ reviewerId: assignments.reviewerId })
    .from(assignments)
    .where(and(eq(assignments.proposalId, proposalId), eq(assignments.boardId, access.proposal.boardId)))
    .orderBy(asc(assignments.createdAt));
  const ordinal = new Map<string, number>();
  for (const o of order) if (!ordinal.has(o.reviewerId)) ordinal.set(o.reviewerId, ordinal.size + 1);
  const authorIds = new Set((await authorsOf([proposalId], tx)).get(proposalId)?.map((a) => a.id) ?? []);
  const viewerIsChair = access.role === "chair" || (viewer.isAdmin && access.role === null);
  const names = new Map<string, string>();
  return {
    async load(ids: string[]) {
      const missing = ids.filter((id) => !names.has(id));
      if (missing.length)
        for (const u of await tx.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, missing))) names.set(u.id, u.name);
    },
    label(authorId: string): string {
      const name = names.get(authorId) ?? "Someone";
      if (authorId === viewer.id) return `${name} (you)`;
      const n = ordinal.get(authorId);
      if (n !== undefined) return viewerIsChair ? `Reviewer ${n} · ${name}` : `Reviewer ${n}`;
      if (authorIds.has(authorId)) return access.role === "reviewer" && access.board.hideProposerNames ? "Proposer" : name;
      return viewerIsChair ? `Chair · ${name}` : "Chair";
    },
  };
}

async function itemFacts(user: SessionUser, access: ProposalAccess, versionId: string, authorId: string, tx: Db): Promise<ResourceFacts> {
  const assigned = access.myAssignments.find((a) => a.versionId === versionId);
  let ownReviewSubmitted = false;
  if (assigned) {
    const [r] = await tx.select({ status: reviews.status }).from(reviews).where(eq(reviews.assignmentId, assigned.id));
    ownReviewSubmitted = r?.status === "submitted";
  }
  const [decided] = await tx.select({ id: decisions.id }).from(decisions).where(eq(decisions.versionId, versionId));
  const window = responseWindowFacts(await loadResponseWindow(access.proposal.boardId, access.proposal.callId, tx));
  // An item reaches the proposer once its reviewer submitted the review of that version (the chair's items at once).
  let itemReleased = true;
  if (access.isAuthor && window.started) {
    const [pending] = await tx
      .select({ status: reviews.status })
      .from(assignments)
      .leftJoin(reviews, eq(reviews.assignmentId, assignments.id))
      .where(and(eq(assignments.versionId, versionId), eq(assignments.reviewerId, authorId), eq(assignments.boardId, access.proposal.boardId)));
    itemReleased = !pending || pending.status === "submitted";
  }
  return {
    role: access.role,
    isAuthor: access.isAuthor,
    isAssigned: Boolean(assigned),
    isConflicted: access.isConflicted,
    isAuthorOfItem: authorId === user.id,
    ownReviewSubmitted,
    shareItemsAfterSubmit: access.board.shareReviewItemsAfterSubmit,
    decisionIssued: Boolean(decided),
    responseWindowStarted: window.started,
    responseWindowOpen: window.open,
    itemReleased,
  };
}

const itemColumns = {
  id: reviewItems.id,
  proposalId: reviewItems.proposalId,
  versionId: reviewItems.versionId,
  versionNumber: proposalVersions.number,
  authorId: reviewItems.authorId,
  severity: reviewItems.severity,
  title: reviewItems.title,
  body: reviewItems.body,
  anchor: reviewItems.anchor,
  status: reviewItems.status,
  createdAt: reviewItems.createdAt,
};

/** The review items of a proposal the caller may see (the policy's "review-item.view", item by item), with replies. */
export async function listReviewItems(user: SessionUser, boardId: string, proposalId: string, options: { versionId?: string } = {}): Promise<ReviewItemView[]> {
  const tx = db();
  const access = await proposalAccess(user, boardId, proposalId, tx);
  authorize(user, "proposal.view", access.facts, "That proposal");
  const rows = await tx
    .select(itemColumns)
    .from(reviewItems)
    .innerJoin(proposalVersions, eq(proposalVersions.id, reviewItems.versionId))
    .where(
      and(
        eq(reviewItems.boardId, boardId),
        eq(reviewItems.proposalId, proposalId),
        options.versionId && isUuid(options.versionId) ? eq(reviewItems.versionId, options.versionId) : undefined,
      ),
    )
    .orderBy(asc(reviewItems.createdAt));
  const visible = [];
  for (const row of rows) if (can(user, "review-item.view", await itemFacts(user, access, row.versionId, row.authorId, tx))) visible.push(row);
  return presentReviewItems(user, access, visible, tx);
}

/** Items as the viewer sees them: names by the blind rules, replies, answer and dispositions. Callers checked visibility. */
export async function presentReviewItems(
  user: SessionUser,
  access: ProposalAccess,
  rows: (Omit<typeof reviewItems.$inferSelect, "boardId"> & { versionNumber: number })[],
  tx: Db,
): Promise<ReviewItemView[]> {
  const replies = rows.length
    ? await tx
        .select({
          id: reviewItemReplies.id,
          itemId: reviewItemReplies.reviewItemId,
          authorId: reviewItemReplies.authorId,
          body: reviewItemReplies.body,
          createdAt: reviewItemReplies.createdAt,
        })
        .from(reviewItemReplies)
        .where(
          inArray(
            reviewItemReplies.reviewItemId,
            rows.map((r) => r.id),
          ),
        )
        .orderBy(asc(reviewItemReplies.createdAt))
    : [];
  const { answers, dispositions } = await itemResponses(
    rows.map((r) => r.id),
    tx,
  );
  const names = await labeller(access, user, tx);
  await names.load([
    ...rows.map((r) => r.authorId),
    ...replies.map((r) => r.authorId),
    ...[...answers.values()].map((a) => a.authorId),
    ...[...dispositions.values()].flat().flatMap((d) => (d.actorId ? [d.actorId] : [])),
  ]);
  const facts = new Map<string, ResourceFacts>();
  for (const r of rows) facts.set(r.id, await itemFacts(user, access, r.versionId, r.authorId, tx));
  const entry = (d: DispositionView): DispositionEntry => {
    const { actorId, ...rest } = d;
    return { ...rest, actorLabel: actorId ? names.label(actorId) : "A former member", mine: actorId === user.id };
  };
  return rows.map((r) => ({
    id: r.id,
    proposalId: r.proposalId,
    versionId: r.versionId,
    versionNumber: r.versionNumber,
    severity: r.severity,
    title: r.title,
    body: r.body,
    anchor: r.anchor,
    status: r.status,
    authorLabel: names.label(r.authorId),
    mine: r.authorId === user.id,
    createdAt: r.createdAt.toISOString(),
    replies: replies
      .filter((x) => x.itemId === r.id)
      .map((x) => ({ id: x.id, body: x.body, authorLabel: names.label(x.authorId), mine: x.authorId === user.id, createdAt: x.createdAt.toISOString() })),
    answer: (() => {
      const a = answers.get(r.id);
      if (!a) return null;
      const { authorId, ...rest } = a;
      return { ...rest, authorLabel: names.label(authorId), mine: authorId === user.id };
    })(),
    disposition: (() => {
      const history = dispositions.get(r.id);
      return history?.length ? entry(history[history.length - 1]!) : null;
    })(),
    dispositionHistory: (dispositions.get(r.id) ?? []).map(entry),
    canAnswer: can(user, "review-item.answer", facts.get(r.id)!) && !facts.get(r.id)!.decisionIssued,
    canDispose: can(user, "review-item.dispose", facts.get(r.id)!) && !facts.get(r.id)!.decisionIssued,
  }));
}

/**
 * Raises a review item on a range of the version's plain text. The anchor is checked
 * against the server's own text: offsets outside it, or a quote not found in it, are 422;
 * the stored anchor carries the server's offsets and context.
 */
export async function createReviewItem(user: SessionUser, boardId: string, input: ReviewItemInput & { versionId?: string }): Promise<ReviewItemView> {
  return db().transaction(async (tx) => {
    const access = await proposalAccess(user, boardId, input.proposalId, tx);
    authorize(user, "proposal.view", access.facts, "That proposal");
    const [version] = await tx
      .select({ id: proposalVersions.id, number: proposalVersions.number, document: proposalVersions.document })
      .from(proposalVersions)
      .where(
        and(
          eq(proposalVersions.boardId, boardId),
          eq(proposalVersions.proposalId, input.proposalId),
          input.versionId ? eq(proposalVersions.id, input.versionId) : eq(proposalVersions.number, access.proposal.latestVersion),
        ),
      );
    if (!version) throw notFound("That version");
    const assigned = access.myAssignments.find((a) => a.versionId === version.id);
    authorize(user, "review-item.create", { ...access.facts, isAssigned: Boolean(assigned) });
    if (assigned) {
      const [own] = await tx.select({ status: reviews.status }).from(reviews).where(eq(reviews.assignmentId, assigned.id));
      if (own?.status === "submitted") throw conflict("Your review of this version is submitted and locked; ask the chair to reopen it to raise more items.");
    }
    const text = dossierPlainText(version.document);
    if (!anchorInBounds(input.anchor, text.length))
      throw unprocessable(`The selected range (${input.anchor.from}–${input.anchor.to}) lies outside the dossier text, which has ${text.length} characters.`, {
        issues: [{ path: "anchor", message: "outside the text" }],
      });
    const resolved = resolveAnchor(text, input.anchor);
    if (!resolved)
      throw unprocessable(`The selected text "${input.anchor.quote.slice(0, 80)}" was not found in version ${version.number}.`, {
        issues: [{ path: "anchor.quote", message: "not found in the text" }],
      });
    const anchor = makeAnchor(text, resolved.from, resolved.to);
    const [row] = await tx
      .insert(reviewItems)
      .values({
        boardId,
        proposalId: input.proposalId,
        versionId: version.id,
        authorId: user.id,
        severity: input.severity,
        title: input.title,
        body: input.body,
        anchor,
      })
      .returning();
    await recordAudit(
      {
        action: "review-item.create",
        actorId: user.id,
        actorEmail: user.email,
        boardId,
        target: row!.id,
        details: { proposalId: input.proposalId, severity: input.severity },
      },
      tx,
    );
    return (await presentReviewItems(user, access, [{ ...row!, versionNumber: version.number }], tx))[0]!;
  });
}

/** One item, its proposal access and the caller's facts; 404 unless the caller may see it. */
export async function loadReviewItem(user: SessionUser, boardId: string, itemId: string, tx: Db) {
  if (!isUuid(boardId) || !isUuid(itemId)) throw notFound("That review item");
  const [row] = await tx
    .select(itemColumns)
    .from(reviewItems)
    .innerJoin(proposalVersions, eq(proposalVersions.id, reviewItems.versionId))
    .where(and(eq(reviewItems.id, itemId), eq(reviewItems.boardId, boardId)));
  if (!row) throw notFound("That review item");
  const access = await proposalAccess(user, boardId, row.proposalId, tx);
  authorize(user, "proposal.view", access.facts, "That review item");
  const facts = await itemFacts(user, access, row.versionId, row.authorId, tx);
  authorize(user, "review-item.view", facts, "That review item");
  return { row, access, facts };
}

export async function getReviewItem(user: SessionUser, boardId: string, itemId: string): Promise<ReviewItemView> {
  const { row, access } = await loadReviewItem(user, boardId, itemId, db());
  return (await presentReviewItems(user, access, [row], db()))[0]!;
}

/** A reply in the item's thread, by anyone who can see the item and may reply under the policy. */
export async function replyToReviewItem(user: SessionUser, boardId: string, itemId: string, input: { body: string }): Promise<ReviewItemView> {
  return db().transaction(async (tx) => {
    const { row, access, facts } = await loadReviewItem(user, boardId, itemId, tx);
    authorize(user, "review-item.reply", facts);
    await tx.insert(reviewItemReplies).values({ reviewItemId: row.id, authorId: user.id, body: input.body });
    return (await presentReviewItems(user, access, [row], tx))[0]!;
  });
}

/** Resolves or reopens an item: its author or the chair. */
export async function setReviewItemStatus(user: SessionUser, boardId: string, itemId: string, input: { status: "open" | "resolved" }): Promise<ReviewItemView> {
  return db().transaction(async (tx) => {
    const { row, access } = await loadReviewItem(user, boardId, itemId, tx);
    if (row.authorId !== user.id && !can(user, "review.view-all", { role: access.role }))
      throw forbidden("Only the item's author or the chair can change its status.");
    await tx
      .update(reviewItems)
      .set({ status: input.status })
      .where(and(eq(reviewItems.id, row.id), eq(reviewItems.boardId, boardId)));
    await recordAudit(
      { action: "review-item.status", actorId: user.id, actorEmail: user.email, boardId, target: row.id, details: { status: input.status } },
      tx,
    );
    return (await presentReviewItems(user, access, [{ ...row, status: input.status }], tx))[0]!;
  });
}
