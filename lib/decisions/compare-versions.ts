import "server-only";
import type { DecisionOutcome } from "@/db/schema";
import { authorize, can } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { proposalAccess } from "@/lib/dal/assignments";
import { decisionsOfVersions } from "@/lib/dal/decisions";
import { checkResultsOfVersions, proposalHeadline, reviewersOfVersions, versionsWithDocuments } from "@/lib/dal/versions";
import { dossierPlainText } from "@/lib/dossier";
import { notFound } from "@/lib/errors";
import { compareClaims, diffText, type ClaimComparison, type TextDiff, type VersionCheck } from "./compare";
import { OUTCOME_LABELS } from "./template";

export interface VersionComparison {
  proposal: { id: string; title: string; status: string; latestVersion: number };
  versions: { number: number; submittedAt: string }[];
  from: { number: number; submittedAt: string; decision: { outcome: DecisionOutcome; outcomeLabel: string } | null };
  to: { number: number; submittedAt: string; decision: { outcome: DecisionOutcome; outcomeLabel: string } | null };
  text: TextDiff;
  claims: ClaimComparison[];
  /** For the chair: the reviewers of the earlier version, and whether each is on the later one. */
  reviewers: { id: string; name: string; onLaterVersion: boolean; active: boolean }[] | null;
}

/** Two submitted versions side by side: text changes, claims paired, decisions, and (chairs) the reviewers. */
export async function compareVersions(
  user: SessionUser,
  boardId: string,
  proposalId: string,
  fromNumber: number,
  toNumber: number,
): Promise<VersionComparison> {
  const access = await proposalAccess(user, boardId, proposalId);
  authorize(user, "proposal.view", access.facts, "That proposal");
  const all = await versionsWithDocuments(boardId, proposalId);
  const from = all.find((v) => v.number === fromNumber);
  const to = all.find((v) => v.number === toNumber);
  if (!from) throw notFound(`Version ${fromNumber} of that proposal`);
  if (!to) throw notFound(`Version ${toNumber} of that proposal`);
  const checks = await checkResultsOfVersions(boardId, [from.id, to.id]);
  const of = (versionId: string): VersionCheck[] => checks.filter((c) => c.versionId === versionId);
  const decided = await decisionsOfVersions(proposalId, [from.id, to.id]);
  const decisionOf = (versionId: string) => {
    const d = decided.find((x) => x.versionId === versionId);
    return d ? { outcome: d.outcome, outcomeLabel: OUTCOME_LABELS[d.outcome] } : null;
  };

  let reviewers: VersionComparison["reviewers"] = null;
  if (can(user, "review.assign", { role: access.role })) {
    const rows = await reviewersOfVersions(boardId, proposalId, [from.id, to.id]);
    const earlier = rows.filter((r) => r.versionId === from.id);
    reviewers = earlier.map((r) => ({
      id: r.id,
      name: r.name,
      onLaterVersion: rows.some((x) => x.versionId === to.id && x.id === r.id),
      active: r.memberStatus === "active" && r.userStatus === "active" && r.role === "reviewer",
    }));
  }

  const p = await proposalHeadline(proposalId);
  return {
    proposal: { id: proposalId, title: p!.title, status: p!.status, latestVersion: p!.latestVersion },
    versions: all.map((v) => ({ number: v.number, submittedAt: v.submittedAt.toISOString() })),
    from: { number: from.number, submittedAt: from.submittedAt.toISOString(), decision: decisionOf(from.id) },
    to: { number: to.number, submittedAt: to.submittedAt.toISOString(), decision: decisionOf(to.id) },
    text: diffText(dossierPlainText(from.document), dossierPlainText(to.document)),
    claims: compareClaims(of(from.id), of(to.id)),
    reviewers,
  };
}
