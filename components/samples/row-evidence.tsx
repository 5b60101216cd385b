"use client";
import { useState } from "react";
import { apiFetch } from "@/components/ui/api";
import { useApi } from "@/components/ui/use-api";
import { Button } from "@/components/ui/button";
import { formatDateTime } from "@/lib/format/date";

export interface EvidenceFile {
  id: number;
  fileName: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  uploadedByName: string;
  uploadedAt: string;
}

interface Props {
  itemUrl: string;
  itemRef: string;
  columnCount: number;
  mayWrite: boolean;
  version: number;
  onRemoved: () => void;
}

/**
 * The files attached to one item, listed under its row; `version` (the evidence count) refetches them.
 * The list is read by the item's URL, so a slow answer for an item shown before can never appear here.
 */
export function RowEvidence({ itemUrl, itemRef, columnCount, mayWrite, version, onRemoved }: Props) {
  const evidence = useApi<{ evidence: EvidenceFile[] }>(`${itemUrl}/evidence`, { revision: version });
  const files = evidence.data?.evidence ?? null;
  const [failure, setFailure] = useState<string | null>(null);
  const error = failure ?? evidence.error?.message ?? null;

  async function remove(f: EvidenceFile) {
    setFailure(null);
    try {
      await apiFetch(`${itemUrl}/evidence/${f.id}`, { method: "DELETE" });
      await evidence.mutate((answer) => answer && { evidence: answer.evidence.filter((x) => x.id !== f.id) }, {
        revalidate: false,
      });
      onRemoved();
    } catch (e) {
      setFailure((e as Error).message);
    }
  }

  return (
    <tr className="bg-paper" data-testid={`evidence-of-${itemRef}`}>
      <td colSpan={columnCount + 1} className="px-3 pb-3 pt-1">
        <div className="sticky left-3 max-w-4xl text-sm">
          {error && (
            <p role="alert" className="text-brick-700">
              {error}
            </p>
          )}
          {files === null ? (
            <p className="text-ink-soft">Loading the evidence of {itemRef}…</p>
          ) : files.length === 0 ? (
            <p className="text-ink-soft">
              No evidence attached to {itemRef} yet. {mayWrite && "Drop a file on the row or use Attach."}
            </p>
          ) : (
            <ul className="divide-y divide-ink-line/70">
              {files.map((f) => (
                <li key={f.id} className="flex flex-wrap items-center justify-between gap-3 py-1.5">
                  <span>
                    <a className="font-medium text-ledger-700 link" href={`${itemUrl}/evidence/${f.id}`}>
                      {f.fileName}
                    </a>{" "}
                    <span className="text-xs text-ink-soft">
                      {Math.max(1, Math.ceil(f.sizeBytes / 1024)).toLocaleString("en-US")} KB · {f.uploadedByName} ·{" "}
                      {formatDateTime(f.uploadedAt)} · SHA-256 <span className="figures">{f.sha256.slice(0, 12)}…</span>
                    </span>
                  </span>
                  {mayWrite && (
                    <Button
                      variant="ghost"
                      className="px-2 py-1 text-xs"
                      onClick={() => void remove(f)}
                      aria-label={`Remove ${f.fileName} from ${itemRef}`}
                    >
                      Remove
                    </Button>
                  )}
                </li>
              ))}
            </ul>
          )}
        </div>
      </td>
    </tr>
  );
}
