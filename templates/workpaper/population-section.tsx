/** Section 2: the population, its fingerprint and its reconciliation. */
import { Text, View } from "@react-pdf/renderer";
import { Callout, Facts, Section, SubHead } from "./primitives";
import { s } from "./styles";
import type { PopulationBlock, WorkpaperData } from "./workpaper-data";
import { formatCount, formatMoney } from "@/lib/format/number";
import { formatDateTime } from "@/lib/format/date";

const RECONCILIATION = {
  agreed: "Agreed to the control total",
  explained: "Difference explained",
  unreconciled: "Not reconciled",
  "no-control-total": "No control total given",
} as const;

function Reconciliation({ p, currency }: { p: PopulationBlock; currency: string }) {
  const r = p.reconciliation;
  return (
    <View>
      <SubHead>Reconciliation</SubHead>
      <Facts
        facts={[
          { label: `Population total (${currency})`, value: formatMoney(p.total) },
          {
            label: `Control total (${currency})`,
            value:
              r.controlTotal === null
                ? "—"
                : `${formatMoney(r.controlTotal)}${r.controlSource ? ` — ${r.controlSource}` : ""}`,
          },
          { label: `Difference (${currency})`, value: formatMoney(r.difference) },
          { label: "Status", value: RECONCILIATION[r.status] },
        ]}
      />
      {r.explanation && (
        <Callout tone={r.status === "unreconciled" ? "warning" : "note"}>{`Explanation: ${r.explanation}`}</Callout>
      )}
      {r.status === "unreconciled" && !r.explanation && (
        <Callout tone="warning">
          The population does not agree to its control total and no explanation is recorded.
        </Callout>
      )}
    </View>
  );
}

export function PopulationSection({ data }: { data: WorkpaperData }) {
  const p = data.population;
  const c = data.currency;
  return (
    <Section number="2" title="Population">
      <Facts
        facts={[
          { label: "Population", value: p.name },
          { label: "Source file", value: p.sourceFile },
          { label: "SHA-256 of the file", value: p.sha256, mono: true },
          { label: "Uploaded", value: `${p.uploadedBy}, ${formatDateTime(p.uploadedAt)}` },
          { label: "Items", value: formatCount(p.itemCount) },
          { label: `Book value (${c})`, value: formatMoney(p.total) },
          { label: "Sampling frame", value: `${formatCount(p.frameCount)} items, ${c} ${formatMoney(p.frameTotal)}` },
        ]}
      />
      <Reconciliation p={p} currency={c} />
      {p.excluded && (p.excluded.zeroCount > 0 || p.excluded.negativeCount > 0) && (
        <View>
          <SubHead>Excluded from the frame</SubHead>
          <Facts
            facts={[
              { label: "Zero book values", value: `${p.excluded.zeroCount} items` },
              {
                label: "Negative book values",
                value: `${p.excluded.negativeCount} items, ${c} ${formatMoney(p.excluded.negativeTotal)}`,
              },
              { label: "How they are addressed", value: p.excluded.treatment ?? "Not recorded" },
            ]}
          />
          {!p.excluded.treatment && (
            <Text style={[s.small, s.faint]}>
              Excluded items are never selected by this sample; they need a procedure of their own.
            </Text>
          )}
        </View>
      )}
    </Section>
  );
}
