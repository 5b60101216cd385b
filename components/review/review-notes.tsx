"use client";
import { useState } from "react";
import { hasAtLeastRole, type EngagementRole } from "@/lib/auth/roles";
import type { ReviewNote } from "@/lib/data/review-notes";
import { AnswerNoteSchema, RaiseNoteSchema } from "@/lib/validation/review";
import { apiFetch, plainMessage } from "@/components/ui/api";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { NoteCard } from "./note-card";
import { Textarea } from "@/components/ui/field";

export interface NoteItem {
  id: number;
  itemRef: string;
}

interface Props {
  engagementId: number;
  sampleId: number;
  role: EngagementRole;
  notes: ReviewNote[];
  locked: boolean;
  items: NoteItem[];
  onChanged: () => void;
}

const plain = plainMessage;

export function ReviewNotes({ engagementId, sampleId, role, notes, locked, items, onChanged }: Props) {
  const [text, setText] = useState("");
  const [itemRef, setItemRef] = useState("");
  const [answers, setAnswers] = useState<Record<number, string>>({});
  const [error, setError] = useState<string | null>(null);
  const base = `/api/engagements/${engagementId}/samples/${sampleId}/notes`;
  const isReviewer = hasAtLeastRole(role, "manager");
  const canAnswer = hasAtLeastRole(role, "staff");

  async function run(call: () => Promise<unknown>): Promise<boolean> {
    setError(null);
    try {
      await call();
      onChanged();
      return true;
    } catch (err) {
      setError(plain(err));
      return false;
    }
  }

  async function sendAnswer(n: ReviewNote, i: number) {
    const checked = AnswerNoteSchema.safeParse({ answer: answers[n.id] ?? "" });
    if (!checked.success) return setError(`Note ${i + 1}: ${checked.error.issues[0].message}`);
    if (await run(() => apiFetch(`${base}/${n.id}/answer`, { body: checked.data })))
      setAnswers((a) => ({ ...a, [n.id]: "" }));
  }

  async function raise() {
    const item = itemRef.trim()
      ? items.find((i) => i.itemRef.toLowerCase() === itemRef.trim().toLowerCase())
      : undefined;
    if (itemRef.trim() && !item) return setError(`No item ${itemRef.trim()} in this sample's current draw.`);
    const checked = RaiseNoteSchema.safeParse({ text, itemId: item?.id });
    if (!checked.success) return setError(checked.error.issues[0].message);
    if (await run(() => apiFetch(base, { body: checked.data }))) {
      setText("");
      setItemRef("");
    }
  }

  return (
    <section aria-label="Review notes" className="space-y-3 border-t border-ink-line pt-4">
      <h3 className="text-sm font-semibold">Review notes</h3>
      {error && <Alert>{error}</Alert>}
      {notes.length === 0 && <p className="text-sm text-ink-soft">No review notes.</p>}
      <ol className="space-y-3">
        {notes.map((n, i) => (
          <NoteCard
            key={n.id}
            note={n}
            number={i + 1}
            about={n.itemRef ? `item ${n.itemRef}` : undefined}
            testId={`review-note-${i + 1}`}
            mayAnswer={!locked && n.status !== "cleared" && canAnswer}
            mayClear={isReviewer}
            draft={answers[n.id] ?? ""}
            onDraft={(t) => setAnswers({ ...answers, [n.id]: t })}
            onSend={() => void sendAnswer(n, i)}
            onClear={() => void run(() => apiFetch(`${base}/${n.id}/clear`, { body: {} }))}
          />
        ))}
      </ol>
      {!locked && isReviewer && (
        <form
          className="space-y-2"
          aria-label="Raise a review note"
          onSubmit={(e) => {
            e.preventDefault();
            void raise();
          }}
        >
          <Textarea
            aria-label="New review note"
            value={text}
            onChange={(e) => setText(e.target.value)}
            rows={3}
            placeholder="Raise a review note for the preparer…"
          />
          <div className="flex flex-wrap items-center gap-2">
            <label className="inline-flex items-center gap-2 text-sm text-ink-soft">
              About item (optional)
              <input
                list={`note-items-${sampleId}`}
                value={itemRef}
                onChange={(e) => setItemRef(e.target.value)}
                placeholder="reference"
                className="w-36 rounded-md border border-ink-line bg-paper-raised px-2 py-1 text-sm"
              />
            </label>
            <datalist id={`note-items-${sampleId}`}>
              {items.map((i) => (
                <option key={i.id} value={i.itemRef} />
              ))}
            </datalist>
            <Button type="submit" className="ml-auto">
              Raise note
            </Button>
          </div>
        </form>
      )}
    </section>
  );
}
