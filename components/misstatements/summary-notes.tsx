"use client";
import { useState } from "react";
import { hasAtLeastRole, type EngagementRole } from "@/lib/auth/roles";
import type { SummaryNote } from "@/lib/misstatements/types";
import { AnswerNoteSchema } from "@/lib/validation/review";
import { SummaryNoteSchema } from "@/lib/validation/misstatements";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Textarea } from "@/components/ui/field";
import { NOTE_STATUS_LABELS, NOTE_STATUS_TONES } from "@/components/review/note-labels";
import { formatDateTime } from "@/lib/format/date";

interface Props {
  notes: SummaryNote[];
  role: EngagementRole;
  locked: boolean;
  busy: boolean;
  /** Calls a summary route (path under …/misstatements); true when it succeeded. */
  act: (path: string, init: { body: unknown }, done: string) => Promise<boolean>;
  /** Shows a refusal found before sending (the same words the server would answer). */
  refuse: (text: string) => void;
}

/** The summary's review notes as the sample's are: multi-line, answers cleared after sending, times shown. */
export function SummaryNotes({ notes, role, locked, busy, act, refuse }: Props) {
  const [note, setNote] = useState("");
  const [answers, setAnswers] = useState<Record<number, string>>({});
  const isReviewer = hasAtLeastRole(role, "manager");

  async function answer(n: SummaryNote, i: number) {
    const checked = AnswerNoteSchema.safeParse({ answer: answers[n.id] ?? "" });
    if (!checked.success) return refuse(`Note ${i + 1}: ${checked.error.issues[0].message}`);
    if (await act(`/notes/${n.id}/answer`, { body: checked.data }, "Answered."))
      setAnswers((a) => ({ ...a, [n.id]: "" }));
  }

  async function raise() {
    const checked = SummaryNoteSchema.safeParse({ text: note });
    if (!checked.success) return refuse(checked.error.issues[0].message);
    if (await act("/notes", { body: checked.data }, "Note raised.")) setNote("");
  }

  return (
    <section aria-label="Review notes" className="space-y-3 border-t border-ink-line pt-4">
      <h3 className="text-sm font-semibold">Review notes</h3>
      {notes.length === 0 && <p className="text-sm text-ink-soft">No review notes.</p>}
      <ol className="space-y-3">
        {notes.map((n, i) => (
          <li
            key={n.id}
            className="rounded-md border border-ink-line bg-paper px-3 py-2 text-sm"
            data-testid={`summary-note-${i + 1}`}
          >
            <div className="flex items-center justify-between gap-2">
              <span className="font-medium">Note {i + 1}</span>
              <Badge tone={NOTE_STATUS_TONES[n.status]}>{NOTE_STATUS_LABELS[n.status]}</Badge>
            </div>
            <p className="mt-1 whitespace-pre-wrap">{n.text}</p>
            <p className="text-xs text-ink-soft">
              Raised by {n.raisedBy} · {formatDateTime(n.raisedAt)}
            </p>
            {n.answer && (
              <div className="mt-2 border-l-2 border-ledger-500 pl-2">
                <p className="whitespace-pre-wrap">{n.answer}</p>
                <p className="text-xs text-ink-soft">
                  Answered by {n.answeredBy}
                  {n.answeredAt ? ` · ${formatDateTime(n.answeredAt)}` : ""}
                </p>
              </div>
            )}
            {n.clearedBy && (
              <p className="mt-1 text-xs text-ledger-700">
                Cleared by {n.clearedBy}
                {n.clearedAt ? ` · ${formatDateTime(n.clearedAt)}` : ""}
              </p>
            )}
            {!locked && n.status !== "cleared" && hasAtLeastRole(role, "staff") && (
              <div className="mt-2 space-y-2">
                <Textarea
                  aria-label={`Answer to note ${i + 1}`}
                  value={answers[n.id] ?? ""}
                  rows={2}
                  onChange={(e) => setAnswers({ ...answers, [n.id]: e.target.value })}
                  placeholder={n.answer ? "Add to the answer…" : "Answer the note…"}
                />
                <div className="flex gap-2">
                  <Button
                    variant="secondary"
                    className="px-2.5 py-1 text-xs"
                    disabled={busy}
                    onClick={() => void answer(n, i)}
                  >
                    Send answer
                  </Button>
                  {isReviewer && n.status === "answered" && (
                    <Button
                      variant="secondary"
                      className="px-2.5 py-1 text-xs"
                      disabled={busy}
                      onClick={() => void act(`/notes/${n.id}/clear`, { body: {} }, "Cleared.")}
                    >
                      Clear
                    </Button>
                  )}
                </div>
              </div>
            )}
          </li>
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
            value={note}
            onChange={(e) => setNote(e.target.value)}
            rows={3}
            placeholder="Raise a review note for the preparer…"
          />
          <div className="flex justify-end">
            <Button type="submit" disabled={busy}>
              Raise note
            </Button>
          </div>
        </form>
      )}
    </section>
  );
}
