"use client";
// The chair's assignment table: submitted proposals (latest version) with who reviews them,
// row checkboxes for bulk assignment, and the board's reviewers with their current load.
import { formatDateTime } from "@/lib/format/dates";
import { useMemo, useState } from "react";
import { useRouter } from "next/navigation";
import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type RowSelectionState, type SortingState } from "@tanstack/react-table";
import { TableView } from "@/components/data-table/table-view";
import type { AssignmentBoard } from "@/lib/dal/assignments";
import { callApi } from "./api";

type Row = AssignmentBoard["proposals"][number];
const column = createColumnHelper<Row>();

const inTwoWeeks = () => new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10);

export function AssignmentTable({ boardId, data }: { boardId: string; data: AssignmentBoard }) {
  const router = useRouter();
  const [selection, setSelection] = useState<RowSelectionState>({});
  const [sorting, setSorting] = useState<SortingState>([]);
  const [reviewers, setReviewers] = useState<Set<string>>(new Set());
  const [due, setDue] = useState(inTwoWeeks);
  const [answer, setAnswer] = useState<{ tone: "error" | "success" | "confirm"; text: string; lines?: string[] } | null>(null);
  const [pending, setPending] = useState(false);
  const target = data.call.reviewersPerProposal;

  const columns = useMemo(
    () => [
      column.display({
        id: "select",
        header: ({ table }) => (
          <input
            type="checkbox"
            aria-label="Select every proposal"
            checked={table.getIsAllRowsSelected()}
            onChange={table.getToggleAllRowsSelectedHandler()}
            className="accent-trajectory-600"
          />
        ),
        cell: ({ row }) => (
          <input
            type="checkbox"
            aria-label={`Select ${row.original.title}`}
            checked={row.getIsSelected()}
            onChange={row.getToggleSelectedHandler()}
            className="accent-trajectory-600"
          />
        ),
      }),
      column.accessor("title", {
        header: "Proposal",
        cell: (info) => (
          <div>
            <a href={`/boards/${boardId}/proposals/${info.row.original.id}/review`} className="font-semibold text-trajectory-700 hover:underline">
              {info.getValue()}
            </a>
            <p className="text-xs text-ink-600">
              v{info.row.original.versionNumber} · {info.row.original.status.replace("_", " ")}
              {info.row.original.authorOrganisations.length ? ` · ${info.row.original.authorOrganisations.join(", ")}` : ""}
            </p>
          </div>
        ),
      }),
      column.accessor("submittedAt", { header: "Submitted", cell: (info) => formatDateTime(info.getValue()) }),
      column.accessor((r) => r.assigned.length, {
        id: "coverage",
        header: `Reviewers (target ${target})`,
        cell: (info) => {
          const n = info.getValue() as number;
          return (
            <span className={`font-mono ${n < target ? "text-drift-700" : "text-holds-700"}`}>
              {n}/{target}
            </span>
          );
        },
      }),
      column.display({
        id: "assigned",
        header: "Assigned",
        cell: ({ row }) => (
          <ul className="space-y-1">
            {row.original.assigned.map((a) => (
              <li key={a.assignmentId} className="flex flex-wrap items-center gap-1 text-xs">
                <span className="font-semibold">{a.reviewerName}</span>
                <span className="rounded-chip bg-ink-100 px-1.5">{a.reviewStatus}</span>
                <span className="text-ink-600">due {formatDateTime(a.dueAt)}</span>
                {data.conflicts[`${a.reviewerId}:${row.original.id}`]?.some((f) => f.strength === "conflict") ? (
                  <span className="text-void-700">conflict declared</span>
                ) : null}
                {a.reviewStatus !== "submitted" ? (
                  <button
                    type="button"
                    className="text-void-700 underline"
                    onClick={async () => {
                      const res = await callApi(`/api/v1/boards/${boardId}/assignments/${a.assignmentId}`, { method: "DELETE" });
                      if (res.ok) router.refresh();
                      else setAnswer({ tone: "error", text: res.error });
                    }}
                  >
                    remove
                  </button>
                ) : null}
              </li>
            ))}
          </ul>
        ),
      }),
    ],
    [boardId, data.conflicts, router, target],
  );

  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: data.proposals,
    columns,
    getRowId: (r) => r.id,
    state: { rowSelection: selection, sorting },
    onRowSelectionChange: setSelection,
    onSortingChange: setSorting,
    enableRowSelection: true,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const selectedIds = Object.keys(selection).filter((k) => selection[k]);

  const flagsFor = (reviewerId: string) =>
    selectedIds.flatMap((p) =>
      (data.conflicts[`${reviewerId}:${p}`] ?? []).map((f) => ({ ...f, proposal: data.proposals.find((x) => x.id === p)?.title ?? "" })),
    );

  const assign = async (confirm: boolean) => {
    setPending(true);
    const res = await callApi<{ created: unknown[]; existing: unknown[] }>(`/api/v1/boards/${boardId}/assignments`, {
      method: "POST",
      body: { proposalIds: selectedIds, reviewerIds: [...reviewers], dueAt: new Date(`${due}T23:59:00Z`).toISOString(), confirmLikelyConflicts: confirm },
    });
    setPending(false);
    if (res.ok) {
      setAnswer({
        tone: "success",
        text: `${res.data.created.length} assignment(s) made${res.data.existing.length ? `, ${res.data.existing.length} already existed` : ""}. Reviewers are e-mailed.`,
      });
      setSelection({});
      setReviewers(new Set());
      router.refresh();
      return;
    }
    const details = res.details as { blocked?: { message: string }[]; needsConfirmation?: boolean } | undefined;
    setAnswer({
      tone: details?.needsConfirmation ? "confirm" : "error",
      text: details?.needsConfirmation ? "Some pairs may have a conflict of interest:" : res.error,
      lines: details?.blocked?.map((b) => b.message),
    });
  };

  return (
    <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_22rem]">
      <div className="overflow-x-auto rounded-panel border border-ink-200 bg-white">
        <TableView
          table={table}
          caption="Submitted proposals and their reviewers"
          emptyText="No submitted proposals in this call yet."
          rowClassName={(row) => (row.getIsSelected() ? "bg-trajectory-100/50" : "")}
        />
      </div>
      <aside aria-labelledby="assign-heading" className="space-y-3 rounded-panel border border-ink-200 bg-white p-4 shadow-panel">
        <h2 id="assign-heading" className="text-lg font-semibold">
          Assign {selectedIds.length} selected
        </h2>
        {!data.call.hasRubric ? <p className="text-sm text-drift-700">Set up the rubric first: reviewers cannot start without it.</p> : null}
        <fieldset>
          <legend className="text-sm font-semibold">Reviewers (open reviews now)</legend>
          <ul className="mt-1 space-y-1">
            {data.reviewers.map((r) => {
              const flags = flagsFor(r.id);
              const hard = flags.some((f) => f.strength === "conflict");
              return (
                <li key={r.id}>
                  <label className="flex items-start gap-2 text-sm">
                    <input
                      type="checkbox"
                      className="mt-1 accent-trajectory-600"
                      checked={reviewers.has(r.id)}
                      onChange={(e) =>
                        setReviewers((s) => {
                          const next = new Set(s);
                          if (e.target.checked) next.add(r.id);
                          else next.delete(r.id);
                          return next;
                        })
                      }
                    />
                    <span>
                      <span className="font-semibold">{r.name}</span> <span className="font-mono text-xs">· {r.openLoad} open</span>
                      {r.organisation ? <span className="block text-xs text-ink-500">{r.organisation}</span> : null}
                      {flags.map((f, i) => (
                        <span key={i} className={`block text-xs ${hard ? "text-void-700" : "text-drift-700"}`}>
                          {f.strength === "conflict" ? "Conflict" : "Likely conflict"} with “{f.proposal}”: {f.message}
                        </span>
                      ))}
                    </span>
                  </label>
                </li>
              );
            })}
          </ul>
        </fieldset>
        <label className="block text-sm font-semibold">
          Due date (end of day, UTC)
          <input
            type="date"
            value={due}
            onChange={(e) => setDue(e.target.value)}
            required
            className="mt-1 block w-full rounded-chip border border-ink-300 px-2 py-1.5 font-normal"
          />
        </label>
        {answer ? (
          <div
            role={answer.tone === "success" ? "status" : "alert"}
            className={`rounded-chip border px-3 py-2 text-sm ${answer.tone === "success" ? "border-holds-500/50 bg-holds-100 text-holds-700" : answer.tone === "confirm" ? "border-drift-500/50 bg-drift-100 text-drift-700" : "border-void-500/50 bg-void-100 text-void-700"}`}
          >
            <p>{answer.text}</p>
            {answer.lines?.length ? (
              <ul className="mt-1 list-disc pl-4">
                {answer.lines.map((l) => (
                  <li key={l}>{l}</li>
                ))}
              </ul>
            ) : null}
            {answer.tone === "confirm" ? (
              <button type="button" onClick={() => void assign(true)} className="mt-2 rounded-chip bg-drift-700 px-3 py-1 font-semibold text-white">
                Assign anyway (recorded)
              </button>
            ) : null}
          </div>
        ) : null}
        <button
          type="button"
          disabled={pending || selectedIds.length === 0 || reviewers.size === 0}
          onClick={() => void assign(false)}
          className="w-full rounded-chip bg-trajectory-600 px-4 py-2 font-semibold text-white hover:bg-trajectory-700 disabled:opacity-50"
        >
          {pending ? "Assigning…" : `Assign ${reviewers.size} reviewer(s) to ${selectedIds.length} proposal(s)`}
        </button>
      </aside>
    </div>
  );
}
