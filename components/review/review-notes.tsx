"use client";
import { useState } from "react";
import { hasAtLeastRole, type EngagementRole } from "@/lib/auth/roles";
import type { ReviewNote } from "@/lib/review/notes";
import { api } from "@/components/ui/api";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";

interface Props { engagementId: number; sampleId: number; role: EngagementRole; notes: ReviewNote[]; locked: boolean; onChanged: () => void }

const tone = { open: "red", answered: "amber", cleared: "green" } as const;
const label = { open: "Open", answered: "Answered", cleared: "Cleared" } as const;

export function ReviewNotes({ engagementId, sampleId, role, notes, locked, onChanged }: Props) {
  const [text, setText] = useState("");
  const [answers, setAnswers] = useState<Record<number, string>>({});
  const [error, setError] = useState<string | null>(null);
  const base = `/api/engagements/${engagementId}/samples/${sampleId}/notes`;
  const isReviewer = hasAtLeastRole(role, "manager");
  const canAnswer = hasAtLeastRole(role, "staff");

  async function run(call: () => Promise<unknown>) {
    setError(null);
    try {
      await call();
      onChanged();
    } catch (err) {
      setError((err as Error).message);
    }
  }

  return (
    <section aria-label="Review notes" className="space-y-3 border-t border-ink-line pt-4">
      <h3 className="text-sm font-semibold">Review notes</h3>
      {error && <Alert>{error}</Alert>}
      {notes.length === 0 && <p className="text-sm text-ink-faint">No review notes.</p>}
      <ol className="space-y-3">
        {notes.map((n, i) => (
          <li key={n.id} className="rounded-md border border-ink-line bg-paper px-3 py-2 text-sm" data-testid={`review-note-${i + 1}`}>
            <div className="flex items-center justify-between gap-2">
              <span className="font-medium">Note {i + 1}{n.itemRef ? ` · ${n.itemRef}` : ""}</span>
              <Badge tone={tone[n.status]}>{label[n.status]}</Badge>
            </div>
            <p className="mt-1 whitespace-pre-wrap">{n.text}</p>
            <p className="text-xs text-ink-faint">Raised by {n.raisedBy}</p>
            {n.answer && <p className="mt-2 whitespace-pre-wrap border-l-2 border-ledger-500 pl-2">{n.answer} <span className="text-xs text-ink-faint">— {n.answeredBy}</span></p>}
            {n.clearedBy && <p className="mt-1 text-xs text-ledger-700">Cleared by {n.clearedBy}</p>}
            {!locked && n.status !== "cleared" && canAnswer && (
              <div className="mt-2 flex gap-2">
                <input aria-label={`Answer to note ${i + 1}`} value={answers[n.id] ?? ""} onChange={(e) => setAnswers({ ...answers, [n.id]: e.target.value })} placeholder="Answer the note…" className="flex-1 rounded-md border border-ink-line bg-paper-raised px-2 py-1 text-sm" />
                <Button variant="secondary" onClick={() => run(() => api(`${base}/${n.id}/answer`, { body: { answer: answers[n.id] ?? "" } }))}>Answer</Button>
                {isReviewer && n.status === "answered" && <Button variant="secondary" onClick={() => run(() => api(`${base}/${n.id}/clear`, { body: {} }))}>Clear</Button>}
              </div>
            )}
          </li>
        ))}
      </ol>
      {!locked && isReviewer && (
        <form className="flex gap-2" onSubmit={(e) => { e.preventDefault(); void run(async () => { await api(base, { body: { text } }); setText(""); }); }}>
          <textarea aria-label="New review note" value={text} onChange={(e) => setText(e.target.value)} rows={2} placeholder="Raise a review note for the preparer…" className="flex-1 rounded-md border border-ink-line bg-paper-raised px-2 py-1 text-sm" />
          <Button type="submit" disabled={text.trim().length < 3}>Raise note</Button>
        </form>
      )}
    </section>
  );
}
