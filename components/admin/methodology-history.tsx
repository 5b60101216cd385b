import type { MethodologyChange } from "@/lib/data/firm-methodology";
import { Card, EmptyState } from "@/components/ui/card";

/** Who changed the firm's settings, when, and what each save changed. */
export function MethodologyHistory({ changes }: { changes: MethodologyChange[] }) {
  return (
    <Card title="Changes">
      {changes.length === 0 ? (
        <EmptyState title="Never changed">
          The shipped defaults (version 0) apply until an administrator saves the settings.
        </EmptyState>
      ) : (
        <ol className="space-y-4 text-sm" aria-label="Changes to the methodology settings">
          {changes.map((c) => (
            <li key={c.version} className="border-t border-ink-line/60 pt-3 first:border-0 first:pt-0">
              <p className="font-medium">
                Version {c.version} · {c.changedBy ?? "unknown"} ·{" "}
                <time dateTime={c.changedAt}>{c.changedAt.replace("T", " ").slice(0, 16)} UTC</time>
              </p>
              {c.changes.length === 0 ? (
                <p className="text-ink-soft">Saved without changes.</p>
              ) : (
                <ul className="mt-1 space-y-0.5 text-ink-soft">
                  {c.changes.slice(0, 40).map((d) => (
                    <li key={d.field}>
                      <span className="font-mono text-xs text-ink">{d.field}</span>: {d.from} → {d.to}
                    </li>
                  ))}
                  {c.changes.length > 40 && <li>… and {c.changes.length - 40} more</li>}
                </ul>
              )}
            </li>
          ))}
        </ol>
      )}
    </Card>
  );
}
