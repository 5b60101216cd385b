"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import type { TeamListView } from "@/lib/requests/views";
import type { RequestFileView } from "@/lib/data/request-items";
import { apiFetch } from "@/components/ui/api";
import { useApi } from "@/components/ui/use-api";
import { Alert } from "@/components/ui/alert";
import { Amount } from "@/components/ui/amount";
import { Button } from "@/components/ui/button";
import { RequestStatusBadge } from "./status-badge";
import { FILE_STATUS_LABELS, needsText } from "./labels";
import { formatBytes } from "@/lib/format/number";
import { Textarea } from "@/components/ui/field";
import { Table, THead, Th, Td } from "@/components/ui/table";

interface Props {
  engagementId: number;
  sampleId: number;
  initial: TeamListView;
  mayDecide: boolean;
  currency: string;
}

/** The audit team's view of a request list: each item's status and the client's files, to accept or send back. */
export function TeamRequestList({ engagementId, sampleId, initial, mayDecide, currency }: Props) {
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const base = `/api/engagements/${engagementId}/samples/${sampleId}/requests/${initial.list.id}`;
  const list = useApi<TeamListView>(base, { initial });
  const view = list.data ?? initial;
  const reload = async () => {
    await list.reload();
    router.refresh();
  };

  async function decide(file: RequestFileView, action: "accept" | "return", reason?: string) {
    setMessage(null);
    try {
      await apiFetch(`${base}/files/${file.id}/${action}`, { body: action === "return" ? { reason } : {} });
      setMessage({
        tone: "success",
        text:
          action === "accept"
            ? `${file.fileName} accepted: it is now evidence on the item.`
            : `${file.fileName} sent back; the client has been e-mailed the reason.`,
      });
      await reload();
      return true;
    } catch (err) {
      setMessage({ tone: "error", text: (err as Error).message });
      return false;
    }
  }

  return (
    <div className="space-y-4">
      {view.list.status === "closed" && (
        <Alert tone="info">
          This list is closed{view.list.closedReason ? ` — ${view.list.closedReason}` : ""}. The client can no longer
          send files on it.
        </Alert>
      )}
      {message && <Alert tone={message.tone}>{message.text}</Alert>}
      <div className="overflow-x-auto rounded-card border border-ink-line bg-paper-raised">
        <Table label="Requested items" density="boxed">
          <THead className="bg-paper-sunk">
            <tr>
              <Th>Item</Th>
              <Th numeric>Book value</Th>
              <Th>Needed</Th>
              <Th>Status</Th>
              <Th>Client&rsquo;s files and note</Th>
            </tr>
          </THead>
          <tbody>
            {view.items.map((item) => (
              <tr
                key={item.id}
                className="border-t border-ink-line/70 align-top"
                data-testid={`request-row-${item.itemRef}`}
              >
                <Td>
                  <span className="figures font-medium">{item.itemRef}</span>
                  {item.description && <span className="block text-xs text-ink-faint">{item.description}</span>}
                </Td>
                <Td className="text-right">
                  {item.bookValue !== undefined && <Amount value={item.bookValue} currency={currency} />}
                </Td>
                <Td className="text-xs text-ink-soft">
                  {needsText(item.needs)}
                  {item.needsNote && <span className="block">{item.needsNote}</span>}
                </Td>
                <Td>
                  <RequestStatusBadge status={item.status} />
                </Td>
                <Td className="space-y-2">
                  {item.files.length === 0 && <span className="text-xs text-ink-faint">Nothing sent yet</span>}
                  {item.files.map((f) => (
                    <FileRow
                      key={f.id}
                      file={f}
                      href={`${base}/files/${f.id}`}
                      mayDecide={mayDecide}
                      onDecide={decide}
                    />
                  ))}
                  {item.clientNote && (
                    <p className="text-xs text-ink-soft">
                      <span className="font-medium">Client&rsquo;s note:</span> {item.clientNote}
                    </p>
                  )}
                </Td>
              </tr>
            ))}
          </tbody>
        </Table>
      </div>
    </div>
  );
}

function FileRow({
  file,
  href,
  mayDecide,
  onDecide,
}: {
  file: RequestFileView;
  href: string;
  mayDecide: boolean;
  onDecide: (f: RequestFileView, a: "accept" | "return", reason?: string) => Promise<boolean>;
}) {
  const [returning, setReturning] = useState(false);
  const [reason, setReason] = useState("");
  const [busy, setBusy] = useState(false);
  const run = async (action: "accept" | "return") => {
    setBusy(true);
    const ok = await onDecide(file, action, reason);
    setBusy(false);
    if (ok) setReturning(false);
  };
  return (
    <div className="rounded-md border border-ink-line px-2.5 py-1.5">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <a href={href} className="text-ledger-700 link">
          {file.fileName}
        </a>
        <span className="text-xs text-ink-faint">
          {formatBytes(file.sizeBytes)} · {FILE_STATUS_LABELS[file.status]}
          {file.decidedByName ? ` by ${file.decidedByName}` : ""}
        </span>
      </div>
      {file.status === "returned" && file.returnReason && (
        <p className="text-xs text-amber-700">Sent back: {file.returnReason}</p>
      )}
      {mayDecide && file.status === "pending" && !returning && (
        <div className="mt-1 flex gap-2">
          <Button
            type="button"
            className="px-2.5 py-1 text-xs"
            disabled={busy}
            onClick={() => run("accept")}
            aria-label={`Accept ${file.fileName}`}
          >
            Accept
          </Button>
          <Button
            type="button"
            variant="secondary"
            className="px-2.5 py-1 text-xs"
            onClick={() => setReturning(true)}
            aria-label={`Send back ${file.fileName}`}
          >
            Send back…
          </Button>
        </div>
      )}
      {returning && (
        <div className="mt-2 space-y-1.5">
          <label className="block text-xs font-medium" htmlFor={`reason-${file.id}`}>
            What is missing or wrong in {file.fileName}
          </label>
          <Textarea id={`reason-${file.id}`} rows={2} value={reason} onChange={(e) => setReason(e.target.value)} />
          <div className="flex gap-2">
            <Button
              type="button"
              variant="danger"
              className="px-2.5 py-1 text-xs"
              disabled={busy || reason.trim().length < 5}
              onClick={() => run("return")}
            >
              Send back to the client
            </Button>
            <Button type="button" variant="ghost" className="px-2.5 py-1 text-xs" onClick={() => setReturning(false)}>
              Cancel
            </Button>
          </div>
        </div>
      )}
    </div>
  );
}
