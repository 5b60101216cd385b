"use client";
import { useEffect, useMemo, useState } from "react";
import {
  flexRender, getCoreRowModel, useReactTable,
  type ColumnDef, type PaginationState, type SortingState,
} from "@tanstack/react-table";
import type { PopulationItem } from "@/lib/data/population-items";
import { Amount } from "@/components/ui/amount";
import { Button } from "@/components/ui/button";
import { apiFetch } from "@/components/ui/api";
import { SortableHead, alignOf } from "@/components/ui/data-table";
import { formatCount } from "@/lib/format/number";

/** Column ids the server sorts by (ItemsQuerySchema `sort`). */
const SERVER_SORT: Record<string, "row" | "ref" | "book"> = { rowNumber: "row", itemRef: "ref", bookValue: "book" };

function buildColumns(extraColumns: string[], hasDescription: boolean, hasDate: boolean): ColumnDef<PopulationItem>[] {
  const cols: ColumnDef<PopulationItem>[] = [
    { id: "rowNumber", accessorKey: "rowNumber", header: "Row", meta: { align: "right" }, cell: ({ row }) => <span className="figures text-ink-faint">{row.original.rowNumber}</span> },
    { id: "itemRef", accessorKey: "itemRef", header: "Reference", cell: ({ row }) => <span className="font-medium">{row.original.itemRef}</span> },
  ];
  if (hasDescription) cols.push({ id: "description", accessorKey: "description", header: "Description", enableSorting: false });
  if (hasDate) cols.push({ id: "itemDate", accessorKey: "itemDate", header: "Date", enableSorting: false, cell: ({ row }) => <span className="figures">{row.original.itemDate}</span> });
  for (const name of extraColumns) cols.push({ id: `extra:${name}`, header: name, enableSorting: false, accessorFn: (item) => item.extra?.[name] ?? "" });
  cols.push({ id: "bookValue", accessorKey: "bookValue", header: "Book value", meta: { align: "right" }, cell: ({ row }) => <Amount value={row.original.bookValue} /> });
  return cols;
}

/** Haphazard selection on the grid: a column of pick buttons, with the rows already in the sample marked. */
export interface GridPick { status: (rowNumber: number) => "key-item" | "picked" | null; onPick: (item: PopulationItem) => void; disabled: boolean }

function pickColumn(pick: GridPick): ColumnDef<PopulationItem> {
  return {
    id: "pick", header: "Pick", enableSorting: false,
    cell: ({ row }) => {
      const state = pick.status(row.original.rowNumber);
      if (state === "key-item") return <span className="text-xs text-ink-faint">key item</span>;
      if (state === "picked") return <span className="text-xs font-medium text-ledger-700">picked</span>;
      return <Button type="button" variant="secondary" disabled={pick.disabled} onClick={() => pick.onPick(row.original)} aria-label={`Pick ${row.original.itemRef}`}>Pick</Button>;
    },
  };
}

interface Props { url: string; extraColumns: string[]; hasDescription: boolean; hasDate: boolean; pick?: GridPick }
interface Page { items: PopulationItem[]; total: number }

/** Every item, a page at a time from the server, sorted and searched there (manual pagination and sorting). */
export function ItemsGrid({ url, extraColumns, hasDescription, hasDate, pick }: Props) {
  const columns = useMemo(() => [...buildColumns(extraColumns, hasDescription, hasDate), ...(pick ? [pickColumn(pick)] : [])], [extraColumns, hasDescription, hasDate, pick]);
  const [sorting, setSorting] = useState<SortingState>([]);
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize: 25 });
  const [search, setSearch] = useState("");
  const [query, setQuery] = useState("");
  const [page, setPage] = useState<Page | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(true);

  useEffect(() => {
    const t = setTimeout(() => { setQuery(search.trim()); setPagination((p) => ({ ...p, pageIndex: 0 })); }, 300);
    return () => clearTimeout(t);
  }, [search]);

  useEffect(() => {
    let live = true;
    const sort = sorting[0];
    const params = new URLSearchParams({
      page: String(pagination.pageIndex + 1), pageSize: String(pagination.pageSize),
      sort: sort ? SERVER_SORT[sort.id] ?? "row" : "row", dir: sort?.desc ? "desc" : "asc",
    });
    if (query) params.set("q", query);
    setBusy(true);
    apiFetch<Page>(`${url}?${params}`).then(
      (r) => { if (live) { setPage(r); setError(null); setBusy(false); } },
      (e: Error) => { if (live) { setError(e.message); setBusy(false); } },
    );
    return () => { live = false; };
  }, [url, sorting, pagination, query]);

  const total = page?.total ?? 0;
  const table = useReactTable({
    data: page?.items ?? [], columns, state: { sorting, pagination },
    manualPagination: true, manualSorting: true, enableMultiSort: false,
    rowCount: total, onSortingChange: (u) => { setSorting(u); setPagination((p) => ({ ...p, pageIndex: 0 })); }, onPaginationChange: setPagination,
    getCoreRowModel: getCoreRowModel(),
  });
  const first = total === 0 ? 0 : pagination.pageIndex * pagination.pageSize + 1;
  const last = Math.min(total, (pagination.pageIndex + 1) * pagination.pageSize);

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <input
          type="search" value={search} onChange={(e) => setSearch(e.target.value)} placeholder="Search reference or description…" aria-label="Search items"
          className="w-full max-w-xs rounded-md border border-ink-line bg-paper-raised px-3 py-1.5 text-sm focus:border-ledger-500 focus:outline-none"
        />
        <p className="figures text-sm text-ink-soft" aria-live="polite" data-testid="items-range">
          {busy && !page ? "Loading…" : total === 0 ? "No items" : `${formatCount(first)}–${formatCount(last)} of ${formatCount(total)}${query ? ` matching “${query}”` : ""}`}
        </p>
      </div>
      {error && <p role="alert" className="text-sm text-brick-700">{error}</p>}
      <div className={`overflow-x-auto rounded-card border border-ink-line bg-paper-raised transition-opacity ${busy ? "opacity-60" : ""}`} aria-busy={busy}>
        <table className="w-full text-sm" aria-label="Population items">
          <SortableHead table={table} />
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} className="border-t border-ink-line/70 hover:bg-paper">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className={`px-4 py-2 ${alignOf(cell.column.columnDef.meta)}`}>{flexRender(cell.column.columnDef.cell, cell.getContext())}</td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
        {page && page.items.length === 0 && <p className="p-6 text-center text-sm text-ink-soft">{query ? `No item matches “${query}”.` : "No items."}</p>}
      </div>
      <div className="flex flex-wrap items-center justify-between gap-3 text-sm">
        <label className="inline-flex items-center gap-2 text-ink-soft">
          Rows per page
          <select value={pagination.pageSize} onChange={(e) => setPagination({ pageIndex: 0, pageSize: Number(e.target.value) })} className="rounded-md border border-ink-line bg-paper-raised px-2 py-1 text-sm">
            {[25, 50, 100, 200].map((n) => <option key={n} value={n}>{n}</option>)}
          </select>
        </label>
        <div className="flex items-center gap-2">
          <Button type="button" variant="secondary" onClick={() => table.firstPage()} disabled={!table.getCanPreviousPage()}>First</Button>
          <Button type="button" variant="secondary" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>Previous</Button>
          <span className="figures px-2 text-ink-soft">Page {formatCount(pagination.pageIndex + 1)} of {formatCount(Math.max(1, table.getPageCount()))}</span>
          <Button type="button" variant="secondary" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>Next</Button>
          <Button type="button" variant="secondary" onClick={() => table.lastPage()} disabled={!table.getCanNextPage()}>Last</Button>
        </div>
      </div>
    </div>
  );
}
