"use client";
import { useCallback, useEffect, useMemo, useState } from "react";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef } from "@tanstack/react-table";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import type { SampleMethod } from "@/lib/validation/sample";
import { Amount } from "@/components/ui/amount";
import { Button } from "@/components/ui/button";
import { api } from "@/components/ui/api";
import { useKeysetPaging } from "@/components/ui/use-keyset-paging";
import { ResultRow } from "./result-row";
import { AuditedValueCell, CauseCell, CommentCell, DeviationCell, EvidenceCell, MisstatementCell, ReferenceCell, StatusCell } from "./result-cells";
import { ReplaceDialog } from "./replace-dialog";
import { RequestStatusBadge } from "@/components/requests/status-badge";
import { formatCount, ITEM_STATUS_LABELS } from "./labels";

type Col = ColumnDef<SampleItemRecord>;
const right = { align: "right" };

function buildColumns(attribute: boolean, replace: ((item: SampleItemRecord) => void) | null): Col[] {
  const cols: Col[] = [
    { id: "ref", header: "Item", meta: { sticky: true }, cell: () => <ReferenceCell /> },
    { id: "book", header: "Book value", meta: right, cell: ({ row }) => <Amount value={row.original.bookValue} /> },
  ];
  if (attribute) cols.push({ id: "status", header: "Status", cell: () => <StatusCell /> }, { id: "deviation", header: "Deviation", cell: () => <DeviationCell /> });
  else cols.push(
    { id: "audited", header: "Audited value", meta: right, cell: () => <AuditedValueCell /> },
    { id: "misstatement", header: "Misstatement", meta: right, cell: () => <MisstatementCell /> },
    { id: "status", header: "Status", cell: () => <StatusCell /> },
    { id: "cause", header: "Cause", cell: () => <CauseCell /> },
  );
  cols.push(
    { id: "comment", header: "Comment", cell: () => <CommentCell /> },
    { id: "evidence", header: "Evidence", meta: right, cell: () => <EvidenceCell /> },
    { id: "request", header: "Client request", cell: ({ row }) => (row.original.requestStatus ? <RequestStatusBadge status={row.original.requestStatus} /> : <span className="text-xs text-ink-faint">—</span>) },
  );
  if (replace) cols.push({
    id: "replace", header: "", cell: ({ row }) => (row.original.status === "not-started" || row.original.status === "not-auditable")
      ? <Button type="button" variant="ghost" className="px-2 py-1 text-xs" onClick={() => replace(row.original)}>Replace…</Button> : null,
  });
  return cols;
}

interface Props {
  engagementId: number; sampleId: number; method: SampleMethod; drawVersion: number;
  mayRecord: boolean; mayReplace: boolean; refreshKey: number; onSaved: () => void;
}
interface ItemsPage { items: SampleItemRecord[]; total: number; nextCursor?: string | null; prevCursor?: string | null }

/** The selected items, a page at a time from the server (paged by key), with results keyed in on each row. */
export function FieldworkGrid({ engagementId, sampleId, method, drawVersion, mayRecord, mayReplace, refreshKey, onSaved }: Props) {
  const url = `/api/engagements/${engagementId}/samples/${sampleId}/items`;
  const paging = useKeysetPaging(25);
  const { reset: resetPaging, query: pagingQuery } = paging;
  const [status, setStatus] = useState("all");
  const [search, setSearch] = useState("");
  const [query, setQuery] = useState("");
  const [page, setPage] = useState<ItemsPage | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [reloads, setReloads] = useState(0);
  const [replacing, setReplacing] = useState<SampleItemRecord | null>(null);
  const attribute = method === "attribute";
  const columns = useMemo(() => buildColumns(attribute, mayReplace ? setReplacing : null), [attribute, mayReplace]);

  useEffect(() => {
    const t = setTimeout(() => { setQuery(search.trim()); resetPaging(); }, 300);
    return () => clearTimeout(t);
  }, [search, resetPaging]);

  useEffect(() => {
    let live = true;
    const params = new URLSearchParams({ ...pagingQuery, status });
    if (query) params.set("q", query);
    api<ItemsPage>(`${url}?${params}`).then(
      (r) => { if (live) { setPage(r); setError(null); } },
      (e: Error) => { if (live) setError(e.message); },
    );
    return () => { live = false; };
  }, [url, pagingQuery, status, query, reloads, refreshKey, drawVersion]);

  const reload = useCallback(() => setReloads((n) => n + 1), []);
  const saved = useCallback((after: SampleItemRecord) => {
    setPage((p) => p && { ...p, items: p.items.map((it) => (it.id === after.id ? after : it)) });
    onSaved();
  }, [onSaved]);

  const total = page?.total ?? 0;
  const table = useReactTable({
    data: page?.items ?? [], columns, manualPagination: true, rowCount: total,
    getCoreRowModel: getCoreRowModel(), getRowId: (it) => String(it.id),
  });
  const align = (meta: unknown) => {
    const m = meta as { align?: string; sticky?: boolean } | undefined;
    return `${m?.align === "right" ? "text-right" : ""} ${m?.sticky ? "sticky left-0 z-10 bg-inherit" : ""}`;
  };
  const first = total === 0 ? 0 : paging.pageIndex * paging.pageSize + 1;
  const last = Math.min(total, (paging.pageIndex + 1) * paging.pageSize);

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-3">
        <input type="search" value={search} onChange={(e) => setSearch(e.target.value)} placeholder="Search reference or description…" aria-label="Search sample items"
          className="w-full max-w-xs rounded-md border border-ink-line bg-paper-raised px-3 py-1.5 text-sm focus:border-ledger-500 focus:outline-none" />
        <label className="inline-flex items-center gap-2 text-sm text-ink-soft">Show
          <select value={status} onChange={(e) => { setStatus(e.target.value); resetPaging(); }} className="rounded-md border border-ink-line bg-paper-raised px-2 py-1 text-sm">
            <option value="all">All items</option>
            {(["not-started", "done", "not-auditable", "void"] as const).map((s) => <option key={s} value={s}>{ITEM_STATUS_LABELS[s]}</option>)}
          </select>
        </label>
        <p className="figures ml-auto text-sm text-ink-soft" aria-live="polite">{page ? (total === 0 ? "No items" : `${formatCount(first)}–${formatCount(last)} of ${formatCount(total)}`) : "Loading…"}</p>
      </div>
      {!mayRecord && <p className="text-sm text-ink-soft">Results are read-only here: the sample is locked, or your role is viewer (staff and above record results).</p>}
      {error && <p role="alert" className="text-sm text-brick-700">{error}</p>}
      <div className="relative overflow-x-auto rounded-card border border-ink-line bg-paper-raised">
        <table className="w-full text-sm" aria-label="Sample items">
          <thead className="bg-paper-sunk text-left text-xs uppercase tracking-wider text-ink-soft">
            {table.getHeaderGroups().map((g) => (
              <tr key={g.id}>
                {g.headers.map((h) => <th key={h.id} scope="col" className={`px-1.5 py-2.5 font-semibold ${align(h.column.columnDef.meta)}`}>{flexRender(h.column.columnDef.header, h.getContext())}</th>)}
                <th scope="col" className="px-1.5 py-2.5"><span className="sr-only">Save</span></th>
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <ResultRow key={row.id} item={row.original} url={url} editable={mayRecord} attribute={attribute} columnCount={columns.length} onSaved={saved} onReload={reload}>
                {row.getVisibleCells().map((cell) => <td key={cell.id} className={`px-1.5 py-2 ${align(cell.column.columnDef.meta)}`}>{flexRender(cell.column.columnDef.cell, cell.getContext())}</td>)}
              </ResultRow>
            ))}
          </tbody>
        </table>
        {page && page.items.length === 0 && <p className="p-6 text-center text-sm text-ink-soft">{query || status !== "all" ? "No item matches." : "No items in this draw."}</p>}
      </div>
      <div className="flex flex-wrap items-center justify-between gap-3 text-sm">
        <label className="inline-flex items-center gap-2 text-ink-soft">Rows per page
          <select value={paging.pageSize} onChange={(e) => paging.setPageSize(Number(e.target.value))} className="rounded-md border border-ink-line bg-paper-raised px-2 py-1 text-sm">
            {[10, 25, 50, 100].map((n) => <option key={n} value={n}>{n}</option>)}
          </select>
        </label>
        <div className="flex items-center gap-2">
          <Button type="button" variant="secondary" onClick={() => paging.previous(page)} disabled={!paging.canPrevious(page)}>Previous</Button>
          <span className="figures px-2 text-ink-soft">Page {paging.pageIndex + 1} of {paging.pageCount(total)}</span>
          <Button type="button" variant="secondary" onClick={() => paging.next(page)} disabled={!paging.canNext(page)}>Next</Button>
        </div>
      </div>
      {replacing && (
        <ReplaceDialog url={`${url}/${replacing.id}/replace`} item={replacing} onClose={() => setReplacing(null)} onReplaced={() => { setReplacing(null); reload(); onSaved(); }} />
      )}
    </div>
  );
}
