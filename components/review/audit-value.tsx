import type { ReadableChange } from "@/lib/review/describe-change";

/** The fields a change touched, by their labels, each with its value before → after as the screen shows them. */
export function ChangeList({ changes }: { changes: ReadableChange["changes"] }) {
  if (changes.length === 0) return <span className="text-ink-soft">—</span>;
  return (
    <dl className="space-y-0.5 text-xs">
      {changes.map((c) => (
        <div key={c.field} className="flex flex-wrap gap-x-1.5">
          <dt className="font-medium text-ink-soft">{c.field}:</dt>
          <dd className="min-w-0 [overflow-wrap:anywhere]">
            {c.before === "—" && c.after !== "—" ? (
              c.after
            ) : (
              <>
                {c.before} <span aria-hidden>→</span>
                <span className="sr-only">changed to</span> {c.after}
              </>
            )}
          </dd>
        </div>
      ))}
    </dl>
  );
}
