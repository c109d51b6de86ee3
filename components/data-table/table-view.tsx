"use client";
// Renders a TanStack Table instance in VisViva's table look: a caption for screen readers,
// sortable headers (buttons with aria-sort), an empty row, and optional row attributes.
// The generic server-paged DataTable and the review screens' client-side tables share it.
import { flexRender, type Row, type Table } from "@tanstack/react-table";

export interface TableViewProps<T> {
  table: Table<T>;
  caption: string;
  emptyText?: string;
  /** Extra classes for a row (e.g. a selected highlight). */
  rowClassName?: (row: Row<T>) => string;
  /** data-* attributes for a row, e.g. { "data-proposal": row.id } for tests and anchors. */
  rowData?: (row: Row<T>) => Record<string, string>;
  dense?: boolean;
}

export function TableView<T>({ table, caption, emptyText = "Nothing to show.", rowClassName, rowData, dense = false }: TableViewProps<T>) {
  const cellPadding = dense ? "px-2 py-1.5" : "px-3 py-2";
  const rows = table.getRowModel().rows;
  const columnCount = table.getVisibleLeafColumns().length;
  return (
    <table className="w-full border-collapse text-left text-sm">
      <caption className="sr-only">{caption}</caption>
      <thead className="bg-ink-50 text-ink-700">
        {table.getHeaderGroups().map((group) => (
          <tr key={group.id}>
            {group.headers.map((header) => {
              const sorted = header.column.getIsSorted();
              const label = header.isPlaceholder ? null : flexRender(header.column.columnDef.header, header.getContext());
              return (
                <th
                  key={header.id}
                  scope="col"
                  aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined}
                  className={`border-b border-ink-200 font-semibold ${cellPadding}`}
                >
                  {header.column.getCanSort() ? (
                    <button
                      type="button"
                      onClick={header.column.getToggleSortingHandler()}
                      className="inline-flex items-center gap-1 text-left hover:text-trajectory-700"
                    >
                      {label}
                      <span aria-hidden className="font-mono text-xs text-ink-400">
                        {sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}
                      </span>
                    </button>
                  ) : (
                    label
                  )}
                </th>
              );
            })}
          </tr>
        ))}
      </thead>
      <tbody>
        {rows.length === 0 ? (
          <tr>
            <td colSpan={columnCount} className="px-3 py-6 text-center text-ink-500">
              {emptyText}
            </td>
          </tr>
        ) : (
          rows.map((row) => (
            <tr key={row.id} {...(rowData?.(row) ?? {})} className={`border-b border-ink-100 align-top last:border-b-0 ${rowClassName?.(row) ?? ""}`}>
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className={cellPadding}>
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))
        )}
      </tbody>
    </table>
  );
}
