import type { SummaryView } from "@/lib/misstatements/types";
import { Card } from "@/components/ui/card";
import { formatDateTime } from "@/lib/format/dates";

/** Who changed what on the summary, and when (every write is in the audit log). */
export function TrailCard({ view }: { view: SummaryView }) {
  return (
    <Card title="Audit trail">
      <details>
        <summary className="cursor-pointer text-sm text-ledger-700">{view.trail.length} recorded change{view.trail.length === 1 ? "" : "s"}</summary>
        <table className="mt-3 w-full text-xs">
          <thead>
            <tr className="border-b border-ink-line text-left uppercase tracking-wider text-ink-soft">
              <th scope="col" className="py-1.5 pr-2 font-medium">When (UTC)</th><th scope="col" className="py-1.5 pr-2 font-medium">Who</th><th scope="col" className="py-1.5 pr-2 font-medium">Action</th>
              <th scope="col" className="py-1.5 pr-2 font-medium">Subject</th><th scope="col" className="py-1.5 font-medium">After</th>
            </tr>
          </thead>
          <tbody>
            {view.trail.slice().reverse().map((t, i) => (
              <tr key={i} className="border-b border-ink-line/60 align-top">
                <td className="whitespace-nowrap py-1.5 pr-2 figures">{formatDateTime(t.at)}</td><td className="py-1.5 pr-2">{t.who}</td>
                <td className="py-1.5 pr-2">{t.action}</td><td className="py-1.5 pr-2">{t.subject}</td><td className="break-all py-1.5 font-mono">{t.after}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </Card>
  );
}
