"use client";
import { useEffect, useId, useRef } from "react";
import { Button } from "./button";

interface Props {
  open: boolean;
  title: string;
  /** What the action will do, in words. */
  children: React.ReactNode;
  confirmLabel: string;
  busyLabel: string;
  busy: boolean;
  onConfirm: () => void;
  onCancel: () => void;
}

/** A modal that says what an action will do before it is done (Escape or Cancel backs out). */
export function ConfirmDialog({ open, title, children, confirmLabel, busyLabel, busy, onConfirm, onCancel }: Props) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal();
    if (!open && d.open) d.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onCancel={(e) => {
        e.preventDefault();
        onCancel();
      }}
      className="m-auto max-w-lg rounded-card border border-ink-line bg-paper-raised p-0 text-ink shadow-card backdrop:bg-ink/30"
    >
      <div className="space-y-3 px-5 py-4 text-sm">
        <h2 id={titleId} className="text-base font-semibold">
          {title}
        </h2>
        {children}
      </div>
      <div className="flex justify-end gap-2 border-t border-ink-line px-5 py-3">
        <Button variant="secondary" onClick={onCancel} disabled={busy}>
          Cancel
        </Button>
        <Button onClick={onConfirm} disabled={busy}>
          {busy ? busyLabel : confirmLabel}
        </Button>
      </div>
    </dialog>
  );
}
