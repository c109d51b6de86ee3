"use client";
import { formatDateTime } from "@/lib/format/dates";
import { useState, useTransition } from "react";
import { useRouter } from "next/navigation";
import { createColumnHelper } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table/data-table";
import type { OutboxRow } from "@/lib/dal/outbox";
import { outboxStatusText } from "@/lib/mail/status-text";
import { requeueOutboxMessageAction } from "../actions";

const column = createColumnHelper<OutboxRow>();
const statusClass = {
  queued: "bg-ink-100 text-ink-700",
  sending: "bg-trajectory-100 text-trajectory-700",
  sent: "bg-holds-100 text-holds-700",
  failed: "bg-void-100 text-void-700",
} as const;

function SendAgain({ id }: { id: string }) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [error, setError] = useState<string | null>(null);
  return (
    <span>
      <button
        type="button"
        disabled={pending}
        className="rounded-chip border border-trajectory-500 px-2 py-0.5 text-xs font-semibold text-trajectory-700 disabled:opacity-50"
        onClick={() =>
          startTransition(async () => {
            const answer = await requeueOutboxMessageAction({ messageId: id });
            if (answer.ok) router.refresh();
            else setError(answer.error);
          })
        }
      >
        {pending ? "Queuing…" : "Send again"}
      </button>
      {error ? <span className="ml-1 text-xs text-void-700">{error}</span> : null}
    </span>
  );
}

const columns = [
  column.accessor("createdAt", {
    id: "created",
    header: "Queued (UTC)",
    enableSorting: false,
    cell: (i) => <span className="whitespace-nowrap font-mono text-xs">{formatDateTime(i.getValue())}</span>,
  }),
  column.accessor("kind", { header: "Kind", enableSorting: false, cell: (i) => <span className="font-mono text-xs">{i.getValue()}</span> }),
  column.accessor("to", { header: "To", enableSorting: false, cell: (i) => <span className="text-xs">{i.getValue().join(", ")}</span> }),
  column.accessor("subject", {
    header: "Subject",
    enableSorting: false,
    cell: (i) => (
      <span className="text-sm">
        {i.getValue()}
        {i.row.original.attachments ? (
          <span className="ml-1 text-xs text-ink-500">
            ({i.row.original.attachments} attachment{i.row.original.attachments === 1 ? "" : "s"})
          </span>
        ) : null}
      </span>
    ),
  }),
  column.accessor("status", {
    header: "Status",
    enableSorting: false,
    cell: (i) => (
      <span className="block max-w-72">
        <span className={`rounded-chip px-2 py-0.5 text-xs font-semibold ${statusClass[i.getValue()]}`}>{i.getValue()}</span>
        <span className="mt-1 block text-xs text-ink-700">{outboxStatusText({ ...i.row.original, lastError: null })}</span>
      </span>
    ),
  }),
  column.accessor("attempts", { header: "Attempts", enableSorting: false, cell: (i) => <span className="font-mono text-xs">{i.getValue()}</span> }),
  column.accessor("lastError", {
    header: "Last error",
    enableSorting: false,
    cell: (i) => <span className="text-xs text-void-700">{i.getValue() ?? ""}</span>,
  }),
  column.display({
    id: "actions",
    header: () => <span className="sr-only">Actions</span>,
    cell: (i) =>
      i.row.original.status === "failed" ? (
        <SendAgain id={i.row.original.id} />
      ) : i.row.original.sentAt ? (
        <span className="whitespace-nowrap font-mono text-xs text-ink-500">sent {formatDateTime(i.row.original.sentAt)}</span>
      ) : null,
  }),
];

export function OutboxTable(props: { rows: OutboxRow[]; hasMore: boolean; page: number; pageSize: number }) {
  return (
    <DataTable
      caption="Outbox"
      columns={columns}
      rows={props.rows}
      hasMore={props.hasMore}
      page={props.page}
      pageSize={props.pageSize}
      getRowId={(row) => row.id}
      emptyText="No message in this view."
    />
  );
}
