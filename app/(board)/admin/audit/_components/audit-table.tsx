"use client";
import { formatDateTime } from "@/lib/format/dates";
import { createColumnHelper } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table/data-table";

export interface AuditRow {
  id: string;
  occurredAt: Date;
  actorEmail: string | null;
  boardId: string | null;
  action: string;
  target: string | null;
  details: Record<string, unknown>;
  ipAddress: string | null;
}

const column = createColumnHelper<AuditRow>();

const columns = [
  column.accessor("occurredAt", {
    id: "time",
    header: "Time (UTC)",
    cell: (info) => <span className="whitespace-nowrap font-mono text-xs">{formatDateTime(info.getValue())}</span>,
  }),
  column.accessor("action", {
    header: "Event",
    enableSorting: false,
    cell: (info) => (
      <span className={`font-mono text-xs ${/failed|refused|rate-limited/.test(info.getValue()) ? "text-void-700" : "text-ink-800"}`}>{info.getValue()}</span>
    ),
  }),
  column.accessor("actorEmail", { header: "Who", enableSorting: false, cell: (info) => info.getValue() ?? "—" }),
  column.accessor("target", { header: "On", enableSorting: false, cell: (info) => <span className="font-mono text-xs">{info.getValue() ?? "—"}</span> }),
  column.accessor("details", {
    header: "Details",
    enableSorting: false,
    cell: (info) => {
      const entries = Object.entries(info.getValue());
      return entries.length === 0 ? (
        "—"
      ) : (
        <span className="font-mono text-xs text-ink-600">
          {entries.map(([k, v]) => `${k}: ${typeof v === "object" ? JSON.stringify(v) : String(v)}`).join(" · ")}
        </span>
      );
    },
  }),
  column.accessor("ipAddress", { header: "From", enableSorting: false, cell: (info) => <span className="font-mono text-xs">{info.getValue() ?? "—"}</span> }),
];

export function AuditTable(props: { rows: AuditRow[]; hasMore: boolean; page: number; pageSize: number; dir: "asc" | "desc"; search?: string }) {
  return (
    <DataTable
      caption="Audit log"
      columns={columns}
      rows={props.rows}
      hasMore={props.hasMore}
      page={props.page}
      pageSize={props.pageSize}
      sort="time"
      dir={props.dir}
      search={props.search}
      searchLabel="Search by e-mail, event or target"
      getRowId={(row) => row.id}
      emptyText="No event matches."
    />
  );
}
