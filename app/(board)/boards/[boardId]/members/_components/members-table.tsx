"use client";
import { formatDate } from "@/lib/format/dates";
import { useState, useTransition } from "react";
import { useRouter } from "next/navigation";
import { createColumnHelper } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table/data-table";
import { FormNotice } from "@/components/ui/form-controls";
import type { MemberRow } from "@/lib/dal/members";
import { updateMemberAction } from "../actions";

const column = createColumnHelper<MemberRow>();

export function MembersTable(props: {
  boardId: string;
  myUserId: string;
  rows: MemberRow[];
  hasMore: boolean;
  page: number;
  pageSize: number;
  sort: string;
  dir: "asc" | "desc";
  search?: string;
}) {
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const [pending, startTransition] = useTransition();

  const change = (member: MemberRow, update: { role?: MemberRow["role"]; status?: MemberRow["status"] }) =>
    startTransition(async () => {
      const result = await updateMemberAction({ boardId: props.boardId, memberId: member.id, ...update });
      if (result.ok) {
        setMessage({
          tone: "success",
          text: `${member.name}: ${update.role ? `now ${update.role}` : update.status === "deactivated" ? "deactivated" : "reactivated"}.`,
        });
        router.refresh();
      } else setMessage({ tone: "error", text: result.error });
    });

  const columns = [
    column.accessor("name", {
      id: "name",
      header: "Name",
      cell: (info) => (
        <span>
          <span className="font-semibold text-ink-900">{info.getValue()}</span>
          {info.row.original.organisation ? <span className="block text-xs text-ink-500">{info.row.original.organisation}</span> : null}
        </span>
      ),
    }),
    column.accessor("email", { id: "email", header: "E-mail" }),
    column.accessor("role", {
      id: "role",
      header: "Role",
      cell: (info) => {
        const member = info.row.original;
        const self = member.userId === props.myUserId;
        return (
          <label className="text-sm">
            <span className="sr-only">Role of {member.name}</span>
            <select
              value={info.getValue()}
              disabled={pending || self}
              title={self ? "You cannot change your own role." : undefined}
              onChange={(e) => change(member, { role: e.target.value as MemberRow["role"] })}
              className="rounded-chip border border-ink-300 bg-white px-2 py-1"
            >
              <option value="proposer">Proposer</option>
              <option value="reviewer">Reviewer</option>
              <option value="chair">Chair</option>
            </select>
          </label>
        );
      },
    }),
    column.accessor("status", {
      id: "status",
      header: "Status",
      cell: (info) => {
        const member = info.row.original;
        const active = info.getValue() === "active";
        return (
          <span className={`rounded-chip px-2 py-0.5 text-xs font-semibold ${active ? "bg-holds-100 text-holds-700" : "bg-ink-100 text-ink-600"}`}>
            {active ? "Active" : "Deactivated"}
            {member.accountStatus === "deactivated" ? " · account closed" : member.accountStatus === "unverified" ? " · address not confirmed yet" : ""}
          </span>
        );
      },
    }),
    column.accessor("joinedAt", { id: "joined", header: "Member since", cell: (info) => formatDate(info.getValue()) }),
    column.display({
      id: "actions",
      header: () => <span className="sr-only">Actions</span>,
      enableSorting: false,
      cell: (info) => {
        const member = info.row.original;
        if (member.userId === props.myUserId) return <span className="text-xs text-ink-500">You</span>;
        const active = member.status === "active";
        return (
          <button
            type="button"
            disabled={pending}
            onClick={() => change(member, { status: active ? "deactivated" : "active" })}
            className={`rounded-chip border px-2 py-1 text-sm font-semibold ${active ? "border-void-500/50 text-void-700 hover:bg-void-100" : "border-ink-300 text-ink-800 hover:border-trajectory-500"}`}
          >
            {active ? "Deactivate" : "Reactivate"}
            <span className="sr-only"> {member.name}</span>
          </button>
        );
      },
    }),
  ];

  return (
    <div className="space-y-3">
      {message ? <FormNotice tone={message.tone}>{message.text}</FormNotice> : null}
      <DataTable
        caption="Board members"
        columns={columns}
        rows={props.rows}
        hasMore={props.hasMore}
        page={props.page}
        pageSize={props.pageSize}
        sort={props.sort}
        dir={props.dir}
        search={props.search}
        searchLabel="Search members by name, e-mail or organisation"
        getRowId={(row) => row.id}
        emptyText="No member matches."
      />
    </div>
  );
}
