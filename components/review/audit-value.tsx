import { textOf } from "@/lib/format/text";

/** A before/after value from the audit trail, shown as compact key: value lines. */
export function AuditValue({ value }: { value: unknown }) {
  if (value === null || value === undefined) return <span className="text-ink-faint">—</span>;
  if (typeof value !== "object") return <span>{textOf(value)}</span>;
  return (
    <dl className="space-y-0.5 text-xs">
      {Object.entries(value as Record<string, unknown>).map(([k, v]) => (
        <div key={k} className="flex gap-1"><dt className="text-ink-faint">{k}:</dt><dd className="break-all">{typeof v === "object" && v !== null ? JSON.stringify(v) : textOf(v)}</dd></div>
      ))}
    </dl>
  );
}
