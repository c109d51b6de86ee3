import { formatDateTime } from "@/lib/format/dates";
import type { Metadata } from "next";
import { RequirementFlags } from "@/components/dossier/requirement-flags";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageTitle, Panel } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { proposalAccess } from "@/lib/dal/assignments";
import { getDecisionWorkspace, listProposalDecisions, type DecisionView } from "@/lib/decisions";
import { MAX_ATTEMPTS } from "@/lib/mail/outbox";
import { outboxStatusText } from "@/lib/mail/status-text";
import { DecisionForm } from "./_components/decision-form";
import { ResponseSummary } from "./_components/response-summary";
import { ConsistentMeaning, FailingChecks } from "@/components/dossier/check-explain";
import { storedRows } from "@/lib/dossier/verdict-text";
import { kindLabel } from "@/lib/orbit/labels";
import { getVersion } from "@/lib/dal/proposals";
import { storedContactPictures } from "@/components/coverage/stored-contact-pictures";

export const metadata: Metadata = { title: "Decision" };

const fixed = (n: number | null, digits = 2) => (n === null ? "—" : n.toFixed(digits));
const verdictClass = { consistent: "bg-holds-100 text-holds-700", inconsistent: "bg-drift-100 text-drift-700", invalid: "bg-void-100 text-void-700" } as const;
const verdictText = { consistent: "consistent", inconsistent: "inconsistent", invalid: "cannot be evaluated" } as const;

function IssuedDecision({ boardId, proposalId, decision, chairView }: { boardId: string; proposalId: string; decision: DecisionView; chairView: boolean }) {
  return (
    <article className="space-y-3" aria-label={`Decision on version ${decision.versionNumber}`}>
      <p className="text-sm text-ink-700">
        Version {decision.versionNumber}: <strong className="text-ink-950">{decision.outcomeLabel}</strong> · {formatDateTime(decision.decidedAt)}
        {decision.decidedByName ? ` · ${decision.decidedByName}` : ""}
      </p>
      {chairView && decision.overrideReason ? (
        <p className="rounded-chip bg-drift-100 px-3 py-2 text-sm text-drift-700">Decided without the required reviews: {decision.overrideReason}</p>
      ) : null}
      {chairView && decision.mail ? (
        <p className="text-sm text-ink-600" data-testid="letter-mail-status">
          <span className="font-semibold">Letter e-mail:</span> {outboxStatusText(decision.mail, MAX_ATTEMPTS)}
        </p>
      ) : null}
      <div className="prose-dossier rounded-panel border border-ink-200 bg-paper p-5" dangerouslySetInnerHTML={{ __html: decision.letterHtml }} />
      <div className="flex flex-wrap gap-3 text-sm">
        {decision.hasPdf ? (
          <a
            className="rounded-chip border border-trajectory-500 px-3 py-1.5 font-semibold text-trajectory-700"
            href={`/api/v1/boards/${boardId}/decisions/${decision.id}/letter?redirect=1`}
          >
            Download the letter (PDF)
          </a>
        ) : null}
        <Link
          className="rounded-chip border border-ink-300 px-3 py-1.5 text-ink-800"
          href={`/boards/${boardId}/proposals/${proposalId}/versions/${decision.versionNumber}/report`}
        >
          Review report, version {decision.versionNumber}
        </Link>
        {decision.versionNumber > 1 ? (
          <Link
            className="rounded-chip border border-ink-300 px-3 py-1.5 text-ink-800"
            href={`/boards/${boardId}/proposals/${proposalId}/compare?from=${decision.versionNumber - 1}&to=${decision.versionNumber}`}
          >
            Compare with version {decision.versionNumber - 1}
          </Link>
        ) : null}
      </div>
    </article>
  );
}

export default async function DecisionPage({ params }: { params: Promise<{ boardId: string; proposalId: string }> }) {
  const { boardId, proposalId } = await params;
  const user = await pageUser(`/boards/${boardId}/proposals/${proposalId}/decision`);
  const access = await orNotFound(proposalAccess(user, boardId, proposalId));

  if (!can(user, "decision.make", { role: access.role })) {
    // Reviewers and others get the same 404 as for a proposal that does not exist (issue 17).
    if (!access.isAuthor) notFound();
    const decisions = await listProposalDecisions(user, boardId, proposalId);
    const latest = decisions[0];
    return (
      <div className="space-y-6">
        <PageTitle eyebrow="Decision" title={access.proposal.title}>
          <Link href={`/boards/${boardId}/proposals/${proposalId}`} className="text-sm text-trajectory-700 underline">
            Back to the proposal
          </Link>
        </PageTitle>
        {decisions.length === 0 ? <p className="text-ink-700">The board has not decided on this proposal yet.</p> : null}
        {latest?.outcome === "revise" && access.proposal.status === "decided" ? (
          <p className="rounded-panel border border-trajectory-400 bg-trajectory-100 p-4 text-ink-900">
            The board asks for a revision. Your draft now starts from version {latest.versionNumber}:{" "}
            <Link className="font-semibold text-trajectory-700 underline" href={`/boards/${boardId}/proposals/${proposalId}`}>
              revise the dossier and submit version {latest.versionNumber + 1}
            </Link>
            .
          </p>
        ) : null}
        {decisions.map((d) => (
          <Panel key={d.id} title={`Version ${d.versionNumber}: ${d.outcomeLabel}`}>
            <IssuedDecision boardId={boardId} proposalId={proposalId} decision={d} chairView={false} />
          </Panel>
        ))}
      </div>
    );
  }

  const w = await getDecisionWorkspace(user, boardId, proposalId);
  // Contact checks keep their ground-track map and timeline here too, from the recorded claims.
  const contactPictures =
    w.version && w.checks.some((c) => c.kind === "contactTime")
      ? storedContactPictures((await getVersion(user, boardId, proposalId, w.version.number)).checkResults)
      : {};
  const submitted = w.reviews.filter((r) => r.status === "submitted").length;
  const claims = w.claimCounts;
  const openItems = w.reviewItems.filter((i) => i.status === "open");
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={`Decision · ${w.call.title}`} title={w.proposal.title}>
        <p className="text-sm">
          {w.version ? `Version ${w.version.number}, submitted ${formatDateTime(w.version.submittedAt)}` : "No version submitted yet"} · by{" "}
          {w.proposal.ownerName} ·{" "}
          <Link href={`/boards/${boardId}/proposals/${proposalId}`} className="text-trajectory-700 underline">
            read the dossier
          </Link>
          {w.version ? (
            <>
              {" · "}
              <Link href={`/boards/${boardId}/proposals/${proposalId}/versions/${w.version.number}/report`} className="text-trajectory-700 underline">
                review report
              </Link>
            </>
          ) : null}
          {w.previousVersionNumber ? (
            <>
              {" · "}
              <Link
                href={`/boards/${boardId}/proposals/${proposalId}/compare?from=${w.previousVersionNumber}&to=${w.version!.number}`}
                className="text-trajectory-700 underline"
              >
                compare with version {w.previousVersionNumber}
              </Link>
            </>
          ) : null}
        </p>
      </PageTitle>

      <div className="grid gap-4 md:grid-cols-3">
        <Panel title="Scores" description={`${submitted} of ${w.call.reviewersRequired} required reviews submitted`}>
          <dl className="grid grid-cols-2 gap-2 text-sm">
            <dt className="text-ink-600">Mean weighted total</dt>
            <dd className="font-mono text-lg text-ink-950" data-testid="weighted-mean">
              {fixed(w.aggregate.weightedMean)}
            </dd>
            <dt className="text-ink-600">Spread (sample SD)</dt>
            <dd className="font-mono">{fixed(w.aggregate.spread)}</dd>
            <dt className="text-ink-600">Totals</dt>
            <dd className="font-mono">{w.aggregate.totals.map((t) => t.toFixed(2)).join(", ") || "—"}</dd>
            {w.aggregate.scale ? (
              <>
                <dt className="text-ink-600">Scale</dt>
                <dd className="font-mono">
                  {w.aggregate.scale.min}–{w.aggregate.scale.max}
                </dd>
              </>
            ) : null}
          </dl>
        </Panel>
        <Panel
          title="Orbit checks"
          description={`${claims.flagged} of ${claims.claims} ${claims.claims === 1 ? "claim" : "claims"} flagged by the server, in ${claims.blocks} orbit-check ${claims.blocks === 1 ? "block" : "blocks"}; ${
            w.checks.flatMap((c) => c.requirements).filter((o) => o.status === "notMet").length
          } requirement flags not met`}
        >
          <ul className="space-y-1 text-sm">
            {w.checks.map((c) => (
              <li key={c.blockId} data-decision-check={c.blockId}>
                <div className="flex items-start justify-between gap-2">
                  <span>
                    {c.label || kindLabel(c.kind)} <span className="text-xs text-ink-500">({kindLabel(c.kind)})</span>
                  </span>
                  <span className={`rounded-chip px-2 py-0.5 text-xs font-semibold ${verdictClass[c.status]}`}>{verdictText[c.status]}</span>
                </div>
                <RequirementFlags outcomes={c.requirements} />
                <FailingChecks checks={storedRows({ checks: c.failing })} />
                {contactPictures[c.blockId] ? (
                  <details className="mt-1">
                    <summary className="cursor-pointer text-xs font-semibold text-trajectory-700">Contact pictures of {c.label || kindLabel(c.kind)}</summary>
                    <div className="mt-2">{contactPictures[c.blockId]}</div>
                  </details>
                ) : null}
              </li>
            ))}
            {w.checks.length === 0 ? <li className="text-ink-500">No orbit claims in this version.</li> : null}
          </ul>
          <ConsistentMeaning tolerance={w.checks.find((c) => c.tolerance)?.tolerance ?? undefined} className="mt-3 text-xs text-ink-600" />
          <p className="mt-3 text-xs text-ink-500">Two-body screening estimates, not a substitute for high-fidelity analysis.</p>
        </Panel>
        <Panel title="Open review items" description={`${openItems.length} open of ${w.reviewItems.length}`}>
          <ul className="space-y-1 text-sm">
            {openItems.map((i) => (
              <li key={i.id}>
                <span className="font-mono text-xs uppercase text-ink-500">{i.severity}</span> {i.title}{" "}
                <span className="text-xs text-ink-500">— {i.authorName}</span>
              </li>
            ))}
            {openItems.length === 0 ? <li className="text-ink-500">None open.</li> : null}
          </ul>
        </Panel>
      </div>

      <ResponseSummary user={user} boardId={boardId} proposalId={proposalId} />

      <Panel title="Reviews">
        <div className="space-y-3">
          {w.reviews.map((r) => (
            <details key={r.assignmentId} className="group rounded-panel border border-ink-200 p-3">
              <summary className="flex cursor-pointer flex-wrap items-center justify-between gap-2 rounded-chip text-sm focus-visible:outline-2 focus-visible:outline-trajectory-600">
                <span className="flex items-center gap-2 font-semibold text-ink-900">
                  <span aria-hidden className="inline-block w-3 text-trajectory-700 transition-transform group-open:rotate-90">
                    ▶
                  </span>
                  {r.reviewerName}
                  <span className="text-xs font-normal text-trajectory-700 underline group-open:hidden">show the review</span>
                  <span className="hidden text-xs font-normal text-trajectory-700 underline group-open:inline">hide</span>
                </span>
                <span className="text-ink-600">
                  {r.status}
                  {r.weightedTotal !== null ? ` · weighted total ${r.weightedTotal.toFixed(2)}` : ""}
                </span>
              </summary>
              {r.status === "submitted" ? (
                <div className="mt-2 space-y-2 text-sm">
                  <table className="w-full text-left">
                    <thead>
                      <tr className="text-xs uppercase text-ink-500">
                        <th className="py-1">Criterion</th>
                        <th className="py-1">Score</th>
                        <th className="py-1">Comment</th>
                      </tr>
                    </thead>
                    <tbody>
                      {r.scores.map((s) => (
                        <tr key={s.criterion} className="border-t border-ink-100">
                          <td className="py-1 font-semibold">{s.title}</td>
                          <td className="py-1 font-mono">{s.score ?? "—"}</td>
                          <td className="py-1">{s.comment}</td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                  {r.summary ? <p className="whitespace-pre-wrap text-ink-800">{r.summary}</p> : null}
                </div>
              ) : (
                <p className="mt-2 text-sm text-ink-500">Not submitted yet.</p>
              )}
            </details>
          ))}
          {w.reviews.length === 0 ? <p className="text-sm text-ink-500">Nobody is assigned to this version yet.</p> : null}
        </div>
      </Panel>

      <Panel title={w.decision ? "Decision issued" : "Decide"} id="decide">
        {w.decision ? (
          <IssuedDecision boardId={boardId} proposalId={proposalId} decision={w.decision} chairView />
        ) : w.blocked ? (
          <p className="text-ink-700">{w.blocked}</p>
        ) : (
          <DecisionForm
            boardId={boardId}
            proposalId={proposalId}
            template={w.template}
            fields={w.mergeFields.map((f) => ({ name: f.name, description: f.description }))}
            items={w.reviewItems.map((i) => ({ id: i.id, severity: i.severity, title: i.title, status: i.status }))}
            needsOverride={w.needsOverride}
            reviewsNote={`The call asks for ${w.call.reviewersRequired} submitted reviews; ${submitted} ${submitted === 1 ? "is" : "are"} in.`}
          />
        )}
        <p className="mt-4 text-xs text-ink-500">
          The board&apos;s letter template is edited under{" "}
          <Link href={`/boards/${boardId}/settings/letter`} className="underline">
            Settings → Decision letter
          </Link>
          .
        </p>
      </Panel>

      {w.earlier.length ? (
        <Panel title="Earlier decisions">
          <div className="space-y-6">
            {w.earlier.map((d) => (
              <IssuedDecision key={d.id} boardId={boardId} proposalId={proposalId} decision={d} chairView />
            ))}
          </div>
        </Panel>
      ) : null}
    </div>
  );
}
