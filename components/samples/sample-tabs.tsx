"use client";
import { useEffect, useId, useRef } from "react";

export interface TabDef {
  id: string;
  label: string;
  badge?: React.ReactNode;
}

/** Accessible tabs (arrow keys move between them); the chosen tab is kept in the address's hash. */
export function SampleTabs({
  tabs,
  current,
  onChange,
}: {
  tabs: TabDef[];
  current: string;
  onChange: (id: string) => void;
}) {
  const base = useId();
  const refs = useRef<(HTMLButtonElement | null)[]>([]);
  const arrived = useRef(false);
  useEffect(() => {
    if (arrived.current) return; // the hash is read once, on arrival
    arrived.current = true;
    const fromHash = window.location.hash.slice(1);
    if (fromHash && fromHash !== current && tabs.some((t) => t.id === fromHash)) onChange(fromHash);
  }, [current, tabs, onChange]);
  const choose = (id: string) => {
    onChange(id);
    window.history.replaceState(null, "", `#${id}`);
  };
  const onKey = (e: React.KeyboardEvent, i: number) => {
    const step = e.key === "ArrowRight" ? 1 : e.key === "ArrowLeft" ? -1 : 0;
    if (!step) return;
    const next = (i + step + tabs.length) % tabs.length;
    choose(tabs[next].id);
    refs.current[next]?.focus();
  };
  return (
    <div role="tablist" aria-label="Sample" className="mb-6 flex gap-1 border-b border-ink-line">
      {tabs.map((t, i) => {
        const selected = t.id === current;
        return (
          <button
            key={t.id}
            ref={(el) => {
              refs.current[i] = el;
            }}
            role="tab"
            type="button"
            id={`${base}-${t.id}`}
            aria-selected={selected}
            aria-controls={`panel-${t.id}`}
            tabIndex={selected ? 0 : -1}
            onClick={() => choose(t.id)}
            onKeyDown={(e) => onKey(e, i)}
            className={`-mb-px inline-flex items-center gap-2 border-b-2 px-4 py-2.5 text-sm font-medium transition-colors ${selected ? "border-ledger-600 text-ink" : "border-transparent text-ink-soft hover:text-ink"}`}
          >
            {t.label}
            {t.badge}
          </button>
        );
      })}
    </div>
  );
}
