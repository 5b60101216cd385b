/** Section 3, continued: the estimator advisor run kept with the plan as the rationale for the method. */
import { Text, View } from "@react-pdf/renderer";
import { Callout, Facts, Paragraph, SubHead, Table } from "./primitives";
import { s } from "./styles";
import type { WorkpaperData } from "./workpaper-data";
import { formatCount, formatMoney, formatRate } from "@/lib/format/number";
import { formatDateTime } from "@/lib/format/date";

export function MethodRationale({ data }: { data: WorkpaperData }) {
  const r = data.methodRationale;
  if (!r) return null;
  const c = data.currency;
  return (
    <View>
      <SubHead>Rationale for the method: estimator advisor (run {r.runId})</SubHead>
      <Paragraph>
        Before the sample was drawn, each estimator was simulated on this population&rsquo;s book values with audited
        values made up from assumed misstatements. The figures describe the assumption, not evidence.
      </Paragraph>
      <Facts
        facts={[
          { label: "Assumed misstatements", value: r.scenario },
          {
            label: `True audited total under it (${c})`,
            value: `${formatMoney(r.trueAuditedTotal)} (misstatement ${formatMoney(r.trueMisstatement)})`,
          },
          {
            label: "Trials and seed",
            value: `${formatCount(r.trials)} per sample size; seed ${r.seed} (${r.seedSource})`,
            mono: true,
          },
          { label: "Bound tested", value: r.bound },
          { label: "Run", value: `${formatDateTime(r.ranAt)} by ${r.ranBy}` },
          {
            label: "Recommended",
            value: r.recommended ? `${r.recommended} at n = ${r.atSize}` : `none at n = ${r.atSize}`,
          },
        ]}
      />
      {r.keptReason && (
        <Callout tone="warning">
          <Text>Kept as the rationale with this reason: {r.keptReason}</Text>
        </Callout>
      )}
      <Table
        columns={[
          { label: "n", width: 36, align: "right" },
          { label: "Estimator", flex: 1 },
          { label: `Bias (${c})`, width: 72, align: "right" },
          { label: "Std deviation", width: 72, align: "right" },
          { label: "RMSE", width: 72, align: "right" },
          { label: "Coverage", width: 52, align: "right" },
          { label: "Mean allowance", width: 76, align: "right" },
        ]}
        rows={r.rows.map((row) => ({
          cells: [
            String(row.sampleSize),
            row.recommended ? `${row.estimator} (recommended)` : row.estimator,
            formatMoney(row.bias),
            formatMoney(row.standardDeviation),
            formatMoney(row.rmse),
            formatRate(row.coverage, 1),
            formatMoney(row.meanAllowance),
          ],
          total: row.recommended,
        }))}
      />
      <Text style={[s.small, s.faint, { marginTop: 2 }]}>
        Coverage: share of trials whose bound held the true audited total; below {formatRate(r.coverageFloor, 1)} (the
        confidence less two Monte Carlo standard errors) counts as short. RMSE² = bias² + standard deviation².
      </Text>
      <Callout>
        <Text>{r.summary}</Text>
        {r.reasons.map((reason, i) => (
          <Text key={i}>• {reason}</Text>
        ))}
        {r.tradeOff && <Text>{r.tradeOff}</Text>}
      </Callout>
      {r.planChanged && (
        <Callout tone="warning">
          The plan was changed after this run; the figures were simulated for the plan as it was then.
        </Callout>
      )}
      {r.notes.map((n, i) => (
        <Text key={i} style={[s.small, s.faint]}>
          {n}
        </Text>
      ))}
    </View>
  );
}
