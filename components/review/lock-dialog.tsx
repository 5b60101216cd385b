"use client";
import { useEffect, useRef } from "react";
import { Button } from "@/components/ui/button";

export interface OpenList {
  id: number;
  title: string;
  contactName: string;
}

interface Props {
  open: boolean;
  openLists: OpenList[];
  busy: boolean;
  onConfirm: () => void;
  onCancel: () => void;
}

/** Says what locking does before it is done: it cannot be undone without a partner. */
export function LockDialog({ open, openLists, busy, onConfirm, onCancel }: Props) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal();
    if (!open && d.open) d.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      aria-labelledby="lock-title"
      onCancel={(e) => {
        e.preventDefault();
        onCancel();
      }}
      className="m-auto max-w-lg rounded-card border border-ink-line bg-paper-raised p-0 text-ink shadow-card backdrop:bg-ink/30"
    >
      <div className="space-y-3 px-5 py-4 text-sm">
        <h2 id="lock-title" className="text-base font-semibold">
          Lock this sample?
        </h2>
        <p>Locking makes the work final. It will:</p>
        <ul className="list-disc space-y-1 pl-5">
          <li>render the signed-off workpaper (PDF) once and keep it with its SHA-256 fingerprint;</li>
          <li>
            make the plan, selection, results, evidence and review notes read-only — only a partner can unlock, giving a
            reason;
          </li>
          {openLists.length === 0 ? (
            <li>close no client request list (none is open).</li>
          ) : (
            <li>
              close{" "}
              {openLists.length === 1
                ? "the open client request list"
                : `the ${openLists.length} open client request lists`}
              , and e-mail each contact that it no longer takes files:
              <ul className="mt-1 list-[circle] pl-5" data-testid="lists-to-close">
                {openLists.map((l) => (
                  <li key={l.id}>
                    &ldquo;{l.title}&rdquo; (sent to {l.contactName})
                  </li>
                ))}
              </ul>
            </li>
          )}
        </ul>
      </div>
      <div className="flex justify-end gap-2 border-t border-ink-line px-5 py-3">
        <Button variant="secondary" onClick={onCancel} disabled={busy}>
          Cancel
        </Button>
        <Button onClick={onConfirm} disabled={busy}>
          {busy ? "Locking…" : "Lock the sample"}
        </Button>
      </div>
    </dialog>
  );
}
