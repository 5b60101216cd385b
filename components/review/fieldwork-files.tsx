"use client";
import { useEffect, useState } from "react";
import { useRouter } from "next/navigation";
import { Alert } from "@/components/ui/alert";
import { Button, buttonClass } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { api, readErrorAnswer } from "@/components/ui/api";

interface ItemOption { id: number; itemRef: string }
interface Evidence { id: number; fileName: string; contentType: string; sizeBytes: number; sha256: string; uploadedByName: string; uploadedAt: string }
interface Problem { row: number; column: string | null; cell?: string; reason: string }

interface Props { engagementId: number; sampleId: number; items: ItemOption[]; mayWrite: boolean }

async function postFile(url: string, file: File): Promise<void> {
  const res = await fetch(`${url}${url.includes("?") ? "&" : "?"}fileName=${encodeURIComponent(file.name)}`, { method: "POST", body: file });
  if (res.ok) return;
  const data = await readErrorAnswer(res);
  throw Object.assign(new Error(data.error?.message ?? `Upload failed (${res.status})`), { problems: data.error?.problems as Problem[] | undefined });
}

/** The fieldwork workbook round trip and the evidence files of each item. */
export function FieldworkFiles({ engagementId, sampleId, items, mayWrite }: Props) {
  const router = useRouter();
  const base = `/api/engagements/${engagementId}/samples/${sampleId}`;
  const [message, setMessage] = useState<{ tone: "error" | "success"; text: string; problems?: Problem[] } | null>(null);
  const [itemId, setItemId] = useState<number | null>(items[0]?.id ?? null);
  const [evidence, setEvidence] = useState<Evidence[]>([]);

  useEffect(() => {
    if (itemId) api<{ evidence: Evidence[] }>(`${base}/items/${itemId}/evidence`).then((r) => setEvidence(r.evidence), () => setEvidence([]));
  }, [base, itemId]);

  async function importWorkbook(file: File) {
    setMessage(null);
    try {
      await postFile(`${base}/workbook`, file);
      setMessage({ tone: "success", text: `Imported ${file.name}: every change was applied and recorded.` });
      router.refresh();
    } catch (err) {
      setMessage({ tone: "error", text: `${(err as Error).message} Nothing was applied.`, problems: (err as { problems?: Problem[] }).problems });
    }
  }

  async function addEvidence(file: File) {
    if (!itemId) return;
    setMessage(null);
    try {
      await postFile(`${base}/items/${itemId}/evidence`, file);
      setEvidence((await api<{ evidence: Evidence[] }>(`${base}/items/${itemId}/evidence`)).evidence);
      setMessage({ tone: "success", text: `${file.name} attached.` });
    } catch (err) {
      setMessage({ tone: "error", text: (err as Error).message });
    }
  }

  async function remove(e: Evidence) {
    try {
      await api(`${base}/items/${itemId}/evidence/${e.id}`, { method: "DELETE" });
      setEvidence((list) => list.filter((x) => x.id !== e.id));
    } catch (err) {
      setMessage({ tone: "error", text: (err as Error).message });
    }
  }

  const picker = (label: string, accept: string, onFile: (f: File) => Promise<void>) => (
    <label className={buttonClass("secondary", "cursor-pointer")}>
      {label}
      <input type="file" accept={accept} className="sr-only" onChange={(e) => { const f = e.target.files?.[0]; e.target.value = ""; if (f) void onFile(f); }} />
    </label>
  );

  return (
    <Card title="Fieldwork files">
      <div className="space-y-5">
        {message && (
          <Alert tone={message.tone}>
            {message.text}
            {message.problems && (
              <ul className="mt-2 list-disc pl-5">
                {message.problems.slice(0, 50).map((p, i) => <li key={i}>Row {p.row}{p.column ? `, ${p.column}` : ""}{p.cell ? ` (${p.cell})` : ""}: {p.reason}</li>)}
              </ul>
            )}
          </Alert>
        )}
        <section className="space-y-2">
          <h3 className="text-sm font-semibold">Fieldwork workbook</h3>
          <p className="text-sm text-ink-soft">Export the selection to Excel, fill in the audited values offline, and import it back. An import applies every row or none.</p>
          <div className="flex flex-wrap gap-2">
            <a className={buttonClass("secondary")} href={`${base}/workbook`}>Export workbook (.xlsx)</a>
            {mayWrite && picker("Import filled workbook…", ".xlsx", importWorkbook)}
          </div>
        </section>
        {items.length > 0 && (
          <section className="space-y-2 border-t border-ink-line pt-4">
            <h3 className="text-sm font-semibold">Evidence</h3>
            <div className="flex flex-wrap items-center gap-2">
              <select aria-label="Item for evidence" value={itemId ?? ""} onChange={(e) => setItemId(Number(e.target.value))} className="rounded-md border border-ink-line bg-paper-raised px-2 py-1.5 text-sm">
                {items.map((i) => <option key={i.id} value={i.id}>{i.itemRef}</option>)}
              </select>
              {mayWrite && picker("Attach a file…", ".pdf,.png,.jpg,.jpeg,.gif,.webp,.tif,.tiff,.xlsx,.xls,.docx,.doc,.csv,.txt,.eml,.msg", addEvidence)}
            </div>
            {evidence.length === 0 ? <p className="text-sm text-ink-faint">No evidence attached to this item.</p> : (
              <ul className="divide-y divide-ink-line/70 text-sm">
                {evidence.map((e) => (
                  <li key={e.id} className="flex items-center justify-between gap-3 py-2">
                    <span><a className="font-medium text-ledger-600 link" href={`${base}/items/${itemId}/evidence/${e.id}`}>{e.fileName}</a> <span className="text-xs text-ink-faint">{Math.ceil(e.sizeBytes / 1024)} KB · {e.uploadedByName} · SHA-256 <span className="figures">{e.sha256.slice(0, 12)}…</span></span></span>
                    {mayWrite && <Button variant="ghost" onClick={() => remove(e)}>Remove</Button>}
                  </li>
                ))}
              </ul>
            )}
          </section>
        )}
      </div>
    </Card>
  );
}
