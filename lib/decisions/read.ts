import "server-only";
import { authorize, can } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { proposalAccess } from "@/lib/dal/assignments";
import { decisionViews, type DecisionView } from "@/lib/dal/decisions";
import { notFound } from "@/lib/errors";
import { presignDownload } from "@/storage/object-store";
import { loadDecisionFor } from "./access";
import { letterFilename } from "./issue";

export type { DecisionView };

export async function getDecision(user: SessionUser, boardId: string, decisionId: string): Promise<DecisionView> {
  const { row, isChair } = await loadDecisionFor(user, boardId, decisionId);
  const views = await decisionViews(boardId, row.proposalId, isChair);
  return views.find((d) => d.id === decisionId)!;
}

/** Decisions of a proposal for its authors and the chair (404 for others). */
export async function listProposalDecisions(user: SessionUser, boardId: string, proposalId: string): Promise<DecisionView[]> {
  const access = await proposalAccess(user, boardId, proposalId);
  const isChair = can(user, "decision.make", { role: access.role });
  authorize(user, "decision.view", { role: access.role, isAuthor: access.isAuthor, decisionIssued: true }, "That proposal");
  return decisionViews(boardId, proposalId, isChair);
}

/** A short-lived download link for the letter PDF. */
export async function decisionLetterUrl(
  user: SessionUser,
  boardId: string,
  decisionId: string,
): Promise<{ url: string; filename: string; expiresInSeconds: number }> {
  const { row } = await loadDecisionFor(user, boardId, decisionId);
  if (!row.pdfKey) throw notFound("The letter PDF of that decision");
  const filename = letterFilename(row.title, row.versionNumber);
  const expiresInSeconds = 300;
  return { url: await presignDownload(row.pdfKey, filename, expiresInSeconds), filename, expiresInSeconds };
}
