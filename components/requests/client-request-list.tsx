"use client";
import { useState } from "react";
import type { ClientListView } from "@/lib/requests/views";
import { Alert } from "@/components/ui/alert";
import { Amount } from "@/components/ui/amount";
import { Button } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/page-header";
import { apiFetch, withFileName } from "@/components/ui/api";
import { useApi } from "@/components/ui/use-api";
import { RequestStatusBadge } from "./status-badge";
import { FILE_STATUS_LABELS, needsText } from "./labels";
import { formatBytes } from "@/lib/format/number";
import { formatDate } from "@/lib/format/date";
import { Textarea } from "@/components/ui/field";

type Item = ClientListView["items"][number];

async function uploadOne(url: string, file: File) {
  try {
    await apiFetch(withFileName(url, file), { body: file });
    return null;
  } catch (err) {
    return `${file.name}: ${(err as Error).message}`;
  }
}

/** The client's view of one request list: each item, what is needed, its status, its files, an upload and a note. */
export function ClientRequestList({ initial }: { initial: ClientListView }) {
  const base = `/api/requests/${initial.list.id}`;
  const read = useApi<ClientListView>(base, { initial });
  const view = read.data ?? initial;
  const { list } = view;
  const { reload } = read;
  const open = list.status === "open";
  const waiting = view.items.filter((i) => i.status === "requested" || i.status === "needs-more").length;
  return (
    <>
      <PageHeader eyebrow={`${list.engagement.clientName} — ${list.engagement.name}`} title={list.title}>
        Sent by {list.sentBy} · due <strong>{formatDate(list.dueDate)}</strong> · {waiting} of {view.items.length} item
        {view.items.length === 1 ? "" : "s"} still to send
      </PageHeader>
      {!open && (
        <div className="mb-4">
          <Alert tone="info">
            This request list is closed{list.closedReason ? ` — ${list.closedReason}` : ""}. Files can no longer be sent
            on it; contact the audit team if you have more.
          </Alert>
        </div>
      )}
      {list.message && (
        <blockquote className="mb-6 rounded-md border-l-4 border-ledger-500 bg-ledger-50 px-4 py-3 text-sm text-ink">
          <span className="mb-1 block text-xs font-semibold uppercase tracking-wider text-ink-soft">
            Message from {list.sentBy}
          </span>
          {list.message}
        </blockquote>
      )}
      <ol className="space-y-4" aria-label="Requested items">
        {view.items.map((item) => (
          <ClientItem
            key={item.id}
            item={item}
            base={base}
            open={open}
            showBookValue={list.showBookValues}
            currency={list.engagement.currency}
            onChanged={reload}
          />
        ))}
      </ol>
    </>
  );
}

function ClientItem({
  item,
  base,
  open,
  showBookValue,
  currency,
  onChanged,
}: {
  item: Item;
  base: string;
  open: boolean;
  showBookValue: boolean;
  currency: string;
  onChanged: () => Promise<unknown>;
}) {
  const [files, setFiles] = useState<File[]>([]);
  const [inputKey, setInputKey] = useState(0);
  const [busy, setBusy] = useState<string | null>(null);
  const [problems, setProblems] = useState<string[]>([]);
  const [done, setDone] = useState<string | null>(null);
  const [note, setNote] = useState(item.clientNote ?? "");
  const writable = open && item.status !== "accepted";
  const url = `${base}/items/${item.id}`;

  async function upload() {
    setProblems([]);
    setDone(null);
    const failures: string[] = [];
    for (const [i, f] of files.entries()) {
      setBusy(`Uploading ${i + 1} of ${files.length}…`);
      const problem = await uploadOne(`${url}/files`, f);
      if (problem) failures.push(problem);
    }
    setBusy(null);
    setFiles([]);
    setInputKey((k) => k + 1);
    setProblems(failures);
    const sent = files.length - failures.length;
    if (sent) setDone(`${sent} file${sent === 1 ? "" : "s"} sent to the audit team.`);
    await onChanged();
  }

  async function saveNote() {
    setProblems([]);
    setDone(null);
    try {
      await apiFetch(url, { method: "PATCH", body: { note } });
      setDone("Note saved.");
      await onChanged();
    } catch (err) {
      setProblems([(err as Error).message]);
    }
  }

  return (
    <li
      className="rounded-card border border-ink-line bg-paper-raised p-5 shadow-card"
      aria-labelledby={`item-${item.id}`}
    >
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 id={`item-${item.id}`} className="text-base font-semibold">
            <span className="figures">{item.itemRef}</span>
            {item.description ? <span className="font-normal text-ink-soft"> — {item.description}</span> : null}
          </h2>
          {showBookValue && item.bookValue !== undefined && (
            <p className="text-sm text-ink-soft">
              Amount in the ledger: <Amount value={item.bookValue} currency={currency} />
            </p>
          )}
        </div>
        <RequestStatusBadge status={item.status} />
      </div>
      <p className="mt-2 text-sm">
        <span className="font-medium">Needed:</span> {needsText(item.needs) || "see the note"}
        {item.needsNote ? <span className="block text-ink-soft">{item.needsNote}</span> : null}
      </p>
      {item.status === "needs-more" && item.returnReason && (
        <div className="mt-3">
          <Alert tone="error">More is needed: {item.returnReason}</Alert>
        </div>
      )}
      {item.files.length > 0 && (
        <ul
          className="mt-3 divide-y divide-ink-line rounded-md border border-ink-line text-sm"
          aria-label={`Files sent for ${item.itemRef}`}
        >
          {item.files.map((f) => (
            <li key={f.id} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2">
              <a href={`${base}/files/${f.id}`} className="text-ledger-700 link">
                {f.fileName}
              </a>
              <span className="text-xs text-ink-faint">
                {formatBytes(f.sizeBytes)} · {FILE_STATUS_LABELS[f.status]}
                {f.status === "returned" && f.returnReason ? ` — ${f.returnReason}` : ""}
              </span>
            </li>
          ))}
        </ul>
      )}
      {writable && (
        <div className="mt-4 grid gap-4 md:grid-cols-2">
          <div className="space-y-2">
            <label className="block text-sm font-medium" htmlFor={`files-${item.id}`}>
              Files for {item.itemRef}
            </label>
            <input
              key={inputKey}
              id={`files-${item.id}`}
              type="file"
              multiple
              onChange={(e) => setFiles([...(e.target.files ?? [])])}
              className="block w-full text-sm file:mr-3 file:rounded-md file:border file:border-ink-line file:bg-paper file:px-3 file:py-1.5 file:text-sm"
            />
            <Button type="button" disabled={files.length === 0 || busy !== null} onClick={upload}>
              {busy ?? (files.length > 1 ? `Upload ${files.length} files` : "Upload")}
            </Button>
          </div>
          <div className="space-y-2">
            <label className="block text-sm font-medium" htmlFor={`note-${item.id}`}>
              Note for {item.itemRef}
            </label>
            <Textarea
              id={`note-${item.id}`}
              value={note}
              onChange={(e) => setNote(e.target.value)}
              rows={3}
              maxLength={2000}
              placeholder="e.g. the invoice was re-issued under another number"
            />
            <Button type="button" variant="secondary" onClick={saveNote} disabled={note === (item.clientNote ?? "")}>
              Save note
            </Button>
          </div>
        </div>
      )}
      {!writable && item.clientNote && <p className="mt-3 text-sm text-ink-soft">Your note: {item.clientNote}</p>}
      <div aria-live="polite" className="mt-2 space-y-1 text-sm">
        {done && <p className="text-ledger-700">{done}</p>}
        {problems.map((p) => (
          <p key={p} className="text-brick-700">
            {p}
          </p>
        ))}
      </div>
    </li>
  );
}
