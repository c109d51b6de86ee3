"use client";
// A reviewer declares conflicts of interest: with one proposal (and why), or with an organisation.
import { formatDate } from "@/lib/format/dates";
import { useState } from "react";
import { useRouter } from "next/navigation";
import type { ConflictCandidate, ConflictView } from "@/lib/dal/conflicts";
import { callApi } from "./api";
import { CharacterCount } from "@/components/ui/form-controls";

export function ConflictDeclarations({ boardId, conflicts, candidates }: { boardId: string; conflicts: ConflictView[]; candidates: ConflictCandidate[] }) {
  const router = useRouter();
  const [kind, setKind] = useState<"proposal" | "organisation">("proposal");
  const [proposalId, setProposalId] = useState("");
  const [organisation, setOrganisation] = useState("");
  const [reason, setReason] = useState("");
  const [answer, setAnswer] = useState<{ ok: boolean; text: string } | null>(null);
  const base = `/api/v1/boards/${boardId}/conflicts`;
  return (
    <div className="grid gap-6 lg:grid-cols-2">
      <form
        className="space-y-3 rounded-panel border border-ink-200 bg-white p-4 shadow-panel"
        onSubmit={async (e) => {
          e.preventDefault();
          const body = kind === "proposal" ? { proposalId, reason } : { organisation, reason };
          const res = await callApi(base, { method: "POST", body });
          setAnswer(res.ok ? { ok: true, text: "Declared. The chair sees it and will not assign you there." } : { ok: false, text: res.error });
          if (res.ok) {
            setReason("");
            setOrganisation("");
            router.refresh();
          }
        }}
      >
        <h2 className="text-lg font-semibold">Declare a conflict</h2>
        <fieldset className="flex gap-4 text-sm">
          <legend className="sr-only">Conflict with</legend>
          <label className="flex items-center gap-1">
            <input type="radio" name="kind" checked={kind === "proposal"} onChange={() => setKind("proposal")} className="accent-trajectory-600" /> one proposal
          </label>
          <label className="flex items-center gap-1">
            <input type="radio" name="kind" checked={kind === "organisation"} onChange={() => setKind("organisation")} className="accent-trajectory-600" /> an
            organisation
          </label>
        </fieldset>
        {kind === "proposal" ? (
          <label className="block text-sm font-semibold">
            Proposal
            <select
              value={proposalId}
              onChange={(e) => setProposalId(e.target.value)}
              required
              className="mt-1 block w-full rounded-chip border border-ink-300 bg-white px-2 py-1.5 font-normal"
            >
              <option value="">Choose…</option>
              {candidates.map((c) => (
                <option key={c.id} value={c.id}>
                  {c.title}
                  {c.organisations.length ? ` (${c.organisations.join(", ")})` : ""}
                  {c.authors ? ` · ${c.authors.join(", ")}` : ""}
                  {c.declared ? " · declared" : ""}
                </option>
              ))}
            </select>
          </label>
        ) : (
          <>
            <label className="block text-sm font-semibold">
              Organisation
              <input
                value={organisation}
                onChange={(e) => setOrganisation(e.target.value)}
                required
                maxLength={200}
                aria-describedby="conflict-organisation-count"
                className="mt-1 block w-full rounded-chip border border-ink-300 px-2 py-1.5 font-normal"
              />
            </label>
            <CharacterCount id="conflict-organisation-count" length={organisation.length} max={200} />
          </>
        )}
        <label className="block text-sm font-semibold">
          Reason
          <textarea
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            required
            minLength={3}
            maxLength={2000}
            rows={3}
            aria-describedby="conflict-reason-count"
            className="mt-1 block w-full rounded-chip border border-ink-300 px-2 py-1.5 font-normal"
          />
        </label>
        <CharacterCount id="conflict-reason-count" length={reason.length} max={2000} />
        {answer ? (
          <p role={answer.ok ? "status" : "alert"} className={`text-sm ${answer.ok ? "text-holds-700" : "text-void-700"}`}>
            {answer.text}
          </p>
        ) : null}
        <button type="submit" className="rounded-chip bg-trajectory-600 px-4 py-2 font-semibold text-white hover:bg-trajectory-700">
          Declare
        </button>
      </form>
      <section aria-labelledby="declared-heading" className="rounded-panel border border-ink-200 bg-white p-4 shadow-panel">
        <h2 id="declared-heading" className="text-lg font-semibold">
          Your declarations
        </h2>
        {conflicts.length === 0 ? <p className="text-sm text-ink-600">None.</p> : null}
        <ul className="mt-2 divide-y divide-ink-100">
          {conflicts.map((c) => (
            <li key={c.id} className="flex items-start justify-between gap-3 py-2 text-sm">
              <span>
                <span className="font-semibold">{c.proposalTitle ?? c.organisation}</span> — {c.reason}
                <span className="block text-xs text-ink-500">{formatDate(c.createdAt)}</span>
              </span>
              <button
                type="button"
                className="text-void-700 underline"
                onClick={async () => {
                  const res = await callApi(`${base}/${c.id}`, { method: "DELETE" });
                  if (res.ok) router.refresh();
                  else setAnswer({ ok: false, text: res.error });
                }}
              >
                Withdraw
              </button>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
