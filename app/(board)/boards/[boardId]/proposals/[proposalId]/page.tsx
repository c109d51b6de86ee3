import { formatDateTime } from "@/lib/format/dates";
import type { Metadata } from "next";
import Link from "next/link";
import { DossierSummary } from "@/components/dossier/dossier-summary";
import { DossierWorkspaceLoader } from "@/components/dossier/dossier-workspace-loader";
import { BudgetRail } from "@/components/dossier/budget-rail";
import { requiredDeltaVMargin } from "@/lib/requirements";
import { ReadOnlyDossier } from "@/components/dossier/read-only-dossier";
import { AttachmentList } from "@/components/dossier/attachment-list";
import { OrbitFilesPanel } from "@/components/orbit-files/orbit-files-panel";
import { PageTitle, Panel } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { proposalAccess } from "@/lib/dal/assignments";
import { listAttachments } from "@/lib/dal/attachments";
import { listReviewItems } from "@/lib/dal/review-items";
import { canReadReviewReport } from "@/lib/dal/reports";
import { ProposalReviewItems } from "@/components/review/proposal-review-items";
import { getDraft, getProposal, getVersion, listVersions } from "@/lib/dal/proposals";
import { deltaVBudget, evaluateBlocks, extractOrbitChecks } from "@/lib/dossier/claims";
import { getProposalResponseWindow } from "@/lib/dal/responses";

export const metadata: Metadata = { title: "Proposal" };

const STATUS_TEXT = { draft: "Draft", submitted: "Submitted", in_review: "In review", decided: "Decided", withdrawn: "Withdrawn" } as const;

export default async function ProposalPage({ params }: { params: Promise<{ boardId: string; proposalId: string }> }) {
  const { boardId, proposalId } = await params;
  const user = await pageUser(`/boards/${boardId}/proposals/${proposalId}`);
  const proposal = await orNotFound(getProposal(user, boardId, proposalId));
  const [versions, attachments, reviewItems] = await Promise.all([
    listVersions(user, boardId, proposalId),
    listAttachments(user, boardId, proposalId),
    // Only the items the policy lets this viewer see: for proposers, none before a decision.
    proposal.latestVersion > 0 ? listReviewItems(user, boardId, proposalId) : Promise.resolve([]),
  ]);
  // The chair's way on from the proposal: its reviews and the decision page.
  const access = await proposalAccess(user, boardId, proposalId);
  const chairLinks = can(user, "decision.make", { role: access.role }) ? (
    <nav aria-label="Chair" className="flex flex-wrap gap-3 text-sm">
      <Link
        href={`/boards/${boardId}/proposals/${proposalId}/decision`}
        className="rounded-chip bg-trajectory-600 px-3 py-1.5 font-semibold text-white hover:bg-trajectory-700"
      >
        {proposal.status === "decided" ? "The decision" : "Write the decision"}
      </Link>
      {proposal.latestVersion > 0 ? (
        <Link
          href={`/boards/${boardId}/proposals/${proposalId}/review`}
          className="rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
        >
          Reviews of this proposal
        </Link>
      ) : null}
      <Link
        href={`/boards/${boardId}/calls/${proposal.callId}/overview`}
        className="rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
      >
        Call overview
      </Link>
    </nav>
  ) : null;
  // The review report of each version, for those the policy lets read it ("report.view").
  const reportReadable = new Set<number>();
  for (const v of versions) if (await canReadReviewReport(user, access, v.id)) reportReadable.add(v.number);
  const responseWindow = proposal.latestVersion > 0 ? await getProposalResponseWindow(user, boardId, proposalId) : null;
  const responseLink = responseWindow ? (
    <p className="text-sm" data-response-window={responseWindow.state}>
      <Link href={`/boards/${boardId}/proposals/${proposalId}/responses`} className="font-semibold text-trajectory-700 underline">
        Response round
      </Link>
      {responseWindow.state === "open"
        ? `: open until ${formatDateTime(responseWindow.closesAt)}. ${access.isAuthor ? "Read the review items and answer each one." : "Answers and dispositions."}`
        : responseWindow.state === "upcoming"
          ? `: opens on ${formatDateTime(responseWindow.opensAt)}.`
          : `: closed on ${formatDateTime(responseWindow.closesAt)}. Answers and dispositions.`}
    </p>
  ) : null;
  const reviewItemsPanel = reviewItems.length > 0 ? <ProposalReviewItems boardId={boardId} initialItems={reviewItems} /> : null;

  const header = (
    <PageTitle eyebrow={`${proposal.callTitle} · ${STATUS_TEXT[proposal.status]}`} title={proposal.title}>
      <p className="text-sm">
        {proposal.missionType ? `${proposal.missionType.replace(/-/g, " ")} · ` : ""}
        {proposal.owner
          ? `by ${[proposal.owner, ...proposal.coauthors].map((a) => a.name).join(", ")}`
          : "Proposers' names are hidden from reviewers on this board."}
      </p>
    </PageTitle>
  );
  const headerWithLinks = (
    <>
      {header}
      {chairLinks}
      {responseLink}
    </>
  );

  const versionList =
    versions.length > 0 ? (
      <Panel title="Submitted versions">
        <ul className="divide-y divide-ink-100 text-sm">
          {versions.map((v) => (
            <li key={v.id} className="flex flex-wrap items-center justify-between gap-2 py-1.5">
              <Link href={`/boards/${boardId}/proposals/${proposalId}/versions/${v.number}`} className="font-semibold text-trajectory-700 hover:underline">
                Version {v.number}
              </Link>
              {reportReadable.has(v.number) ? (
                <Link href={`/boards/${boardId}/proposals/${proposalId}/versions/${v.number}/report`} className="text-trajectory-700 underline">
                  Review report, version {v.number}
                </Link>
              ) : null}
              <span className="text-ink-600">
                {formatDateTime(v.submittedAt)} · server check: {v.counts.consistent} consistent, {v.counts.inconsistent} inconsistent, {v.counts.invalid}{" "}
                cannot be evaluated
              </span>
            </li>
          ))}
        </ul>
      </Panel>
    ) : null;

  if (proposal.canEdit) {
    const draft = await getDraft(user, boardId, proposalId);
    return (
      <div className="space-y-6">
        {headerWithLinks}
        {proposal.status === "decided" ? (
          <p className="rounded-panel border border-drift-500/40 bg-drift-100 p-3 text-sm text-drift-700">
            The board asked for a revision. Your changes will be submitted as version {proposal.latestVersion + 1}.
          </p>
        ) : null}
        <DossierWorkspaceLoader
          boardId={boardId}
          proposalId={proposalId}
          draft={draft}
          tolerance={proposal.tolerance}
          fileTolerance={proposal.fileTolerance}
          requirements={proposal.requirements}
          requiredSections={proposal.requiredSections}
          attachments={attachments}
          nextVersion={proposal.latestVersion + 1}
          callOpen={proposal.callState === "open"}
          callClosesAt={proposal.callClosesAt}
        />
        {reviewItemsPanel}
        {versionList}
      </div>
    );
  }

  if (versions.length === 0) {
    return (
      <div className="space-y-6">
        {headerWithLinks}
        <Panel title="Not submitted yet">
          <p className="text-ink-600">{proposal.editBlockedReason ?? "This proposal has no submitted version yet."}</p>
        </Panel>
      </div>
    );
  }

  const latest = await getVersion(user, boardId, proposalId, versions[0]!.number);
  const items = latest.checkResults.map((r) => ({ blockId: r.blockId, label: r.label, kind: r.kind, status: r.status, result: r.result }));
  const recordTolerance = latest.checkResults.find((r) => r.tolerance)?.tolerance ?? proposal.tolerance;
  const latestBlocks = extractOrbitChecks(latest.document);
  const latestEvaluations = evaluateBlocks(latestBlocks, proposal.tolerance);
  const budget = deltaVBudget(latestEvaluations);
  return (
    <div className="space-y-6">
      {headerWithLinks}
      {proposal.editBlockedReason && proposal.owner?.id === user.id ? <p className="text-sm text-ink-600">{proposal.editBlockedReason}</p> : null}
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_18rem]">
        <Panel title={`Version ${latest.number}`} description={`Submitted ${formatDateTime(latest.submittedAt)}; verdicts are the server's own recomputation.`}>
          <ReadOnlyDossier document={latest.document} boardId={boardId} results={latest.checkResults} tolerance={recordTolerance} />
        </Panel>
        <div className="space-y-4">
          <DossierSummary
            items={items}
            budget={budget}
            source="server"
            requiredMargin={requiredDeltaVMargin(proposal.requirements)}
            tolerance={recordTolerance}
          />
          <BudgetRail evaluations={latestEvaluations} requirements={proposal.requirements} budget={budget} />
          <AttachmentList
            attachments={latest.attachments.map((a) => ({ ...a, contentPath: `/api/v1/boards/${boardId}/attachments/${a.attachmentId}/content` }))}
          />
          <OrbitFilesPanel
            boardId={boardId}
            proposalId={proposalId}
            attachmentIds={latest.attachments.map((a) => a.attachmentId)}
            blocks={latestBlocks}
            fileTolerance={proposal.fileTolerance}
            exportFrom={{ version: latest.number }}
          />
        </div>
      </div>
      {reviewItemsPanel}
      {versionList}
    </div>
  );
}
