"use client";
// The chair's overview of a call: sortable, filterable, with a score-distribution chart per
// proposal and a CSV export (the server builds the file).
import Link from "next/link";
import { useMemo, useState } from "react";
import { createColumnHelper, getCoreRowModel, getFilteredRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { TableView } from "@/components/data-table/table-view";
import type { CallOverview, OverviewRow } from "@/lib/dal/reviews";
import { formatScore } from "./api";
import { ScoreChart } from "./score-chart";

const column = createColumnHelper<OverviewRow>();

/** Calibrated means beside the raw ones (lib/dal/meetings.ts `callCalibration`), and what the chair ranks by. */
export interface OverviewCalibration {
  rankBy: "raw" | "calibrated";
  byProposal: Record<string, { calibratedMean: number; rankNote: string | null }>;
}

export function OverviewTable({ boardId, overview, calibration }: { boardId: string; overview: CallOverview; calibration?: OverviewCalibration }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: calibration?.rankBy === "calibrated" ? "calibratedMean" : "weightedMean", desc: true }]);
  const [search, setSearch] = useState("");
  const [onlyFlagged, setOnlyFlagged] = useState(false);
  const scale = overview.scale;
  const data = useMemo(
    () => (onlyFlagged ? overview.rows.filter((r) => r.checks.inconsistent + r.checks.invalid + r.openItems.major + r.requirementsNotMet > 0) : overview.rows),
    [overview.rows, onlyFlagged],
  );
  const columns = useMemo(
    () => [
      column.accessor("title", {
        header: "Proposal",
        cell: (info) => (
          <div>
            {/* The chair's view of the proposal; its reviews and the decision are one click on. */}
            <Link href={`/boards/${boardId}/proposals/${info.row.original.proposalId}`} className="font-semibold text-trajectory-700 hover:underline">
              {info.getValue()}
              <span className="ml-1 text-xs font-normal text-ink-500">v{info.row.original.versionNumber}</span>
            </Link>
            <span className="mt-1 flex gap-3 text-xs">
              <Link
                href={`/boards/${boardId}/proposals/${info.row.original.proposalId}/review`}
                aria-label={`Reviews of ${info.getValue()}`}
                className="text-trajectory-700 underline"
              >
                Reviews
              </Link>
              <Link
                href={`/boards/${boardId}/proposals/${info.row.original.proposalId}/decision`}
                aria-label={`Decision on ${info.getValue()}`}
                className="text-trajectory-700 underline"
              >
                Decision
              </Link>
            </span>
          </div>
        ),
      }),
      column.accessor("weightedMean", {
        header: "Weighted mean",
        sortUndefined: "last",
        sortingFn: (a, b) => (a.original.weightedMean ?? -Infinity) - (b.original.weightedMean ?? -Infinity),
        cell: (info) => (
          <span className="font-mono" data-testid="weighted-mean">
            {formatScore(info.getValue())}
          </span>
        ),
      }),
      ...(calibration
        ? [
            column.accessor((r) => calibration.byProposal[r.proposalId]?.calibratedMean ?? null, {
              id: "calibratedMean",
              header: () => <span title="The mean less each reviewer's fitted leniency (docs/calibration.md)">Calibrated mean</span>,
              sortingFn: (a, b) =>
                (calibration.byProposal[a.original.proposalId]?.calibratedMean ?? -Infinity) -
                (calibration.byProposal[b.original.proposalId]?.calibratedMean ?? -Infinity),
              cell: (info) => (
                <span>
                  <span className="font-mono" data-testid="calibrated-mean">
                    {formatScore(info.getValue())}
                  </span>
                  {calibration.byProposal[info.row.original.proposalId]?.rankNote ? (
                    <span className="block text-xs text-drift-700">{calibration.byProposal[info.row.original.proposalId]!.rankNote}</span>
                  ) : null}
                </span>
              ),
            }),
          ]
        : []),
      column.accessor("spread", {
        header: () => <span title="Sample standard deviation (divides by n − 1) of the reviewers' weighted totals">Spread (sample s.d.)</span>,
        sortingFn: (a, b) => (a.original.spread ?? -Infinity) - (b.original.spread ?? -Infinity),
        cell: (info) => <span className="font-mono">{formatScore(info.getValue())}</span>,
      }),
      column.accessor("reviews", {
        header: "Reviews",
        cell: (info) => (
          <span className="font-mono">
            {info.getValue()} of {info.row.original.assigned}
            <span className="text-xs text-ink-500"> (target {info.row.original.target})</span>
          </span>
        ),
      }),
      column.accessor((r) => r.openItems.major * 1e6 + r.openItems.minor * 1e3 + r.openItems.comment, {
        id: "items",
        header: "Open items",
        cell: (info) => {
          const o = info.row.original.openItems;
          return (
            <span className="text-xs">
              <span className={o.major > 0 ? "font-semibold text-void-700" : "text-ink-600"}>{o.major} major</span> ·{" "}
              <span className={o.minor > 0 ? "text-drift-700" : "text-ink-600"}>{o.minor} minor</span> ·{" "}
              <span className="text-ink-600">{o.comment} comment</span>
            </span>
          );
        },
      }),
      column.accessor((r) => r.checks.inconsistent + r.checks.invalid, {
        id: "flags",
        header: "Orbit-check flags",
        cell: (info) => {
          const c = info.row.original.checks;
          return (
            <span className="text-xs">
              <span className={c.inconsistent > 0 ? "font-semibold text-drift-700" : "text-ink-600"}>{c.inconsistent} inconsistent</span> ·{" "}
              <span className={c.invalid > 0 ? "font-semibold text-void-700" : "text-ink-600"}>{c.invalid} cannot be evaluated</span>
            </span>
          );
        },
      }),
      column.accessor((r) => r.requirementsNotMet, {
        id: "requirements",
        header: "Requirements not met",
        cell: (info) => (
          <span className={`text-xs ${info.getValue() > 0 ? "font-semibold text-void-700" : "text-ink-600"}`} data-requirements-not-met={info.getValue()}>
            {info.getValue() > 0 ? `${info.getValue()} not met` : "none"}
          </span>
        ),
      }),
      column.display({
        id: "chart",
        header: "Distribution",
        cell: ({ row }) =>
          scale ? (
            <ScoreChart
              distribution={row.original.distribution}
              mean={row.original.weightedMean}
              scale={scale}
              label={`Weighted totals for ${row.original.title}`}
            />
          ) : null,
      }),
    ],
    [boardId, scale, calibration],
  );
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data,
    columns,
    getRowId: (r) => r.proposalId,
    state: { sorting, globalFilter: search },
    onSortingChange: setSorting,
    onGlobalFilterChange: setSearch,
    globalFilterFn: (row, _id, value: string) => row.original.title.toLowerCase().includes(value.toLowerCase()),
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-4">
        <label className="text-sm font-semibold">
          Filter by title
          <input
            type="search"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            className="mt-1 block w-64 rounded-chip border border-ink-300 px-3 py-1.5 font-normal"
          />
        </label>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" checked={onlyFlagged} onChange={(e) => setOnlyFlagged(e.target.checked)} className="accent-trajectory-600" />
          Only proposals with flags or open major items
        </label>
        <a
          href={`/api/v1/boards/${boardId}/calls/${overview.call.id}/overview/csv`}
          className="ml-auto rounded-chip border border-ink-300 px-3 py-1.5 text-sm font-semibold hover:border-trajectory-500"
          download
        >
          Export CSV
        </a>
      </div>
      <div className="overflow-x-auto rounded-panel border border-ink-200 bg-white">
        <TableView table={table} caption="Scores and flags per proposal" emptyText="Nothing matches." rowData={(row) => ({ "data-proposal": row.id })} />
      </div>
      <p className="text-xs text-ink-500">
        Weighted mean: the mean of the submitted reviews&apos; weighted totals (each Σ weight × score / 100). Spread: their sample standard deviation (n − 1),
        shown once two reviews are in. The dashed line in each chart marks the mean.
      </p>
    </div>
  );
}
