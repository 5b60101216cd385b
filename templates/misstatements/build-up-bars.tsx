/** The build-up of uncorrected misstatement against performance and overall materiality, drawn as bars. */
import { Text, View } from "@react-pdf/renderer";
import type { SummaryView } from "@/lib/misstatements/types";
import { Section } from "../workpaper/primitives";
import { colours, s } from "../workpaper/styles";
import { formatMoney } from "@/lib/format/number";

const WIDTH = 330;

export function BuildUpBars({ view }: { view: SummaryView }) {
  const t = view.totals;
  const bars = [
    { label: "Factual", value: Number(t.uncorrected.factual) },
    { label: "Judgemental", value: Number(t.uncorrected.judgemental) },
    { label: "Projected", value: Number(t.uncorrected.projected) },
    { label: "Total (income statement)", value: Number(t.incomeStatementApproach.total) },
    { label: "Total (balance sheet)", value: Number(t.balanceSheetApproach.total) },
    { label: "+ sum of allowances", value: Number(t.upperEstimate) },
  ];
  const overall = Number(view.materiality.overall);
  const scale = Math.max(overall, ...bars.map((b) => Math.abs(b.value))) * 1.05 || 1;
  const x = (v: number) => (Math.abs(v) / scale) * WIDTH;
  const line = (v: number, colour: string) => ({
    position: "absolute" as const,
    left: 110 + x(v),
    top: 0,
    bottom: 0,
    width: 1,
    backgroundColor: colour,
  });
  return (
    <Section number="4" title="Build-up against materiality" keepTogether>
      <View style={{ position: "relative" }}>
        {bars.map((b) => (
          <View key={b.label} style={{ flexDirection: "row", alignItems: "center", height: 13 }}>
            <Text style={[s.small, { width: 110 }]}>{b.label}</Text>
            <View
              style={{
                width: Math.max(x(b.value), 0.5),
                height: 8,
                backgroundColor: b.value < 0 ? colours.faint : colours.ledger,
              }}
            />
            <Text style={[s.small, { marginLeft: 4 }]}>{formatMoney(b.value.toFixed(2))}</Text>
          </View>
        ))}
        <View style={line(Number(view.materiality.performance), colours.warn)} />
        <View style={line(overall, colours.draft)} />
      </View>
      <Text
        style={[s.faint, s.small, { marginTop: 2 }]}
      >{`Lines: performance materiality ${formatMoney(view.materiality.performance)} (amber), overall materiality ${formatMoney(view.materiality.overall)} (red). Bars show absolute values; grey bars are net understatements.`}</Text>
    </Section>
  );
}
