/** The evidence index: each file attached to an item, with its SHA-256, who attached it and when. */
import { Text } from "@react-pdf/renderer";
import { Section, Table } from "./primitives";
import { s } from "./styles";
import type { WorkpaperData } from "./workpaper-data";
import { formatDateTime } from "@/lib/format/date";

export function EvidenceIndexSection({ data }: { data: WorkpaperData }) {
  const rows = data.evidence ?? [];
  return (
    <Section number="B" title="Appendix — evidence index">
      <Text style={[s.soft, { marginBottom: 4 }]}>
        Every file attached to an item of the current draw, with the SHA-256 of the bytes kept.
      </Text>
      <Table
        columns={[
          { label: "Item", width: 70 },
          { label: "File", flex: 1 },
          { label: "SHA-256", flex: 1.3 },
          { label: "Attached by", width: 70 },
          { label: "When", width: 80 },
        ]}
        rows={rows.map((e) => ({
          cells: [e.reference, e.fileName, e.sha256, e.uploadedBy, formatDateTime(e.uploadedAt)],
        }))}
      />
      {rows.length === 0 && <Text style={s.soft}>No evidence files are attached.</Text>}
    </Section>
  );
}
