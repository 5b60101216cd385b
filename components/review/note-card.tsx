"use client";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Textarea } from "@/components/ui/field";
import { formatDateTime } from "@/lib/format/date";
import type { ReviewNote } from "@/lib/data/review-notes";
import { NOTE_STATUS_LABELS, NOTE_STATUS_TONES } from "./note-labels";

/** A review note as the card prints it: a sample's note (lib/data) or the summary's (the same fields). */
export type NoteCardNote = Omit<ReviewNote, "itemId" | "itemRef" | "raisedById">;

interface Props {
  note: NoteCardNote;
  /** The note's number in its list, from 1. */
  number: number;
  /** Words after "Note n" (e.g. the item it is about). */
  about?: string;
  testId: string;
  /** The answer box is shown (not locked, not cleared, and the role may answer). */
  mayAnswer: boolean;
  mayClear: boolean;
  busy?: boolean;
  draft: string;
  onDraft: (text: string) => void;
  onSend: () => void;
  onClear: () => void;
}

/** One review note (a sample's or the summary's): the note, its answer, who cleared it, and the answer box. */
export function NoteCard({
  note: n,
  number,
  about,
  testId,
  mayAnswer,
  mayClear,
  busy,
  draft,
  onDraft,
  onSend,
  onClear,
}: Props) {
  return (
    <li className="rounded-md border border-ink-line bg-paper px-3 py-2 text-sm" data-testid={testId}>
      <div className="flex items-center justify-between gap-2">
        <span className="font-medium">
          Note {number}
          {about ? ` · ${about}` : ""}
        </span>
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
      {mayAnswer && (
        <div className="mt-2 space-y-2">
          <Textarea
            aria-label={`Answer to note ${number}`}
            value={draft}
            rows={2}
            onChange={(e) => onDraft(e.target.value)}
            placeholder={n.answer ? "Add to the answer…" : "Answer the note…"}
          />
          <div className="flex gap-2">
            <Button variant="secondary" className="px-2.5 py-1 text-xs" disabled={busy} onClick={onSend}>
              Send answer
            </Button>
            {mayClear && n.status === "answered" && (
              <Button variant="secondary" className="px-2.5 py-1 text-xs" disabled={busy} onClick={onClear}>
                Clear
              </Button>
            )}
          </div>
        </div>
      )}
    </li>
  );
}
