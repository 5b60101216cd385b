"use client";
import { useCallback, useEffect, useMemo, useState } from "react";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef } from "@tanstack/react-table";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import type { SampleMethod } from "@/lib/validation/sample";
import { Amount } from "@/components/ui/amount";
import { Button } from "@/components/ui/button";
import { useApi } from "@/components/ui/use-api";
import { useKeysetPaging } from "@/components/ui/use-keyset-paging";
import { Alert } from "@/components/ui/alert";
import { ResultRow } from "./result-row";
import {
  AuditedValueCell,
  CauseCell,
  CommentCell,
  DeviationCell,
  EvidenceCell,
  MisstatementCell,
  ReferenceCell,
  StatusCell,
} from "./result-cells";
import { ReplaceDialog } from "./replace-dialog";
import { ITEM_STATUS_LABELS } from "./labels";
import { onGridKeyDown } from "./grid-keys";
import { RowActions } from "./row-actions";
import { RowEvidence } from "./row-evidence";
import { postFile } from "./evidence-upload";
import { UndoBar } from "./undo-bar";
import { useGridSaves } from "./use-grid-saves";
import type { ItemNoteMark } from "@/components/review/note-labels";
import { countOf, formatCount } from "@/lib/format/number";

type Col = ColumnDef<SampleItemRecord>;
const right = { align: "right" };

interface ColumnOptions {
  attribute: boolean;
  selectable: boolean;
  selected: Set<number>;
  toggle: (id: number) => void;
  openEvidence: Set<number>;
  toggleEvidence: (id: number) => void;
  notesByItem: Record<number, ItemNoteMark[]>;
}

function buildColumns({
  attribute,
  selectable,
  selected,
  toggle,
  openEvidence,
  toggleEvidence,
  notesByItem,
}: ColumnOptions): Col[] {
  const cols: Col[] = [];
  if (selectable)
    cols.push({
      id: "select",
      header: "",
      meta: { sticky: true },
      cell: ({ row }) =>
        row.original.status === "void" ? null : (
          <input
            type="checkbox"
            tabIndex={-1}
            data-row-action
            aria-label={`Select ${row.original.itemRef}`}
            checked={selected.has(row.original.id)}
            onChange={() => toggle(row.original.id)}
            className="h-4 w-4 accent-ledger-600"
          />
        ),
    });
  cols.push(
    { id: "ref", header: "Item", cell: ({ row }) => <ReferenceCell notes={notesByItem[row.original.id]} /> },
    { id: "book", header: "Book value", meta: right, cell: ({ row }) => <Amount value={row.original.bookValue} /> },
  );
  if (attribute)
    cols.push(
      { id: "status", header: "Status", cell: () => <StatusCell /> },
      { id: "deviation", header: "Deviation", cell: () => <DeviationCell /> },
    );
  else
    cols.push(
      { id: "audited", header: "Audited value", meta: right, cell: () => <AuditedValueCell /> },
      { id: "misstatement", header: "Misstatement", meta: right, cell: () => <MisstatementCell /> },
      { id: "status", header: "Status", cell: () => <StatusCell /> },
      { id: "cause", header: "Cause", cell: () => <CauseCell /> },
    );
  cols.push(
    { id: "comment", header: "Comment", meta: { grow: true }, cell: () => <CommentCell /> },
    {
      id: "evidence",
      header: "Evidence",
      meta: right,
      cell: ({ row }) => (
        <EvidenceCell open={openEvidence.has(row.original.id)} onToggle={() => toggleEvidence(row.original.id)} />
      ),
    },
  );
  return cols;
}

interface Props {
  engagementId: number;
  sampleId: number;
  method: SampleMethod;
  drawVersion: number;
  mayRecord: boolean;
  mayReplace: boolean;
  refreshKey: number;
  onSaved: () => void;
  notesByItem: Record<number, ItemNoteMark[]>;
}
interface ItemsPage {
  items: SampleItemRecord[];
  total: number;
  nextCursor?: string | null;
  prevCursor?: string | null;
}

/**
 * The selected items, a page at a time from the server, with results keyed in on each row as in a
 * spreadsheet (grid-keys.ts), a pasted column, "agreed to book" on selected rows, the undo of the
 * last save, and evidence attached from the row (Attach… or a file dropped on it).
 */
export function FieldworkGrid({
  engagementId,
  sampleId,
  method,
  drawVersion,
  mayRecord,
  mayReplace,
  refreshKey,
  onSaved,
  notesByItem,
}: Props) {
  const url = `/api/engagements/${engagementId}/samples/${sampleId}/items`;
  const paging = useKeysetPaging(25);
  const { reset: resetPaging, query: pagingQuery } = paging;
  const [status, setStatus] = useState("all");
  const [search, setSearch] = useState("");
  const [query, setQuery] = useState("");
  const [reloads, setReloads] = useState(0);
  const [replacing, setReplacing] = useState<SampleItemRecord | null>(null);
  const [selected, setSelected] = useState<Set<number>>(new Set());
  const [openEvidence, setOpenEvidence] = useState<Set<number>>(new Set());
  const attribute = method === "attribute";
  const flip = (set: Set<number>, id: number) => {
    const next = new Set(set);
    if (!next.delete(id)) next.add(id);
    return next;
  };
  const toggle = useCallback((id: number) => setSelected((s) => flip(s, id)), []);
  const toggleEvidence = useCallback((id: number) => setOpenEvidence((s) => flip(s, id)), []);
  const columns = useMemo(
    () =>
      buildColumns({ attribute, selectable: mayRecord, selected, toggle, openEvidence, toggleEvidence, notesByItem }),
    [attribute, mayRecord, selected, toggle, openEvidence, toggleEvidence, notesByItem],
  );

  useEffect(() => {
    const t = setTimeout(() => {
      setQuery(search.trim());
      resetPaging();
    }, 300);
    return () => clearTimeout(t);
  }, [search, resetPaging]);

  const params = new URLSearchParams({ ...pagingQuery, status });
  if (query) params.set("q", query);
  // Each counter only grows, so their sum changes whenever any of them does: a save elsewhere, an import, a new draw.
  const read = useApi<ItemsPage>(`${url}?${params}`, {
    revision: reloads + refreshKey + drawVersion,
    keepPreviousData: true,
  });
  const page = read.data ?? null;
  const error = read.error?.message ?? null;
  const { mutate } = read;

  const reload = useCallback(() => setReloads((n) => n + 1), []);
  const apply = useCallback(
    (after: SampleItemRecord[]) => {
      const byId = new Map(after.map((a) => [a.id, a]));
      void mutate((p) => p && { ...p, items: p.items.map((it) => byId.get(it.id) ?? it) }, { revalidate: false });
      onSaved();
    },
    [mutate, onSaved],
  );
  const saves = useGridSaves({
    resultsUrl: `/api/engagements/${engagementId}/samples/${sampleId}/results`,
    attribute,
    apply,
  });
  const { savedOne, setNotice } = saves;
  const saved = useCallback(
    (after: SampleItemRecord, before: SampleItemRecord) => {
      apply([after]);
      savedOne(after, before);
    },
    [apply, savedOne],
  );

  const attach = useCallback(
    async (item: SampleItemRecord, files: File[]) => {
      setNotice(null);
      const done: string[] = [];
      try {
        for (const f of files) {
          await postFile(`${url}/${item.id}/evidence`, f);
          done.push(f.name);
        }
        setNotice({
          tone: "success",
          text: `Attached ${done.length === 1 ? done[0] : countOf(done.length, "file")} to ${item.itemRef}.`,
        });
      } catch (e) {
        const failed = files[done.length]?.name ?? "the file";
        setNotice({
          tone: "error",
          text: `${failed} was not attached to ${item.itemRef}: ${(e as Error).message}${done.length ? ` (attached before it: ${done.join(", ")})` : ""}`,
        });
      }
      if (done.length) {
        setOpenEvidence((s) => new Set(s).add(item.id));
        reload();
        onSaved();
      }
    },
    [url, reload, onSaved, setNotice],
  );

  const onPaste = (e: React.ClipboardEvent<HTMLTableElement>) => {
    const el = e.target as HTMLElement;
    const rowId = Number(el.closest<HTMLElement>("tr[data-item-id]")?.dataset.itemId);
    const start = page?.items.find((i) => i.id === rowId);
    if (!mayRecord || el.dataset.cell !== "audited" || !start || !page) return;
    if (saves.pasteColumn(e.clipboardData.getData("text/plain"), start, page.items)) e.preventDefault();
  };

  const total = page?.total ?? 0;
  const table = useReactTable({
    data: page?.items ?? [],
    columns,
    manualPagination: true,
    rowCount: total,
    getCoreRowModel: getCoreRowModel(),
    getRowId: (it) => String(it.id),
  });
  const align = (meta: unknown) => {
    const m = meta as { align?: string; sticky?: boolean; grow?: boolean } | undefined;
    return `${m?.align === "right" ? "text-right" : ""} ${m?.sticky ? "sticky left-0 z-10 bg-inherit" : ""} ${m?.grow ? "w-full" : ""}`;
  };
  const first = total === 0 ? 0 : paging.pageIndex * paging.pageSize + 1;
  const last = Math.min(total, (paging.pageIndex + 1) * paging.pageSize);
  const onPage = (page?.items ?? []).filter((i) => i.status !== "void");
  const chosen = onPage.filter((i) => selected.has(i.id));
  const allChosen = onPage.length > 0 && chosen.length === onPage.length;

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-3">
        <input
          type="search"
          value={search}
          onChange={(e) => setSearch(e.target.value)}
          placeholder="Search reference or description…"
          aria-label="Search sample items"
          className="w-full max-w-xs rounded-md border border-ink-line bg-paper-raised px-3 py-1.5 text-sm focus:border-ledger-500 focus:outline-none"
        />
        <label className="inline-flex items-center gap-2 text-sm text-ink-soft">
          Show
          <select
            value={status}
            onChange={(e) => {
              setStatus(e.target.value);
              resetPaging();
            }}
            className="rounded-md border border-ink-line bg-paper-raised px-2 py-1 text-sm"
          >
            <option value="all">All items</option>
            {(["not-started", "done", "not-auditable", "void"] as const).map((s) => (
              <option key={s} value={s}>
                {ITEM_STATUS_LABELS[s]}
              </option>
            ))}
          </select>
        </label>
        {mayRecord && (
          <div className="flex items-center gap-2 text-sm" aria-label="Selected rows" role="group">
            <label className="inline-flex items-center gap-1.5 text-ink-soft">
              <input
                type="checkbox"
                className="h-4 w-4 accent-ledger-600"
                checked={allChosen}
                onChange={() => setSelected(allChosen ? new Set() : new Set(onPage.map((i) => i.id)))}
              />
              Select all on this page
            </label>
            <Button
              type="button"
              variant="secondary"
              className="px-2.5 py-1 text-xs"
              disabled={chosen.length === 0}
              title={chosen.length === 0 ? "Tick the rows first" : undefined}
              onClick={() => {
                void saves.agreeToBook(chosen).then(() => setSelected(new Set()));
              }}
            >
              {attribute ? "No deviation" : "Agreed to book"}
              {chosen.length > 0 ? ` (${formatCount(chosen.length)})` : ""}
            </Button>
          </div>
        )}
        <p className="figures ml-auto text-sm text-ink-soft" aria-live="polite">
          {page
            ? total === 0
              ? "No items"
              : `${formatCount(first)}–${formatCount(last)} of ${formatCount(total)}`
            : "Loading…"}
        </p>
      </div>
      {mayRecord ? (
        <p className="text-xs text-ink-soft">
          Enter saves the row and moves down · Tab moves across the fields · ← → at a field&apos;s edge reach the
          row&apos;s buttons ·{" "}
          {attribute ? "" : "paste a column of audited values into a row to fill it and the rows below · "}drop a file
          on a row to attach it as evidence.
        </p>
      ) : (
        <p className="text-sm text-ink-soft">
          Results are read-only here: the sample is locked, or your role is viewer (staff and above record results).
        </p>
      )}
      {error && (
        <p role="alert" className="text-sm text-brick-700">
          {error}
        </p>
      )}
      {saves.notice && <Alert tone={saves.notice.tone}>{saves.notice.text}</Alert>}
      <UndoBar key={saves.undo?.id ?? 0} offer={saves.undo} onDone={saves.clearUndo} />
      <div className="relative overflow-x-auto rounded-card border border-ink-line bg-paper-raised">
        <table className="w-full text-sm" aria-label="Sample items" onKeyDown={onGridKeyDown} onPaste={onPaste}>
          <thead className="bg-paper-sunk text-left text-xs uppercase tracking-wider text-ink-soft">
            {table.getHeaderGroups().map((g) => (
              <tr key={g.id}>
                {g.headers.map((h) => (
                  <th
                    key={h.id}
                    scope="col"
                    className={`whitespace-nowrap px-1.5 py-2.5 font-semibold ${align(h.column.columnDef.meta)}`}
                  >
                    {flexRender(h.column.columnDef.header, h.getContext())}
                  </th>
                ))}
                <th scope="col" className="sticky right-0 z-10 bg-paper-sunk px-1.5 py-2.5 text-right font-semibold">
                  Actions
                </th>
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => {
              const it = row.original;
              const mayAttach = mayRecord && it.status !== "void";
              return (
                <ResultRow
                  key={row.id}
                  item={it}
                  url={url}
                  editable={mayRecord}
                  attribute={attribute}
                  columnCount={columns.length}
                  onSaved={saved}
                  onReload={reload}
                  actions={
                    <RowActions
                      item={it}
                      onReplace={mayReplace ? () => setReplacing(it) : null}
                      onAttach={mayAttach ? (files) => void attach(it, files) : null}
                    />
                  }
                  onDropFiles={mayAttach ? (files) => void attach(it, files) : undefined}
                  detail={
                    openEvidence.has(it.id) ? (
                      <RowEvidence
                        itemUrl={`${url}/${it.id}`}
                        itemRef={it.itemRef}
                        columnCount={columns.length}
                        mayWrite={mayAttach}
                        version={it.evidenceCount}
                        onRemoved={() => {
                          reload();
                          onSaved();
                        }}
                      />
                    ) : null
                  }
                >
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className={`px-1.5 py-2 ${align(cell.column.columnDef.meta)}`}>
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </ResultRow>
              );
            })}
          </tbody>
        </table>
        {page && page.items.length === 0 && (
          <p className="p-6 text-center text-sm text-ink-soft">
            {query || status !== "all" ? "No item matches." : "No items in this draw."}
          </p>
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
            {[10, 25, 50, 100].map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </select>
        </label>
        <div className="flex items-center gap-2">
          <Button
            type="button"
            variant="secondary"
            onClick={() => paging.previous(page)}
            disabled={!paging.canPrevious(page)}
          >
            Previous
          </Button>
          <span className="figures px-2 text-ink-soft">
            Page {paging.pageIndex + 1} of {paging.pageCount(total)}
          </span>
          <Button type="button" variant="secondary" onClick={() => paging.next(page)} disabled={!paging.canNext(page)}>
            Next
          </Button>
        </div>
      </div>
      {replacing && (
        <ReplaceDialog
          url={`${url}/${replacing.id}/replace`}
          item={replacing}
          onClose={() => setReplacing(null)}
          onReplaced={() => {
            setReplacing(null);
            reload();
            onSaved();
          }}
        />
      )}
    </div>
  );
}
