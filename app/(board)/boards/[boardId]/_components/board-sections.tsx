// The board home is a stack of sections; each area (calls, dossiers, reviews, decisions)
// adds its own section component here and to the list in ../page.tsx.
import { formatDateTime } from "@/lib/format/dates";
import Link from "next/link";
import { Panel } from "@/components/ui/panel";
import type { BoardCallSummary, BoardView } from "@/lib/dal/boards";
import type { ProposalRow } from "@/lib/dal/proposals";

export function BoardCallsSection({ board, calls }: { board: BoardView; calls: BoardCallSummary[] }) {
  return (
    <Panel id="calls" title="Calls" description="Each call collects dossiers until it closes.">
      {calls.length === 0 ? (
        <p className="text-ink-600">No calls yet.</p>
      ) : (
        <ul className="divide-y divide-ink-100">
          {calls.map((call) => {
            const state = { upcoming: "Opens soon", open: "Open", closed: "Closed" }[call.state];
            return (
              <li key={call.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                <Link href={`/boards/${board.id}/calls/${call.id}`} className="font-semibold text-trajectory-700 hover:underline">
                  {call.title}
                </Link>
                <span className="text-sm text-ink-600">
                  <span className="mr-2 rounded-chip bg-ink-100 px-2 py-0.5 text-ink-700">{state}</span>
                  {formatDateTime(call.opensAt)} – {formatDateTime(call.closesAt)}
                </span>
              </li>
            );
          })}
        </ul>
      )}
    </Panel>
  );
}

const proposalStatusText = { draft: "Draft", submitted: "Submitted", in_review: "In review", decided: "Decided", withdrawn: "Withdrawn" } as const;

export function BoardDossiersSection({ board, proposals, hasMore }: { board: BoardView; proposals: ProposalRow[]; hasMore: boolean }) {
  return (
    <Panel id="dossiers" title="Your dossiers" description="Write a mission dossier for an open call, attach its files and submit it.">
      {proposals.length > 0 ? (
        <ul className="mb-4 divide-y divide-ink-100">
          {proposals.map((p) => (
            <li key={p.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
              <Link href={`/boards/${board.id}/proposals/${p.id}`} className="font-semibold text-trajectory-700 hover:underline">
                {p.title}
              </Link>
              <span className="text-sm text-ink-600">
                {p.callTitle} · <span className="rounded-chip bg-ink-100 px-2 py-0.5 text-ink-700">{proposalStatusText[p.status]}</span>
                {p.latestVersion > 0 ? ` · version ${p.latestVersion}` : ""}
                {p.status === "decided" ? (
                  <>
                    {" · "}
                    <Link href={`/boards/${board.id}/proposals/${p.id}/decision`} className="text-trajectory-700 underline">
                      the decision
                    </Link>
                  </>
                ) : null}
              </span>
            </li>
          ))}
        </ul>
      ) : (
        <p className="mb-4 text-ink-600">No dossiers yet.</p>
      )}
      {hasMore ? <p className="mb-3 text-sm text-ink-600">Showing the {proposals.length} most recently changed; you have more in the full list.</p> : null}
      <ul className="flex flex-wrap gap-3">
        <li>
          <Link
            href={`/boards/${board.id}/proposals`}
            className="inline-block rounded-chip bg-trajectory-600 px-3 py-1.5 font-semibold text-white hover:bg-trajectory-700"
          >
            All your proposals, or start one
          </Link>
        </li>
      </ul>
    </Panel>
  );
}

export function BoardStewardshipSection({ board }: { board: BoardView }) {
  return (
    <Panel id="stewardship" title="Running the board" description="For chairs and administrators.">
      <ul className="flex flex-wrap gap-3">
        <li>
          <Link
            href={`/boards/${board.id}/calls`}
            className="inline-block rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
          >
            Calls and their settings
          </Link>
        </li>
        <li>
          <Link
            href={`/boards/${board.id}/members`}
            className="inline-block rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
          >
            Members and invitations
          </Link>
        </li>
        <li>
          <Link
            href={`/boards/${board.id}/settings`}
            className="inline-block rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
          >
            Board settings
          </Link>
        </li>
        <li>
          <Link
            href={`/boards/${board.id}/settings/letter`}
            className="inline-block rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
          >
            Decision letter template
          </Link>
        </li>
        <li>
          <Link
            href={`/boards/${board.id}/stations`}
            className="inline-block rounded-chip border border-ink-300 px-3 py-1.5 font-semibold hover:border-trajectory-500"
          >
            Ground stations
          </Link>
        </li>
      </ul>
      {board.openRegistration ? (
        <p className="mt-3 text-sm text-ink-600">
          Open registration is on: proposers can join at{" "}
          <Link href={`/boards/${board.slug}/register`} className="font-mono text-trajectory-700 underline">
            /boards/{board.slug}/register
          </Link>
          .
        </p>
      ) : null}
    </Panel>
  );
}
