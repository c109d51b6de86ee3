import "server-only";
import { authorize, can } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { proposalAccess } from "@/lib/dal/assignments";
import { isUuid } from "@/lib/dal/boards";
import { decisionRecord } from "@/lib/dal/decisions";
import type { Tx } from "@/lib/dal/transaction";
import { notFound } from "@/lib/errors";

/** The chair (or an admin) of the proposal's board; everyone else 403, non-members 404. */
export async function requireChair(user: SessionUser, boardId: string, proposalId: string, tx?: Tx) {
  const access = await proposalAccess(user, boardId, proposalId, tx);
  authorize(user, "decision.make", { role: access.role }, "That proposal");
  return access;
}

/** A decision the user may read (the chair, or an author once issued); 404 for everyone else. */
export async function loadDecisionFor(user: SessionUser, boardId: string, decisionId: string) {
  if (!isUuid(boardId) || !isUuid(decisionId)) throw notFound("That decision");
  const row = await decisionRecord(boardId, decisionId);
  if (!row) throw notFound("That decision");
  let access;
  try {
    access = await proposalAccess(user, boardId, row.proposalId);
  } catch {
    throw notFound("That decision");
  }
  authorize(user, "decision.view", { role: access.role, isAuthor: access.isAuthor, decisionIssued: true }, "That decision");
  return { row, isChair: can(user, "decision.make", { role: access.role }) };
}
