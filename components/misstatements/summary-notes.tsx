"use client";
import { useState } from "react";
import { hasAtLeastRole, type EngagementRole } from "@/lib/auth/roles";
import type { SummaryNote } from "@/lib/misstatements/types";
import { AnswerNoteSchema } from "@/lib/validation/review";
import { SummaryNoteSchema } from "@/lib/validation/misstatements";
import { Button } from "@/components/ui/button";
import { Textarea } from "@/components/ui/field";
import { NoteCard } from "@/components/review/note-card";

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
          <NoteCard
            key={n.id}
            note={n}
            number={i + 1}
            testId={`summary-note-${i + 1}`}
            mayAnswer={!locked && n.status !== "cleared" && hasAtLeastRole(role, "staff")}
            mayClear={isReviewer}
            busy={busy}
            draft={answers[n.id] ?? ""}
            onDraft={(t) => setAnswers({ ...answers, [n.id]: t })}
            onSend={() => void answer(n, i)}
            onClear={() => void act(`/notes/${n.id}/clear`, { body: {} }, "Cleared.")}
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
