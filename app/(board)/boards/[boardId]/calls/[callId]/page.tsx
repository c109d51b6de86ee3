import { formatDateTime } from "@/lib/format/dates";
import type { Metadata } from "next";
import Link from "next/link";
import { CONSISTENT_MEANS, policySummary } from "@/lib/orbit/labels";
import { listProposals } from "@/lib/dal/proposals";
import { proposalListQuerySchema } from "@/lib/validation/dossier";
import { CallForm } from "@/components/dossier/call-form";
import { PageTitle, Panel } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { getBoard } from "@/lib/dal/boards";
import { getCall } from "@/lib/dal/calls";
import { listRequirements } from "@/lib/dal/requirements";
import { listStations } from "@/lib/dal/stations";
import { CallRequirements } from "@/components/dossier/call-requirements";
import { ResponseWindowForm } from "@/components/review/response-window-form";
import { getResponseWindow } from "@/lib/dal/responses";

export const metadata: Metadata = { title: "Call" };

const STATE_TEXT = { upcoming: "Opens soon", open: "Open for submissions", closed: "Closed" } as const;

export default async function CallPage({ params }: { params: Promise<{ boardId: string; callId: string }> }) {
  const { boardId, callId } = await params;
  const user = await pageUser(`/boards/${boardId}/calls/${callId}`);
  const board = await orNotFound(getBoard(user, boardId));
  const call = await orNotFound(getCall(user, boardId, callId));
  const isChair = can(user, "call.manage", { role: board.myRole });
  const isProposer = can(user, "proposal.create", { role: board.myRole });
  const onPanel = can(user, "meeting.view", { role: board.myRole });
  const requirements = await listRequirements(user, boardId, callId);
  const responseWindow = await getResponseWindow(user, boardId, callId);
  const stationNames = isChair ? (await listStations(user, boardId)).stations.map((s) => s.name) : [];
  const abs = Object.entries(call.tolerance.absolute ?? {});
  const submitted = isChair ? await listProposals(user, boardId, proposalListQuerySchema.parse({ callId, pageSize: 50, sort: "title", dir: "asc" })) : null;
  if (submitted) submitted.rows = submitted.rows.filter((p) => p.latestVersion > 0);
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={board.name} title={call.title}>
        <p>
          <span className="mr-2 rounded-chip bg-ink-100 px-2 py-0.5 text-sm">{STATE_TEXT[call.state]}</span>
          {formatDateTime(call.opensAt)} – {formatDateTime(call.closesAt)}
        </p>
        {call.description ? <p className="mt-2 whitespace-pre-line">{call.description}</p> : null}
        {onPanel ? (
          <p className="mt-2">
            <Link href={`/boards/${boardId}/calls/${callId}/meeting`} className="font-semibold text-trajectory-700 underline">
              Panel meeting
            </Link>
          </p>
        ) : null}
      </PageTitle>
      <Panel title="What a dossier needs">
        <dl className="grid gap-2 text-sm sm:grid-cols-[12rem_1fr]">
          <dt className="font-semibold">Required sections</dt>
          <dd>{call.requiredSections.length > 0 ? call.requiredSections.join(" · ") : "none"}</dd>
          <dt className="font-semibold">Orbit-check tolerance</dt>
          <dd>
            <span data-call-policy="">{policySummary(call.tolerance)}</span>
            <span className="ml-1 font-mono text-xs text-ink-600">
              ({Number((call.tolerance.relative * 100).toPrecision(6))} % relative
              {abs.length > 0 ? `; absolute ${abs.map(([u, v]) => `${v} ${u}`).join(", ")}` : "; the contract's absolute bounds"})
            </span>
            <span className="block text-xs text-ink-600">{CONSISTENT_MEANS}</span>
          </dd>
          <dt className="font-semibold">Reviewers per proposal</dt>
          <dd>{call.reviewersPerProposal}</dd>
        </dl>
        {isProposer && call.state === "open" ? (
          <p className="mt-4">
            <Link
              href={`/boards/${boardId}/proposals#new-proposal`}
              className="rounded-chip bg-trajectory-600 px-3 py-1.5 font-semibold text-white hover:bg-trajectory-700"
            >
              Start a proposal
            </Link>
          </p>
        ) : null}
      </Panel>
      <Panel
        title="Requirements"
        description="What the board demands of every dossier's budgets and orbit. Each claim they concern is judged met, not met or not evaluated at submission, beside its agreement verdict."
      >
        <CallRequirements
          boardId={boardId}
          callId={callId}
          editable={isChair}
          stations={stationNames}
          requirements={requirements.map((r) => ({ id: r.id, type: r.type, summary: r.summary, rationale: r.rationale, params: r.params }))}
        />
      </Panel>
      {isChair && submitted && submitted.rows.length > 0 ? (
        <Panel
          id="submitted-versions"
          title="Submitted versions and today's rules"
          description="Each version keeps the verdicts recorded at its submission. Open one to run today's rules on it and see what a policy change would differ on."
        >
          <ul className="divide-y divide-ink-100 text-sm">
            {submitted.rows.map((p) => (
              <li key={p.id} className="py-1.5">
                <Link href={`/boards/${boardId}/proposals/${p.id}/versions/${p.latestVersion}`} className="font-semibold text-trajectory-700 hover:underline">
                  {p.title}: version {p.latestVersion}
                </Link>
              </li>
            ))}
          </ul>
        </Panel>
      ) : null}
      {isChair ? (
        <Panel
          id="response-round"
          title="Response round"
          description="While the round is open, proposers read the review items on their versions (reviewers stay anonymous) and answer each one. Reviewers and you then record a disposition per item."
        >
          <ResponseWindowForm boardId={boardId} callId={callId} initial={responseWindow} />
        </Panel>
      ) : responseWindow ? (
        <Panel id="response-round" title="Response round">
          <p className="text-sm">
            {responseWindow.state === "open" ? "Open" : responseWindow.state === "upcoming" ? "Opens" : "Closed"}: {formatDateTime(responseWindow.opensAt)} –{" "}
            {formatDateTime(responseWindow.closesAt)}. Proposers answer the review items from the page of each proposal.
          </p>
        </Panel>
      ) : null}
      {isChair ? (
        <Panel title="Call settings" description="Changing the tolerance affects submissions from now on; versions already submitted keep their results.">
          <CallForm boardId={boardId} initial={call} afterSave="refresh" />
        </Panel>
      ) : null}
    </div>
  );
}
