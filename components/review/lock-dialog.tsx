"use client";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";

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
  return (
    <ConfirmDialog
      open={open}
      title="Lock this sample?"
      confirmLabel="Lock the sample"
      busyLabel="Locking…"
      busy={busy}
      onConfirm={onConfirm}
      onCancel={onCancel}
    >
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
    </ConfirmDialog>
  );
}
