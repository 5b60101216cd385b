"use client";
import { useEffect, useMemo, useState } from "react";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef, type SortingState } from "@tanstack/react-table";
import type { PopulationItem } from "@/lib/data/population-items";
import { Amount } from "@/components/ui/amount";
import { Button } from "@/components/ui/button";
import { useApi } from "@/components/ui/use-api";
import { useKeysetPaging } from "@/components/ui/use-keyset-paging";
import { SortableHead, alignOf } from "@/components/ui/data-table";
import { formatCount } from "@/lib/format/number";

/** Column ids the server sorts by (ItemsQuerySchema `sort`). */
const SERVER_SORT: Record<string, "row" | "ref" | "book"> = { rowNumber: "row", itemRef: "ref", bookValue: "book" };

function buildColumns(extraColumns: string[], hasDescription: boolean, hasDate: boolean): ColumnDef<PopulationItem>[] {
  const cols: ColumnDef<PopulationItem>[] = [
    {
      id: "rowNumber",
      accessorKey: "rowNumber",
      header: "Row",
      meta: { align: "right" },
      cell: ({ row }) => <span className="figures text-ink-faint">{row.original.rowNumber}</span>,
    },
    {
      id: "itemRef",
      accessorKey: "itemRef",
      header: "Reference",
      cell: ({ row }) => <span className="font-medium">{row.original.itemRef}</span>,
    },
  ];
  if (hasDescription)
    cols.push({ id: "description", accessorKey: "description", header: "Description", enableSorting: false });
  if (hasDate)
    cols.push({
      id: "itemDate",
      accessorKey: "itemDate",
      header: "Date",
      enableSorting: false,
      cell: ({ row }) => <span className="figures">{row.original.itemDate}</span>,
    });
  for (const name of extraColumns)
    cols.push({
      id: `extra:${name}`,
      header: name,
      enableSorting: false,
      accessorFn: (item) => item.extra?.[name] ?? "",
    });
  cols.push({
    id: "bookValue",
    accessorKey: "bookValue",
    header: "Book value",
    meta: { align: "right" },
    cell: ({ row }) => <Amount value={row.original.bookValue} />,
  });
  return cols;
}

/** Haphazard selection on the grid: a column of pick buttons, with the rows already in the sample marked. */
export interface GridPick {
  status: (rowNumber: number) => "key-item" | "picked" | null;
  onPick: (item: PopulationItem) => void;
  disabled: boolean;
}

function pickColumn(pick: GridPick): ColumnDef<PopulationItem> {
  return {
    id: "pick",
    header: "Pick",
    enableSorting: false,
    cell: ({ row }) => {
      const state = pick.status(row.original.rowNumber);
      if (state === "key-item") return <span className="text-xs text-ink-faint">key item</span>;
      if (state === "picked") return <span className="text-xs font-medium text-ledger-700">picked</span>;
      return (
        <Button
          type="button"
          variant="secondary"
          disabled={pick.disabled}
          onClick={() => pick.onPick(row.original)}
          aria-label={`Pick ${row.original.itemRef}`}
        >
          Pick
        </Button>
      );
    },
  };
}

interface Props {
  url: string;
  extraColumns: string[];
  hasDescription: boolean;
  hasDate: boolean;
  pick?: GridPick;
}
interface Page {
  items: PopulationItem[];
  total: number;
  nextCursor?: string | null;
  prevCursor?: string | null;
}

/** Every item, a page at a time from the server (paged by key), sorted and searched there. */
export function ItemsGrid({ url, extraColumns, hasDescription, hasDate, pick }: Props) {
  const columns = useMemo(
    () => [...buildColumns(extraColumns, hasDescription, hasDate), ...(pick ? [pickColumn(pick)] : [])],
    [extraColumns, hasDescription, hasDate, pick],
  );
  const [sorting, setSorting] = useState<SortingState>([]);
  const paging = useKeysetPaging(25);
  const { reset: resetPaging, query: pagingQuery } = paging;
  const [search, setSearch] = useState("");
  const [query, setQuery] = useState("");

  useEffect(() => {
    const t = setTimeout(() => {
      setQuery(search.trim());
      resetPaging();
    }, 300);
    return () => clearTimeout(t);
  }, [search, resetPaging]);

  const pageUrl = useMemo(() => {
    const sort = sorting[0];
    const params = new URLSearchParams({
      ...pagingQuery,
      sort: sort ? (SERVER_SORT[sort.id] ?? "row") : "row",
      dir: sort?.desc ? "desc" : "asc",
    });
    if (query) params.set("q", query);
    return `${url}?${params}`;
  }, [url, sorting, pagingQuery, query]);
  // The page in hand stays shown (dimmed) while the next one loads; a late answer for a page no longer asked for is never shown.
  const read = useApi<Page>(pageUrl, { keepPreviousData: true });
  const page = read.data ?? null;
  const error = read.error?.message ?? null;
  const busy = read.isValidating;

  const total = page?.total ?? 0;
  const table = useReactTable({
    data: page?.items ?? [],
    columns,
    state: { sorting },
    manualPagination: true,
    manualSorting: true,
    enableMultiSort: false,
    rowCount: total,
    onSortingChange: (u) => {
      setSorting(u);
      resetPaging();
    },
    getCoreRowModel: getCoreRowModel(),
  });
  const first = total === 0 ? 0 : paging.pageIndex * paging.pageSize + 1;
  const last = Math.min(total, (paging.pageIndex + 1) * paging.pageSize);

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <input
          type="search"
          value={search}
          onChange={(e) => setSearch(e.target.value)}
          placeholder="Search reference or description…"
          aria-label="Search items"
          className="w-full max-w-xs rounded-md border border-ink-line bg-paper-raised px-3 py-1.5 text-sm focus:border-ledger-500 focus:outline-none"
        />
        <p className="figures text-sm text-ink-soft" aria-live="polite" data-testid="items-range">
          {busy && !page
            ? "Loading…"
            : total === 0
              ? "No items"
              : `${formatCount(first)}–${formatCount(last)} of ${formatCount(total)}${query ? ` matching “${query}”` : ""}`}
        </p>
      </div>
      {error && (
        <p role="alert" className="text-sm text-brick-700">
          {error}
        </p>
      )}
      <div
        className={`overflow-x-auto rounded-card border border-ink-line bg-paper-raised transition-opacity ${busy ? "opacity-60" : ""}`}
        aria-busy={busy}
      >
        <table className="w-full text-sm" aria-label="Population items">
          <SortableHead table={table} />
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} className="border-t border-ink-line/70 hover:bg-paper">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className={`px-4 py-2 ${alignOf(cell.column.columnDef.meta)}`}>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
        {page && page.items.length === 0 && (
          <p className="p-6 text-center text-sm text-ink-soft">{query ? `No item matches “${query}”.` : "No items."}</p>
        )}
      </div>
      <div className="flex flex-wrap items-center justify-between gap-3 text-sm">
        <label className="inline-flex items-center gap-2 text-ink-soft">
          Rows per page
          <select
            value={paging.pageSize}
            onChange={(e) => paging.setPageSize(Number(e.target.value))}
            className="rounded-md border border-ink-line bg-paper-raised px-2 py-1 text-sm"
          >
            {[25, 50, 100, 200].map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </select>
        </label>
        <div className="flex items-center gap-2">
          <Button type="button" variant="secondary" onClick={paging.first} disabled={!paging.canPrevious(page)}>
            First
          </Button>
          <Button
            type="button"
            variant="secondary"
            onClick={() => paging.previous(page)}
            disabled={!paging.canPrevious(page)}
          >
            Previous
          </Button>
          <span className="figures px-2 text-ink-soft">
            Page {formatCount(paging.pageIndex + 1)} of {formatCount(paging.pageCount(total))}
          </span>
          <Button type="button" variant="secondary" onClick={() => paging.next(page)} disabled={!paging.canNext(page)}>
            Next
          </Button>
          <Button type="button" variant="secondary" onClick={() => paging.last(page)} disabled={!paging.canNext(page)}>
            Last
          </Button>
        </div>
      </div>
    </div>
  );
}
