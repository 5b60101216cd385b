/** Appendix A: the audit trail of the sample — who did what, when, with the values before and after. */
import { Text } from "@react-pdf/renderer";
import { Section, Table } from "./primitives";
import { s } from "./styles";
import type { WorkpaperData } from "./workpaper-data";
import { formatDateTime } from "@/lib/format/date";

export function AuditTrailAppendix({ data }: { data: WorkpaperData }) {
  return (
    <Section number="A" title="Appendix — audit trail">
      <Text style={[s.soft, { marginBottom: 4 }]}>
        Every change to the sample, in time order, as recorded by Sondage.
      </Text>
      <Table
        columns={[
          { label: "When", width: 96 },
          { label: "Who", width: 72 },
          { label: "What", flex: 1.2 },
          { label: "Before", flex: 1 },
          { label: "After", flex: 1 },
        ]}
        rows={data.auditTrail.map((row) => ({
          cells: [
            formatDateTime(row.at),
            row.who,
            row.subject ? `${row.action} — ${row.subject}` : row.action,
            row.before ?? "—",
            row.after ?? "—",
          ],
        }))}
      />
      {data.auditTrail.length === 0 && <Text style={s.soft}>No entries.</Text>}
    </Section>
  );
}
