import { formatDateTime } from "@/lib/format/dates";
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { AttachmentList } from "@/components/dossier/attachment-list";
import { DossierSummary } from "@/components/dossier/dossier-summary";
import { BudgetRail } from "@/components/dossier/budget-rail";
import { requiredDeltaVMargin } from "@/lib/requirements";
import { ReadOnlyDossier } from "@/components/dossier/read-only-dossier";
import { PageTitle, Panel } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { getProposal, getVersion, rerunVersionWithTodaysRules } from "@/lib/dal/proposals";
import { boardRole } from "@/lib/dal/boards";
import { RecordLabel, TodaysRulesLink, TodaysRulesPanel } from "@/components/dossier/todays-rules";
import { deltaVBudget, evaluateBlocks, extractOrbitChecks } from "@/lib/dossier/claims";

export const metadata: Metadata = { title: "Version" };

export default async function VersionPage({
  params,
  searchParams,
}: {
  params: Promise<{ boardId: string; proposalId: string; n: string }>;
  searchParams: Promise<{ rules?: string }>;
}) {
  const { boardId, proposalId, n } = await params;
  const { rules } = await searchParams;
  const number = Number(n);
  if (!Number.isInteger(number) || number < 1) notFound();
  const user = await pageUser(`/boards/${boardId}/proposals/${proposalId}/versions/${n}`);
  const proposal = await orNotFound(getProposal(user, boardId, proposalId));
  const version = await orNotFound(getVersion(user, boardId, proposalId, number));
  const items = version.checkResults.map((r) => ({ blockId: r.blockId, label: r.label, kind: r.kind, status: r.status, result: r.result }));
  // The policy the record was checked at (stored with it since contract version 2), else the call's.
  const recordTolerance = version.checkResults.find((r) => r.tolerance)?.tolerance ?? null;
  const isChair = (await boardRole(user.id, boardId)) === "chair";
  const rerun = isChair && rules === "today" ? await rerunVersionWithTodaysRules(user, boardId, proposalId, number) : null;
  const here = `/boards/${boardId}/proposals/${proposalId}/versions/${number}`;
  const evaluations = evaluateBlocks(extractOrbitChecks(version.document), proposal.tolerance);
  const budget = deltaVBudget(evaluations);
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={proposal.callTitle} title={`${version.title}: version ${version.number}`}>
        <p className="text-sm">
          Submitted {formatDateTime(version.submittedAt)} ·{" "}
          <Link href={`/boards/${boardId}/proposals/${proposalId}`} className="text-trajectory-700 underline">
            back to the proposal
          </Link>
        </p>
      </PageTitle>
      {version.checkResults.length > 0 ? (
        <div className="space-y-2">
          <RecordLabel contractVersions={version.checkResults.map((r) => r.contractVersion)} tolerance={recordTolerance} />
          {isChair ? <TodaysRulesLink href={`${here}?rules=today#todays-rules`} active={rerun !== null} /> : null}
        </div>
      ) : null}
      {rerun ? <TodaysRulesPanel rerun={rerun} closeHref={here} /> : null}
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_18rem]">
        <Panel title="Dossier" description="Read-only; verdicts are the server's recomputation with the call's tolerance.">
          <ReadOnlyDossier document={version.document} boardId={boardId} results={version.checkResults} tolerance={recordTolerance ?? undefined} />
        </Panel>
        <div className="space-y-4">
          <DossierSummary
            items={items}
            budget={budget}
            source="server"
            requiredMargin={requiredDeltaVMargin(proposal.requirements)}
            tolerance={recordTolerance ?? undefined}
          />
          <BudgetRail evaluations={evaluations} requirements={proposal.requirements} budget={budget} />
          <AttachmentList
            attachments={version.attachments.map((a) => ({ ...a, contentPath: `/api/v1/boards/${boardId}/attachments/${a.attachmentId}/content` }))}
          />
        </div>
      </div>
    </div>
  );
}
