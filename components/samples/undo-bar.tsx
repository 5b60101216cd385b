"use client";
import { useEffect, useState } from "react";
import { Button } from "@/components/ui/button";

export interface UndoOffer {
  id: number;
  text: string;
  undo: () => Promise<void>;
}

const SECONDS = 8;

/** "Saved … Undo" for a few seconds after a save; the undo is itself a new, audited change. Key it by the offer's id so each offer counts down afresh. */
export function UndoBar({ offer, onDone }: { offer: UndoOffer | null; onDone: () => void }) {
  const [left, setLeft] = useState(SECONDS);
  const [busy, setBusy] = useState(false);
  useEffect(() => {
    if (!offer) return;
    const started = Date.now();
    const t = setInterval(() => {
      const remaining = SECONDS - Math.floor((Date.now() - started) / 1000);
      if (remaining <= 0) {
        clearInterval(t);
        onDone();
      } else setLeft(remaining);
    }, 250);
    return () => clearInterval(t);
  }, [offer, onDone]);
  if (!offer) return null;
  return (
    <div
      role="status"
      className="flex flex-wrap items-center gap-3 rounded-md border border-ledger-100 bg-ledger-50 px-3 py-2 text-sm text-ledger-700"
      data-testid="undo-bar"
    >
      <span>{offer.text}</span>
      <Button
        variant="secondary"
        className="px-2.5 py-1 text-xs"
        disabled={busy}
        onClick={() => {
          setBusy(true);
          void offer.undo().finally(() => setBusy(false));
        }}
      >
        Undo <span className="figures text-ink-soft">({left} s)</span>
      </Button>
    </div>
  );
}
