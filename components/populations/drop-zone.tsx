"use client";
import { useId, useRef, useState } from "react";

const ACCEPT = ".csv,.txt,.xlsx,text/csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet";

/** Drag a ledger file here, or pick one; hands the file on at once. */
export function DropZone({ onFile, disabled }: { onFile: (file: File) => void; disabled?: boolean }) {
  const inputId = useId();
  const input = useRef<HTMLInputElement>(null);
  const [over, setOver] = useState(false);
  const take = (files: FileList | null) => {
    const file = files?.[0];
    if (file && !disabled) onFile(file);
  };
  return (
    <div
      onDragOver={(e) => {
        e.preventDefault();
        setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={(e) => {
        e.preventDefault();
        setOver(false);
        take(e.dataTransfer.files);
      }}
      className={`flex flex-col items-center justify-center gap-3 rounded-card border-2 border-dashed px-6 py-12 text-center transition-colors ${over ? "border-ledger-500 bg-ledger-50" : "border-ink-line bg-paper"}`}
    >
      <svg aria-hidden viewBox="0 0 40 40" className="h-10 w-10 text-ledger-600">
        <path
          d="M10 6h14l8 8v20a2 2 0 0 1-2 2H10a2 2 0 0 1-2-2V8a2 2 0 0 1 2-2Z"
          fill="none"
          stroke="currentColor"
          strokeWidth="2"
        />
        <path d="M24 6v8h8M14 22h12M14 27h12M14 32h7" fill="none" stroke="currentColor" strokeWidth="2" />
      </svg>
      <div>
        <p className="font-medium text-ink">Drop the ledger file here</p>
        <p className="mt-1 text-sm text-ink-soft">
          CSV (any delimiter, UTF-8 or Windows-1252) or an Excel workbook (.xlsx), up to 200 MB and 1,000,000 rows.
        </p>
      </div>
      <label
        htmlFor={inputId}
        className="cursor-pointer rounded-md border border-ink-line bg-paper-raised px-3.5 py-2 text-sm font-medium text-ink hover:bg-paper-sunk"
      >
        Choose a file…
      </label>
      <input
        ref={input}
        id={inputId}
        type="file"
        accept={ACCEPT}
        disabled={disabled}
        className="sr-only"
        aria-label="Ledger file"
        onChange={(e) => {
          take(e.target.files);
          if (input.current) input.current.value = "";
        }}
      />
    </div>
  );
}
