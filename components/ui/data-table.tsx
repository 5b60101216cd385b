"use client";
import { useState } from "react";
import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
  type Table,
} from "@tanstack/react-table";
import { THead, Th } from "./table";

interface DataTableProps<T> {
  data: T[];
  columns: ColumnDef<T, unknown>[];
  filterPlaceholder?: string;
  empty: React.ReactNode;
  label: string;
}

/** A client-side table with sortable headers and a text filter over every column. */
export function DataTable<T>({ data, columns, filterPlaceholder = "Filter…", empty, label }: DataTableProps<T>) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const [filter, setFilter] = useState("");
  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter: filter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setFilter,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });
  const rows = table.getRowModel().rows;
  return (
    <div className="space-y-3">
      <input
        type="search"
        value={filter}
        onChange={(e) => setFilter(e.target.value)}
        placeholder={filterPlaceholder}
        aria-label={`Filter ${label}`}
        className="w-full max-w-xs rounded-md border border-ink-line bg-paper-raised px-3 py-1.5 text-sm focus:border-ledger-500 focus:outline-none"
      />
      <div className="overflow-x-auto rounded-card border border-ink-line bg-paper-raised">
        <table className="w-full text-sm" aria-label={label}>
          <SortableHead table={table} />
          <tbody>
            {rows.map((row) => (
              <tr key={row.id} className="border-t border-ink-line/70 hover:bg-paper">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className={`px-4 py-2.5 ${alignOf(cell.column.columnDef.meta)}`}>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
        {rows.length === 0 && (
          <div className="p-6">
            {data.length === 0 ? (
              empty
            ) : (
              <p className="text-center text-sm text-ink-soft">Nothing matches “{filter}”.</p>
            )}
          </div>
        )}
      </div>
    </div>
  );
}

export const alignOf = (meta: unknown) =>
  (meta as { align?: string } | undefined)?.align === "right" ? "text-right" : "";

/** Header rows whose sortable columns toggle on click and announce their order (aria-sort). */
export function SortableHead<T>({ table }: { table: Table<T> }) {
  return (
    <THead className="bg-paper-sunk/60">
      {table.getHeaderGroups().map((group) => (
        <tr key={group.id}>
          {group.headers.map((header) => {
            const sorted = header.column.getIsSorted();
            return (
              <Th
                key={header.id}
                className="px-4 py-2.5"
                numeric={alignOf(header.column.columnDef.meta) === "text-right"}
                sort={
                  header.column.getCanSort()
                    ? { direction: sorted, onToggle: (e) => header.column.getToggleSortingHandler()?.(e) }
                    : undefined
                }
              >
                {flexRender(header.column.columnDef.header, header.getContext())}
              </Th>
            );
          })}
        </tr>
      ))}
    </THead>
  );
}
