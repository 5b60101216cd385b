"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { api } from "@/components/ui/api";
import { Alert } from "@/components/ui/alert";

interface EvidenceFile { id: number; fileName: string; sizeBytes: number; uploadedByName: string }

/** An entry's evidence files: listed when opened, added by staff and above (the same store and checks as sample items). */
export function EntryEvidence({ engagementId, entryId, count, mayWrite }: { engagementId: number; entryId: number; count: number; mayWrite: boolean }) {
  const router = useRouter();
  const [files, setFiles] = useState<EvidenceFile[] | null>(null);
  const [error, setError] = useState<string | null>(null);
  const base = `/api/engagements/${engagementId}/misstatements/entries/${entryId}/evidence`;
  const load = async () => setFiles((await api<{ evidence: EvidenceFile[] }>(base)).evidence);
  async function upload(file: File) {
    setError(null);
    const res = await fetch(`${base}?fileName=${encodeURIComponent(file.name)}`, { method: "POST", body: file });
    if (!res.ok) setError(((await res.json().catch(() => ({}))) as { error?: { message?: string } }).error?.message ?? `Upload failed (${res.status})`);
    await load();
    router.refresh();
  }
  return (
    <details onToggle={(e) => { if ((e.target as HTMLDetailsElement).open && files === null) void load().catch((err: Error) => setError(err.message)); }}>
      <summary className="cursor-pointer text-xs text-ledger-700">Evidence ({count})</summary>
      <div className="mt-1 space-y-1 text-xs">
        {error && <Alert>{error}</Alert>}
        {files?.map((f) => <a key={f.id} href={`${base}/${f.id}`} className="block text-ledger-700 underline">{f.fileName}</a>)}
        {files?.length === 0 && <p className="text-ink-faint">No files yet.</p>}
        {mayWrite && <label className="block">Add a file <input type="file" className="block text-xs" onChange={(e) => { const f = e.target.files?.[0]; if (f) void upload(f); }} /></label>}
      </div>
    </details>
  );
}
