"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { apiFetch, withFileName } from "@/components/ui/api";
import { useApi } from "@/components/ui/use-api";
import { Alert } from "@/components/ui/alert";

interface EvidenceFile {
  id: number;
  fileName: string;
  sizeBytes: number;
  uploadedByName: string;
}

/** An entry's evidence files: listed when opened, added by staff and above (the same store and checks as sample items). */
export function EntryEvidence({
  engagementId,
  entryId,
  count,
  mayWrite,
}: {
  engagementId: number;
  entryId: number;
  count: number;
  mayWrite: boolean;
}) {
  const router = useRouter();
  const [opened, setOpened] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);
  const base = `/api/engagements/${engagementId}/misstatements/entries/${entryId}/evidence`;
  const evidence = useApi<{ evidence: EvidenceFile[] }>(opened ? base : null);
  const files = evidence.data?.evidence ?? null;
  const error = failure ?? evidence.error?.message ?? null;
  async function upload(file: File) {
    setFailure(null);
    await apiFetch(withFileName(base, file), { body: file }).catch((err: Error) => setFailure(err.message));
    await evidence.mutate();
    router.refresh();
  }
  return (
    <details
      onToggle={(e) => {
        if ((e.target as HTMLDetailsElement).open) setOpened(true);
      }}
    >
      <summary className="cursor-pointer text-xs text-ledger-700">Evidence ({count})</summary>
      <div className="mt-1 space-y-1 text-xs">
        {error && <Alert>{error}</Alert>}
        {files?.map((f) => (
          <a key={f.id} href={`${base}/${f.id}`} className="block text-ledger-700 underline">
            {f.fileName}
          </a>
        ))}
        {files?.length === 0 && <p className="text-ink-faint">No files yet.</p>}
        {mayWrite && (
          <label className="block">
            Add a file{" "}
            <input
              type="file"
              className="block text-xs"
              onChange={(e) => {
                const f = e.target.files?.[0];
                if (f) void upload(f);
              }}
            />
          </label>
        )}
      </div>
    </details>
  );
}
