"use client";
// The proposer's list: pages fetched from /api/v1 with TanStack Query; paging, sorting and
// the search live in the URL (the shared DataTable writes them), the server does the work.
import { formatDateTime } from "@/lib/format/dates";
import Link from "next/link";
import { useSearchParams } from "next/navigation";
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { createColumnHelper } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table/data-table";

export interface ProposalListRow {
  id: string;
  title: string;
  missionType: string;
  status: "draft" | "submitted" | "in_review" | "decided" | "withdrawn";
  callId: string;
  callTitle: string;
  latestVersion: number;
  isOwner: boolean;
  createdAt: string;
  updatedAt: string;
}

interface Page {
  rows: ProposalListRow[];
  page: number;
  pageSize: number;
  hasMore: boolean;
  nextCursor: string | null;
  prevCursor: string | null;
}

const STATUS_TEXT: Record<ProposalListRow["status"], string> = {
  draft: "Draft",
  submitted: "Submitted",
  in_review: "In review",
  decided: "Decided",
  withdrawn: "Withdrawn",
};

const column = createColumnHelper<ProposalListRow>();

export function ProposalsTable({ boardId }: { boardId: string }) {
  const searchParams = useSearchParams();
  const params = new URLSearchParams();
  // `cursor` pages by keyset (the index range after or before a row); `page` is only the number shown.
  for (const key of ["page", "pageSize", "sort", "dir", "q", "status", "cursor"]) {
    const v = searchParams.get(key);
    if (v) params.set(key, v);
  }
  const qs = params.toString();
  const query = useQuery({
    queryKey: ["proposals", boardId, qs],
    queryFn: async (): Promise<Page> => {
      const response = await fetch(`/api/v1/boards/${boardId}/proposals${qs ? `?${qs}` : ""}`);
      const body = await response.json().catch(() => ({}));
      if (!response.ok) throw new Error((body as { error?: string }).error ?? `The server answered ${response.status}.`);
      return body as Page;
    },
    placeholderData: keepPreviousData,
  });

  const columns = [
    column.accessor("title", {
      id: "title",
      header: "Title",
      cell: (info) => (
        <Link href={`/boards/${boardId}/proposals/${info.row.original.id}`} className="font-semibold text-trajectory-700 hover:underline">
          {info.getValue()}
        </Link>
      ),
    }),
    column.accessor("callTitle", { id: "callTitle", header: "Call" }),
    column.accessor("missionType", { id: "missionType", header: "Mission type", enableSorting: false }),
    column.accessor("status", { id: "status", header: "Status", cell: (info) => STATUS_TEXT[info.getValue()] }),
    column.accessor("latestVersion", { id: "latestVersion", header: "Version", cell: (info) => (info.getValue() === 0 ? "—" : `v${info.getValue()}`) }),
    column.accessor("updatedAt", { id: "updatedAt", header: "Last change", cell: (info) => formatDateTime(info.getValue()) }),
  ];

  const status = searchParams.get("status") ?? "";
  return (
    <div className="space-y-3">
      <StatusFilter boardId={boardId} value={status} />
      {query.isError ? (
        <div role="alert" className="rounded-panel border border-void-500/40 bg-void-100 p-3 text-sm text-void-700">
          Could not load the proposals: {query.error.message}{" "}
          <button type="button" onClick={() => void query.refetch()} className="underline">
            Try again
          </button>
        </div>
      ) : null}
      {query.isPending ? (
        <p role="status" aria-busy="true" className="rounded-panel border border-ink-200 bg-white p-6 text-center text-ink-500">
          Loading proposals…
        </p>
      ) : query.data ? (
        <div aria-busy={query.isFetching} className={query.isFetching ? "opacity-70" : undefined}>
          <DataTable
            caption="Your proposals"
            columns={columns}
            rows={query.data.rows}
            hasMore={query.data.hasMore}
            nextCursor={query.data.nextCursor}
            prevCursor={query.data.prevCursor}
            page={query.data.page}
            pageSize={query.data.pageSize}
            sort={searchParams.get("sort") ?? "updatedAt"}
            dir={(searchParams.get("dir") as "asc" | "desc" | null) ?? "desc"}
            searchLabel="Search title, mission type or call"
            search={searchParams.get("q") ?? ""}
            getRowId={(row) => row.id}
            emptyText={searchParams.get("q") || status ? "No proposals match." : "No proposals yet. Start one with the form below."}
          />
        </div>
      ) : null}
    </div>
  );
}

function StatusFilter({ boardId, value }: { boardId: string; value: string }) {
  const searchParams = useSearchParams();
  return (
    <form className="flex items-end gap-2 text-sm" action={`/boards/${boardId}/proposals`}>
      {["q", "sort", "dir", "pageSize"].map((k) => (searchParams.get(k) ? <input key={k} type="hidden" name={k} value={searchParams.get(k) ?? ""} /> : null))}
      <label className="font-semibold text-ink-800">
        Status
        <select name="status" defaultValue={value} className="ml-2 rounded-chip border border-ink-300 bg-white px-2 py-1 font-normal">
          <option value="">any</option>
          {Object.entries(STATUS_TEXT).map(([k, v]) => (
            <option key={k} value={k}>
              {v}
            </option>
          ))}
        </select>
      </label>
      <button type="submit" className="rounded-chip border border-ink-300 bg-white px-3 py-1 font-semibold">
        Filter
      </button>
    </form>
  );
}
