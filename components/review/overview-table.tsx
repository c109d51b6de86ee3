"use client";
// The chair's overview of a call. Paging, sorting and the filters run on the server: the
// table writes them into the URL's search parameters (page, pageSize, sort, dir, q, flagged)
// and the page's server component reads them back, so Back/Forward restore a view. The title
// filter is sent as the chair types (replacing the history entry) and keeps its text and focus;
// a score-distribution chart is drawn for the rows of the page only. The CSV is built by the
// server with the same filters.
import Link from "next/link";
import { usePathname, useRouter, useSearchParams } from "next/navigation";
import { useEffect, useMemo, useOptimistic, useRef, useState, useTransition } from "react";
import { createColumnHelper, getCoreRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { TableView } from "@/components/data-table/table-view";
import type { CallOverview, OverviewRow } from "@/lib/dal/reviews";
import { formatScore } from "./api";
import { ScoreChart } from "./score-chart";

const column = createColumnHelper<OverviewRow>();

const PAGE_SIZES = [25, 50, 100, 200];

/** Calibrated means beside the raw ones (lib/dal/meetings.ts `callCalibration`), and what the chair ranks by. */
export interface OverviewCalibration {
  rankBy: "raw" | "calibrated";
  byProposal: Record<string, { calibratedMean: number; rankNote: string | null }>;
}

export function OverviewTable({ boardId, overview, calibration }: { boardId: string; overview: CallOverview; calibration?: OverviewCalibration }) {
  const router = useRouter();
  const pathname = usePathname();
  const searchParams = useSearchParams();
  const [pending, startTransition] = useTransition();
  const scale = overview.scale;
  // What the chair typed. `sent` is the filter this box last sent; a URL filter that differs
  // from it came from Back/Forward, and the box shows it.
  const [query, setQuery] = useState(overview.q);
  const [sent, setSent] = useState(overview.q);
  if (overview.q !== sent) {
    setSent(overview.q);
    setQuery(overview.q);
  }
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  useEffect(() => () => (timer.current ? clearTimeout(timer.current) : undefined), []);

  // The checkbox and the page size show the chair's choice at once, while the server answers.
  const [shown, setShown] = useOptimistic({ flagged: overview.flagged, pageSize: overview.pageSize });
  // The view last asked for: a change made while another is on its way builds on it, not on
  // the URL still shown (unticking the flags, then clearing the filter, keeps both changes).
  const asked = useRef(searchParams.toString());
  const current = searchParams.toString();
  useEffect(() => {
    asked.current = current;
  }, [current]);
  const navigate = (changes: Record<string, string | undefined>, mode: "push" | "replace" = "push", optimistic?: Partial<typeof shown>) => {
    const next = new URLSearchParams(asked.current);
    for (const [key, value] of Object.entries(changes)) {
      if (value === undefined || value === "") next.delete(key);
      else next.set(key, value);
    }
    const qs = next.toString();
    asked.current = qs;
    const href = qs ? `${pathname}?${qs}` : pathname;
    startTransition(() => {
      if (optimistic) setShown((current) => ({ ...current, ...optimistic }));
      if (mode === "push") router.push(href, { scroll: false });
      else router.replace(href, { scroll: false });
    });
  };
  const sendFilter = (value: string, mode: "push" | "replace") => {
    if (timer.current) clearTimeout(timer.current);
    const trimmed = value.trim();
    // Compared with what was last sent, not the shown view: a filter still on its way counts.
    if (trimmed === sent) return;
    setSent(trimmed);
    navigate({ q: trimmed, page: undefined }, mode);
  };

  const columns = useMemo(
    () => [
      column.accessor("title", {
        header: "Proposal",
        sortDescFirst: false,
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
        cell: (info) => (
          <span className="font-mono" data-testid="weighted-mean">
            {formatScore(info.getValue())}
          </span>
        ),
      }),
      ...(calibration
        ? [
            // Sorted by the server like the other columns (sort=calibratedMean).
            column.accessor((r) => calibration.byProposal[r.proposalId]?.calibratedMean ?? null, {
              id: "calibratedMean",
              header: () => <span title="The mean less each reviewer's fitted leniency (docs/calibration.md)">Calibrated mean</span>,
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
  const sorting: SortingState = [{ id: overview.sort, desc: overview.dir === "desc" }];
  const pageCount = Math.max(1, Math.ceil(overview.total / overview.pageSize));
  // TanStack Table v8 returns fresh functions each render, so the React Compiler skips this
  // component; that is expected (the table holds one server page).
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: overview.rows,
    columns,
    getRowId: (r) => r.proposalId,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    pageCount,
    sortDescFirst: true,
    state: { sorting, pagination: { pageIndex: overview.page - 1, pageSize: overview.pageSize } },
    onSortingChange: (updater) => {
      const first = (typeof updater === "function" ? updater(sorting) : updater)[0];
      // A third click clears TanStack's sort; the server's default order then applies.
      navigate({ sort: first?.id, dir: first ? (first.desc ? "desc" : "asc") : undefined, page: undefined });
    },
  });
  const from = overview.rows.length ? (overview.page - 1) * overview.pageSize + 1 : 0;
  const to = overview.rows.length ? from + overview.rows.length - 1 : 0;
  const csvParams = new URLSearchParams();
  if (overview.q) csvParams.set("q", overview.q);
  if (overview.flagged) csvParams.set("flagged", "1");
  const csvQs = csvParams.toString();
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-4">
        <form
          role="search"
          aria-label="Filter the overview"
          onSubmit={(e) => {
            e.preventDefault();
            sendFilter(query, "push");
          }}
        >
          <label className="text-sm font-semibold">
            Filter by title
            <input
              type="search"
              value={query}
              maxLength={200}
              onChange={(e) => {
                const value = e.target.value;
                setQuery(value);
                if (timer.current) clearTimeout(timer.current);
                timer.current = setTimeout(() => sendFilter(value, "replace"), 350);
              }}
              className="mt-1 block w-64 rounded-chip border border-ink-300 px-3 py-1.5 font-normal"
            />
          </label>
        </form>
        <label className="flex items-center gap-2 text-sm">
          <input
            type="checkbox"
            checked={shown.flagged}
            onChange={(e) => navigate({ flagged: e.target.checked ? "1" : undefined, page: undefined }, "push", { flagged: e.target.checked })}
            className="accent-trajectory-600"
          />
          Only proposals with flags, unmet requirements or open major items
        </label>
        <a
          href={`/api/v1/boards/${boardId}/calls/${overview.call.id}/overview/csv${csvQs ? `?${csvQs}` : ""}`}
          className="ml-auto rounded-chip border border-ink-300 px-3 py-1.5 text-sm font-semibold hover:border-trajectory-500"
          download
        >
          Export CSV{overview.q || overview.flagged ? " (filtered)" : ""}
        </a>
      </div>
      <div aria-busy={pending} className={`overflow-x-auto rounded-panel border border-ink-200 bg-white ${pending ? "opacity-70" : ""}`}>
        <TableView table={table} caption="Scores and flags per proposal" emptyText="Nothing matches." rowData={(row) => ({ "data-proposal": row.id })} />
      </div>
      <nav aria-label="Overview pages" className="flex flex-wrap items-center justify-between gap-2 text-sm text-ink-600">
        <p role="status">{overview.total === 0 ? "No proposals match." : `Proposals ${from}–${to} of ${overview.total}`}</p>
        <div className="flex items-center gap-2">
          <label className="flex items-center gap-1">
            Rows per page
            <select
              value={shown.pageSize}
              onChange={(e) => navigate({ pageSize: e.target.value, page: undefined }, "push", { pageSize: Number(e.target.value) })}
              className="rounded-chip border border-ink-300 bg-white px-2 py-1"
            >
              {PAGE_SIZES.map((n) => (
                <option key={n} value={n}>
                  {n}
                </option>
              ))}
            </select>
          </label>
          <button
            type="button"
            disabled={overview.page <= 1}
            onClick={() => navigate({ page: overview.page - 1 > 1 ? String(overview.page - 1) : undefined })}
            className="rounded-chip border border-ink-300 bg-white px-3 py-1 disabled:opacity-40"
          >
            Previous
          </button>
          <span>
            Page {overview.page} of {pageCount}
          </span>
          <button
            type="button"
            disabled={overview.page >= pageCount}
            onClick={() => navigate({ page: String(overview.page + 1) })}
            className="rounded-chip border border-ink-300 bg-white px-3 py-1 disabled:opacity-40"
          >
            Next
          </button>
        </div>
      </nav>
      <p className="text-xs text-ink-500">
        Weighted mean: the mean of the submitted reviews&apos; weighted totals (each Σ weight × score / 100). Spread: their sample standard deviation (n − 1),
        shown once two reviews are in. The dashed line in each chart marks the mean. Unreviewed proposals come last in every score order.
      </p>
    </div>
  );
}
