import type { SummaryView } from "@/lib/misstatements/types";
import { Card } from "@/components/ui/card";
import { formatDateTime } from "@/lib/format/date";
import { Table, THead, Th, Td } from "@/components/ui/table";

/** Who changed what on the summary, and when (every write is in the audit log). */
export function TrailCard({ view }: { view: SummaryView }) {
  return (
    <Card title="Audit trail">
      <details>
        <summary className="cursor-pointer text-sm text-ledger-700">
          {view.trail.length} recorded change{view.trail.length === 1 ? "" : "s"}
        </summary>
        <Table density="compact" className="mt-3 text-xs">
          <THead>
            <tr className="border-b border-ink-line text-left uppercase tracking-wider text-ink-soft">
              <Th className="font-medium">When</Th>
              <Th className="font-medium">Who</Th>
              <Th className="font-medium">Action</Th>
              <Th className="font-medium">Subject</Th>
              <Th className="font-medium">After</Th>
            </tr>
          </THead>
          <tbody>
            {view.trail
              .slice()
              .reverse()
              .map((t, i) => (
                <tr key={i} className="border-b border-ink-line/60 align-top">
                  <Td className="figures whitespace-nowrap">{formatDateTime(t.at)}</Td>
                  <Td>{t.who}</Td>
                  <Td>{t.action}</Td>
                  <Td>{t.subject}</Td>
                  <Td className="break-all font-mono">{t.after}</Td>
                </tr>
              ))}
          </tbody>
        </Table>
      </details>
    </Card>
  );
}
