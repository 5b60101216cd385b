/** The summary of misstatements as its own workpaper, in the house style of the sample workpaper. */
import type { ReactNode } from "react";
import { Document, Page, Text, View } from "@react-pdf/renderer";
import type { SummaryView } from "@/lib/misstatements/types";
import { DraftWatermark, Footer, RunningHeader, type PageFrameData } from "../workpaper/page-frame";
import { Callout, Facts, Paragraph, Section } from "../workpaper/primitives";
import { colours, s } from "../workpaper/styles";
import { BuildUpBars } from "./build-up-bars";
import { RowsSection } from "./rows-section";
import { ReviewSection } from "./review-section";
import { formatDate, formatDateTime } from "@/lib/format/date";
import { formatMoney } from "@/lib/format/number";

function Sheet({ frame, children }: { frame: PageFrameData; children: ReactNode }) {
  return (
    <Page size="A4" style={s.page} wrap>
      {frame.draft && <DraftWatermark />}
      <RunningHeader data={frame} />
      <View style={s.body}>{children}</View>
      <Footer data={frame} />
    </Page>
  );
}

const TONE: Record<SummaryView["status"]["level"], string> = {
  "well-within": colours.ledger,
  approaching: colours.warn,
  "exceeds-performance": colours.draft,
  "exceeds-overall": colours.draft,
};

export function SummaryDocument({ view, draft }: { view: SummaryView; draft: boolean }) {
  const frame: PageFrameData = {
    firmName: view.firmName,
    clientName: view.engagement.clientName,
    engagementName: view.engagement.name,
    periodEnd: view.engagement.periodEnd,
    workpaperReference: view.workpaperReference,
    draft,
    caution: view.caution,
  };
  const m = view.materiality,
    t = view.totals;
  const money = (v: string) => `${m.currency} ${formatMoney(v)}`;
  return (
    <Document
      title={`${view.workpaperReference} — Summary of misstatements${draft ? " (draft)" : ""}`}
      author={view.firmName}
      subject={`${view.engagement.clientName} · ${view.engagement.name}`}
      creator="Sondage"
      producer="Sondage"
      language="en"
    >
      <Sheet frame={frame}>
        <Text style={[s.faint, { fontSize: 7.5, letterSpacing: 0.8 }]}>SUMMARY OF MISSTATEMENTS</Text>
        <Text
          style={{ fontSize: 17, lineHeight: 1.2, fontWeight: "bold", marginTop: 2, marginBottom: 6 }}
        >{`${view.engagement.clientName} — period ended ${formatDate(view.engagement.periodEnd)}`}</Text>
        <Text style={s.soft}>
          {view.review.lock
            ? `Locked by ${view.review.lock.name}, ${formatDateTime(view.review.lock.at)}`
            : `Draft generated ${formatDateTime(view.generatedAt)} — not locked`}
        </Text>

        <Section number="1" title="Materiality">
          <Facts
            facts={[
              { label: "Overall materiality", value: money(m.overall) },
              { label: "Performance materiality", value: money(m.performance) },
              { label: "Clearly trivial threshold", value: money(m.clearlyTrivial) },
              {
                label: "Approaching above",
                value: `${Math.round(m.approachingShare * 10000) / 100} % of performance materiality = ${money(view.status.threshold)} (${view.status.approachingShareSource})`,
              },
            ]}
          />
        </Section>

        <Section number="2" title="Status">
          <View
            style={{ borderLeftWidth: 3, borderLeftColor: TONE[view.status.level], paddingLeft: 8, marginBottom: 4 }}
            wrap={false}
          >
            <Text style={[s.bold, { fontSize: 11, color: TONE[view.status.level] }]}>{view.status.label}</Text>
            <Text>{view.status.words}</Text>
          </View>
          {view.status.allowanceWarning && <Callout tone="warning">{view.status.allowanceWarning}</Callout>}
          {view.status.responses.map((r, i) => (
            <Paragraph key={i}>{`• ${r}`}</Paragraph>
          ))}
        </Section>

        <Section number="3" title="Totals against materiality">
          <Facts
            facts={[
              { label: "Uncorrected factual", value: money(t.uncorrected.factual) },
              { label: "Uncorrected judgemental", value: money(t.uncorrected.judgemental) },
              { label: "Uncorrected projected", value: money(t.uncorrected.projected) },
              { label: "Uncorrected, current year", value: money(t.uncorrected.currentYear) },
              { label: "Gross, without offsetting", value: money(t.uncorrected.gross) },
              {
                label: "Corrected by the client",
                value: `${money(t.corrected.total)} (${t.corrected.count}, not accumulated)`,
              },
              {
                label: "Clearly trivial",
                value: `${money(t.clearlyTrivial.total)} (${t.clearlyTrivial.count}, listed, not accumulated)`,
              },
            ]}
          />
          <ApproachTable view={view} />
          <Facts
            facts={[
              {
                label: "Sum of sampling allowances",
                value: `${money(t.allowance.sum)} (${t.allowance.samples} sample${t.allowance.samples === 1 ? "" : "s"}, conservative)`,
              },
              { label: "Larger total + allowances", value: money(t.upperEstimate) },
            ]}
          />
          <Callout>{t.allowance.note}</Callout>
        </Section>
      </Sheet>
      <Sheet frame={frame}>
        <BuildUpBars view={view} />
        <RowsSection view={view} />
      </Sheet>
      <Sheet frame={frame}>
        <ReviewSection view={view} />
      </Sheet>
    </Document>
  );
}

function ApproachTable({ view }: { view: SummaryView }) {
  const is = view.totals.incomeStatementApproach,
    bs = view.totals.balanceSheetApproach;
  const line = (label: string, a: string, b: string, bold = false) => (
    <View style={bold ? s.totalRow : s.row} wrap={false}>
      <Text style={[s.cell, { flex: 1 }, bold ? s.bold : {}]}>{label}</Text>
      <Text style={[s.cell, s.right, { width: 130 }, bold ? s.bold : {}]}>{formatMoney(a)}</Text>
      <Text style={[s.cell, s.right, { width: 130 }, bold ? s.bold : {}]}>{formatMoney(b)}</Text>
    </View>
  );
  return (
    <View style={[s.table, { marginVertical: 6 }]} wrap={false}>
      <View style={s.headRow}>
        <Text style={[s.cell, s.headCell, { flex: 1 }]}>
          Prior-period misstatements carried forward — two approaches, never mixed
        </Text>
        <Text style={[s.cell, s.headCell, s.right, { width: 130 }]}>Income statement (rollover)</Text>
        <Text style={[s.cell, s.headCell, s.right, { width: 130 }]}>Balance sheet (iron curtain)</Text>
      </View>
      {line("Uncorrected, current year", view.totals.uncorrected.currentYear, view.totals.uncorrected.currentYear)}
      {line("Prior-period effect under the approach", is.priorPeriod, bs.priorPeriod)}
      {line("Total uncorrected misstatement", is.total, bs.total, true)}
      {line("Margin to performance materiality", is.marginToPerformance, bs.marginToPerformance)}
      {line("Margin to overall materiality", is.marginToOverall, bs.marginToOverall)}
    </View>
  );
}
