/** Section 6 for classical variables samples, plain and stratified. */
import { Text, View } from "@react-pdf/renderer";
import { estimatorName } from "./plan-section";
import { Callout, Facts, SubHead, Table, type TableRow } from "./primitives";
import { s } from "./styles";
import type { StratifiedEvaluationBlock, VariablesEvaluationBlock, VariablesResultFigures } from "./workpaper-data";
import { formatCount, formatFactor, formatMoney, formatRate } from "@/lib/format/number";
import { DIRECTION_LABELS } from "@/lib/validation/sample";

const ESTIMATE_FORMULA: Record<string, string> = {
  "mean-per-unit": "Ŷ = N · ȳ",
  difference: "Ŷ = X + N · d̄,  d = y − x",
  ratio: "Ŷ = X · Σy / Σx",
  regression: "Ŷ = N (ȳ + b (X̄ − x̄))",
  "separate-ratio": "Ŷ = Σ_h X_h · ȳ_h / x̄_h",
  "combined-ratio": "Ŷ = X · Σ N_h ȳ_h / Σ N_h x̄_h",
};

const VARIANCE_FORMULA: Record<string, string> = {
  "mean-per-unit": "v = N²(1−f) s²_y / n",
  difference: "v = N²(1−f) s²_d / n",
  ratio: "v = N²(1−f)/n · Σ(y − R x)²/(n−1)",
  regression: "v = N²(1−f)/n · Σ((y−ȳ) − b(x−x̄))²/(n−2)",
  "separate-ratio": "v = Σ_h v_h (ratio, per stratum)",
  "combined-ratio": "v = Σ_h N_h²(1−f_h)/n_h · s²(y − R_c x)_h",
};

/** Key items and accepted anomalies taken at actual outside the estimator (AS 2315.26; ISA 530 ¶13). */
function atActualRows(e: VariablesEvaluationBlock | StratifiedEvaluationBlock, estimator: string): TableRow[] {
  const a = e.atActual;
  if (!a) return [];
  return [
    {
      cells: [
        `Remainder (${a.remainderSize.toLocaleString("en-US")} items outside the key items): book value`,
        "X_r",
        formatMoney(a.remainderBookValue),
      ],
    },
    {
      cells: [
        "Remainder: estimated audited value",
        `Ŷ_r, ${ESTIMATE_FORMULA[estimator]} on the remainder`,
        formatMoney(a.remainderEstimatedAuditedValue),
      ],
    },
    { cells: ["Remainder: projected misstatement", "X_r − Ŷ_r", formatMoney(a.remainderProjectedMisstatement)] },
    {
      cells: [
        `Key items at actual (${a.keyItems.count}): book value`,
        "examined 100 %",
        formatMoney(a.keyItems.bookValue),
      ],
    },
    { cells: ["Key items: audited value", "", formatMoney(a.keyItems.auditedValue)] },
    { cells: ["Key items: misstatement", "book − audited", formatMoney(a.keyItems.misstatement)] },
    {
      cells: [
        `Accepted anomalies at actual (${a.anomalies.count})`,
        "misstatement, ISA 530 ¶13",
        formatMoney(a.anomalies.misstatement),
      ],
    },
  ];
}

function figureRows(
  e: VariablesEvaluationBlock | StratifiedEvaluationBlock,
  estimator: string,
  bookValue: string,
): TableRow[] {
  const d = e.decision;
  const coef = d.distribution === "t" ? `Student t_α (${d.degreesOfFreedom?.toFixed(1)} df)` : "Normal quantile z_α";
  const rows: TableRow[] = [
    ...atActualRows(e, estimator),
    {
      cells: [
        "Estimated audited value",
        e.atActual ? "Ŷ_r + key items' audited value − anomalies" : ESTIMATE_FORMULA[estimator],
        formatMoney(e.estimatedAuditedValue),
      ],
    },
    { cells: ["Projected misstatement", "X − Ŷ", formatMoney(e.projectedMisstatement)] },
    { cells: ["Standard error", `√v,  ${VARIANCE_FORMULA[estimator]}`, formatMoney(e.standardError)] },
    {
      cells: [
        `${coef}, ${d.coefficientSides === "two" ? "two-sided" : "one-sided"}`,
        `risk of incorrect rejection ${formatRate(d.riskOfIncorrectRejection, 1)}`,
        formatFactor(d.coefficient),
      ],
    },
    { cells: ["Planned allowance A", "(TM − EM) · z_α / (z_α + z_β)", formatMoney(d.plannedAllowance)] },
    { cells: ["Achieved allowance A′", "z_α · SE", formatMoney(d.achievedAllowance)] },
  ];
  if (d.adjustedAllowance !== null)
    rows.push({ cells: ["Adjusted allowance A″ (A′ > A)", "A′ + TM · (1 − A′/A)", formatMoney(d.adjustedAllowance)] });
  if (d.lowerLimit !== null) rows.push({ cells: ["Lower limit", "Ŷ − allowance", formatMoney(d.lowerLimit)] });
  if (d.upperLimit !== null) rows.push({ cells: ["Upper limit", "Ŷ + allowance", formatMoney(d.upperLimit)] });
  rows.push({ total: true, cells: ["Recorded book value", "X", formatMoney(bookValue)] });
  rows.push({
    cells: [
      "Beyond the nearest limit",
      d.beyond === null ? "within the interval" : d.beyond === "upper" ? "X − upper limit" : "lower limit − X",
      formatMoney(d.beyondLimit),
    ],
  });
  return rows;
}

function Against({ e }: { e: VariablesResultFigures }) {
  return <Callout>{e.decision.rule}</Callout>;
}

const FIGURE_COLUMNS = [
  { label: "Measure", flex: 1 },
  { label: "Formula", width: 200 },
  { label: "Amount", width: 100, align: "right" as const },
];

export function VariablesEvaluation({ e, currency }: { e: VariablesEvaluationBlock; currency: string }) {
  return (
    <View>
      <Facts
        facts={[
          { label: "Estimator", value: estimatorName(e.estimator) },
          {
            label: "Confidence",
            value: `${formatRate(e.confidence, 0)} (risk of incorrect acceptance ${formatRate(e.decision.riskOfIncorrectAcceptance, 0)}), tested for ${DIRECTION_LABELS[e.decision.direction].toLowerCase()}`,
          },
          {
            label: "Population",
            value: `N = ${formatCount(e.populationSize)} items, X = ${currency} ${formatMoney(e.populationBookValue)}`,
          },
          {
            label: "Sample",
            value: `n = ${e.sampleSize}, book ${formatMoney(e.sampleBookValue)}, audited ${formatMoney(e.sampleAuditedValue)}`,
          },
          { label: "Items with a misstatement", value: String(e.misstatementsInSample) },
        ]}
      />
      <SubHead>{`Evaluation (${currency})`}</SubHead>
      <Table repeatHeader={false} columns={FIGURE_COLUMNS} rows={figureRows(e, e.estimator, e.populationBookValue)} />
      <Against e={e} />
    </View>
  );
}

export function StratifiedEvaluation({ e, currency }: { e: StratifiedEvaluationBlock; currency: string }) {
  return (
    <View>
      <Facts
        facts={[
          { label: "Estimator", value: `${estimatorName(e.estimator)} (stratified)` },
          {
            label: "Confidence",
            value: `${formatRate(e.confidence, 0)} (risk of incorrect acceptance ${formatRate(e.decision.riskOfIncorrectAcceptance, 0)}), tested for ${DIRECTION_LABELS[e.decision.direction].toLowerCase()}`,
          },
          {
            label: "Population",
            value: `N = ${formatCount(e.populationSize)} items, X = ${currency} ${formatMoney(e.populationBookValue)}`,
          },
          { label: "Items with a misstatement", value: String(e.misstatementsInSample) },
        ]}
      />
      <SubHead>{`Strata (${currency})`}</SubHead>
      <Table
        columns={[
          { label: "h", width: 16, align: "right" },
          { label: "Band", flex: 1 },
          { label: "N_h", width: 34, align: "right" },
          { label: "X_h", width: 66, align: "right" },
          { label: "n_h", width: 26, align: "right" },
          { label: "Sample book", width: 60, align: "right" },
          { label: "Sample audited", width: 60, align: "right" },
          { label: "Miss.", width: 26, align: "right" },
          { label: "Ŷ_h", width: 66, align: "right" },
          { label: "SE_h", width: 54, align: "right" },
        ]}
        rows={e.strata.map((st) => ({
          cells: [
            String(st.number),
            st.label,
            formatCount(st.populationSize),
            formatMoney(st.populationBookValue),
            String(st.sampleSize),
            formatMoney(st.sampleBookValue),
            formatMoney(st.sampleAuditedValue),
            String(st.misstatementsInSample),
            formatMoney(st.estimatedAuditedValue),
            formatMoney(st.standardError),
          ],
        }))}
      />
      <Text style={[s.small, s.faint, { marginTop: 2 }]}>
        Standard errors combine as √(Σ SE_h²): the strata are sampled independently.
      </Text>
      <SubHead>{`Evaluation (${currency})`}</SubHead>
      <Table repeatHeader={false} columns={FIGURE_COLUMNS} rows={figureRows(e, e.estimator, e.populationBookValue)} />
      <Against e={e} />
    </View>
  );
}
