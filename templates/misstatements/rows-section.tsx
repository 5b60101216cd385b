/** Every row of the schedule, grouped: uncorrected, clearly trivial, corrected, prior period; and the samples feeding it. */
import { Text, View } from "@react-pdf/renderer";
import { KIND_LABELS, treatmentOf } from "@/lib/misstatements/labels";
import type { SummaryRow, SummaryView } from "@/lib/misstatements/types";
import { Paragraph, Section, SubHead, Table, type Column } from "../workpaper/primitives";
import { s } from "../workpaper/styles";
import { formatMoney } from "@/lib/format/number";

const COLUMNS: Column[] = [
  { label: "Ref", width: 30 },
  { label: "Kind", width: 50 },
  { label: "Account · assertion", width: 82 },
  { label: "Description", flex: 1 },
  { label: "Amount", width: 62, align: "right" },
  { label: "IS effect", width: 54, align: "right" },
  { label: "BS effect", width: 54, align: "right" },
  { label: "Allowance", width: 56, align: "right" },
];

const cells = (r: SummaryRow) => [
  r.reference,
  KIND_LABELS[r.kind],
  `${r.account} · ${r.assertion}`,
  `${r.description}${r.allowanceNote ? ` ${r.allowanceNote}` : ""}${r.frozen ? " (frozen at the sample's lock)" : ""}${r.evidenceCount ? ` · ${r.evidenceCount} evidence file${r.evidenceCount === 1 ? "" : "s"}` : ""} — ${treatmentOf(r)}`,
  formatMoney(r.amount),
  r.incomeEffect === null ? "—" : formatMoney(r.incomeEffect),
  r.balanceEffect === null ? "—" : formatMoney(r.balanceEffect),
  r.allowance === null ? "—" : formatMoney(r.allowance),
];

function Group({ title, rows }: { title: string; rows: SummaryRow[] }) {
  if (rows.length === 0) return null;
  return (
    <View>
      <SubHead>{title}</SubHead>
      <Table
        columns={COLUMNS}
        rows={rows.map((r) => ({ cells: cells(r), muted: !r.accumulated && r.kind !== "prior-period" }))}
      />
    </View>
  );
}

export function RowsSection({ view }: { view: SummaryView }) {
  const rows = view.rows;
  return (
    <View>
      <Section number="5" title="Schedule of misstatements">
        {view.conventions.map((c, i) => (
          <Paragraph key={i} style={s.soft}>
            {c}
          </Paragraph>
        ))}
        {rows.length === 0 && <Text style={s.soft}>No misstatements have been recorded.</Text>}
        <Group title="Uncorrected, accumulated" rows={rows.filter((r) => r.accumulated)} />
        <Group title="Clearly trivial — listed, not accumulated" rows={rows.filter((r) => r.clearlyTrivial)} />
        <Group title="Corrected by the client" rows={rows.filter((r) => r.corrected !== null)} />
        <Group
          title="Prior period, carried forward (current-year effect under each approach)"
          rows={rows.filter((r) => r.kind === "prior-period" && r.corrected === null)}
        />
      </Section>
      <Section number="6" title="Samples feeding the summary">
        <Table
          columns={[
            { label: "Ref", width: 34 },
            { label: "Sample", flex: 1 },
            { label: "Method", width: 60 },
            { label: "State", width: 180 },
          ]}
          rows={view.samples.map((x) => ({
            cells: [
              x.reference,
              x.name,
              x.method,
              x.state === "contributes"
                ? x.locked
                  ? x.frozen
                    ? "Locked — row frozen at lock"
                    : "Locked"
                  : "Live — not locked"
                : (x.reason ?? x.state),
            ],
          }))}
        />
      </Section>
    </View>
  );
}
