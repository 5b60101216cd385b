/** The first page's title block: what this workpaper is, for whom, and its state. */
import { Text, View } from "@react-pdf/renderer";
import { colours, s } from "./styles";
import type { WorkpaperData } from "./workpaper-data";
import { formatDate, formatDateTime } from "@/lib/format/date";

const METHOD_TITLES: Record<WorkpaperData["plan"]["method"], string> = {
  mus: "Monetary-unit sample",
  random: "Random sample — classical variables",
  systematic: "Systematic sample — classical variables",
  stratified: "Stratified random sample — classical variables",
  attribute: "Attribute sample — test of controls",
  nonstatistical: "Nonstatistical sample — key items and projected misstatement",
};

export function methodTitle(method: WorkpaperData["plan"]["method"]): string {
  return METHOD_TITLES[method];
}

function Cell({ label, value, width }: { label: string; value: string; width: string }) {
  return (
    <View style={{ width, paddingVertical: 4, paddingRight: 8 }}>
      <Text style={[s.faint, { fontSize: 6.5, lineHeight: 1.3, letterSpacing: 0.5 }]}>{label.toUpperCase()}</Text>
      <Text style={{ fontSize: 9, lineHeight: 1.3 }}>{value}</Text>
    </View>
  );
}

export function TitleBlock({ data }: { data: WorkpaperData }) {
  const state = data.lock
    ? `Locked by ${data.lock.lockedBy} (${data.lock.role}), ${formatDateTime(data.lock.lockedAt)}`
    : "Draft — not signed off, not locked";
  return (
    <View style={{ marginBottom: 4 }}>
      <Text style={[s.faint, { fontSize: 7.5, letterSpacing: 0.8 }]}>
        {methodTitle(data.plan.method).toUpperCase()}
      </Text>
      <Text style={{ fontSize: 17, lineHeight: 1.2, fontWeight: "bold", marginTop: 2, marginBottom: 8 }}>
        {data.sampleName}
      </Text>
      <View
        style={{
          flexDirection: "row",
          flexWrap: "wrap",
          borderTopWidth: 0.5,
          borderBottomWidth: 0.5,
          borderColor: colours.hairline,
          paddingVertical: 2,
        }}
      >
        <Cell label="Client" value={data.clientName} width="34%" />
        <Cell label="Engagement" value={data.engagementName} width="33%" />
        <Cell label="Period end" value={formatDate(data.periodEnd)} width="33%" />
        <Cell label="Workpaper reference" value={data.workpaperReference} width="34%" />
        <Cell label="Currency" value={data.currency} width="33%" />
        <Cell label="Generated" value={formatDateTime(data.generatedAt)} width="33%" />
      </View>
      <Text style={[{ marginTop: 5, fontSize: 8 }, data.lock ? { color: colours.ledger } : { color: colours.draft }]}>
        {state}
      </Text>
    </View>
  );
}
