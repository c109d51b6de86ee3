"use client";
// One table for every list in VisViva (members, audit log, queues...). Paging, sorting and
// search happen on the server: the table writes them into the URL's search parameters
// (page, pageSize, sort, dir, q) and the page's server component reads them back.
import { useState } from "react";
import { usePathname, useRouter, useSearchParams } from "next/navigation";
import { getCoreRowModel, useReactTable, type ColumnDef, type SortingState } from "@tanstack/react-table";
import { TableView } from "./table-view";

export interface DataTableProps<TRow> {
  /** Read by screen readers and shown above the table. */
  caption: string;
  // TanStack's ColumnDef needs `any` for the value type when columns of different types share a list.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ColumnDef<TRow, any>[];
  rows: TRow[];
  /** The exact row count; leave out for lists that do not count and give `hasMore` instead. */
  total?: number;
  /** For lists without a count: whether another page follows this one. */
  hasMore?: boolean;
  /**
   * Keyset paging: the server's cursors for the next and previous pages. When given (even
   * null), Next and Previous write `cursor` (and `page`, the shown number) instead of OFFSET paging.
   */
  nextCursor?: string | null;
  prevCursor?: string | null;
  page: number;
  pageSize: number;
  /** The column id the server sorted by, and the direction. Column ids are the sort keys. */
  sort?: string;
  dir?: "asc" | "desc";
  /** Search box label; leave out for a table without search. */
  searchLabel?: string;
  search?: string;
  getRowId: (row: TRow) => string;
  emptyText?: string;
}

export function DataTable<TRow>({
  caption,
  columns,
  rows,
  total,
  hasMore = false,
  nextCursor,
  prevCursor,
  page,
  pageSize,
  sort,
  dir = "asc",
  searchLabel,
  search,
  getRowId,
  emptyText = "Nothing to show.",
}: DataTableProps<TRow>) {
  const router = useRouter();
  const pathname = usePathname();
  const searchParams = useSearchParams();
  const [query, setQuery] = useState(search ?? "");
  const counted = total !== undefined;
  const pageCount = counted ? Math.max(1, Math.ceil(total / pageSize)) : hasMore ? page + 1 : page;

  const navigate = (changes: Record<string, string | undefined>) => {
    const next = new URLSearchParams(searchParams.toString());
    for (const [key, value] of Object.entries(changes)) {
      if (value === undefined || value === "") next.delete(key);
      else next.set(key, value);
    }
    const qs = next.toString();
    router.push(qs ? `${pathname}?${qs}` : pathname, { scroll: false });
  };

  const sorting: SortingState = sort ? [{ id: sort, desc: dir === "desc" }] : [];
  // TanStack Table v8 returns fresh functions each render, so the React Compiler skips this
  // component; that is expected and harmless here (the table is small and server-paged).
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: rows,
    columns,
    getRowId,
    getCoreRowModel: getCoreRowModel(),
    manualPagination: true,
    manualSorting: true,
    manualFiltering: true,
    pageCount,
    state: { sorting, pagination: { pageIndex: page - 1, pageSize } },
    onSortingChange: (updater) => {
      const nextSorting = typeof updater === "function" ? updater(sorting) : updater;
      const first = nextSorting[0];
      navigate({ sort: first?.id, dir: first ? (first.desc ? "desc" : "asc") : undefined, page: undefined, cursor: undefined });
    },
  });

  const byCursor = nextCursor !== undefined || prevCursor !== undefined;
  // Previous to page 1 starts from the top again (no cursor); otherwise the page before by keyset.
  const previous = () =>
    byCursor
      ? navigate(page - 1 <= 1 || !prevCursor ? { cursor: undefined, page: undefined } : { cursor: prevCursor, page: String(page - 1) })
      : navigate({ page: String(page - 1) });
  const next = () => (byCursor ? navigate({ cursor: nextCursor ?? undefined, page: String(page + 1) }) : navigate({ page: String(page + 1) }));

  const shown = counted ? Math.min(total, page * pageSize) - (page - 1) * pageSize : rows.length;
  const from = shown <= 0 ? 0 : (page - 1) * pageSize + 1;
  const to = shown <= 0 ? 0 : (page - 1) * pageSize + shown;

  return (
    <div className="space-y-3">
      {searchLabel ? (
        <form
          role="search"
          className="flex flex-wrap items-end gap-2"
          onSubmit={(event) => {
            event.preventDefault();
            navigate({ q: query.trim(), page: undefined, cursor: undefined });
          }}
        >
          <label className="text-sm font-semibold text-ink-800">
            {searchLabel}
            <input
              type="search"
              value={query}
              onChange={(e) => setQuery(e.target.value)}
              maxLength={200}
              className="mt-1 block w-72 rounded-chip border border-ink-300 bg-white px-3 py-1.5 font-normal"
            />
          </label>
          <button type="submit" className="rounded-chip border border-ink-300 bg-white px-3 py-1.5 text-sm font-semibold hover:border-trajectory-500">
            Search
          </button>
          {search ? (
            <button
              type="button"
              className="px-2 py-1.5 text-sm text-trajectory-700 underline"
              onClick={() => {
                setQuery("");
                navigate({ q: undefined, page: undefined, cursor: undefined });
              }}
            >
              Clear
            </button>
          ) : null}
        </form>
      ) : null}
      <div className="overflow-x-auto rounded-panel border border-ink-200 bg-white">
        <TableView table={table} caption={caption} emptyText={emptyText} rowClassName={() => "hover:bg-ink-50/60"} />
      </div>
      <nav aria-label={`${caption} pages`} className="flex flex-wrap items-center justify-between gap-2 text-sm text-ink-600">
        <p>{counted ? `${from}–${to} of ${total}` : hasMore ? `${from}–${to}, more follow` : `${from}–${to}, the last of them`}</p>
        <div className="flex items-center gap-2">
          <button type="button" disabled={page <= 1} onClick={previous} className="rounded-chip border border-ink-300 bg-white px-3 py-1 disabled:opacity-40">
            Previous
          </button>
          <span>{counted ? `Page ${page} of ${pageCount}` : `Page ${page}`}</span>
          <button
            type="button"
            disabled={byCursor ? !nextCursor : page >= pageCount}
            onClick={next}
            className="rounded-chip border border-ink-300 bg-white px-3 py-1 disabled:opacity-40"
          >
            Next
          </button>
        </div>
      </nav>
    </div>
  );
}
