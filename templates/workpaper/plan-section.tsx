/** Section 3: the method, its parameters and the sample-size computation. */
import { Text, View } from "@react-pdf/renderer";
import { Callout, Facts, Section, SubHead, Table } from "./primitives";
import { s } from "./styles";
import { methodTitle } from "./title-block";
import { MethodRationale } from "./method-rationale-section";
import { SizingFacts } from "./key-items-section";
import type { PlanBlock, WorkpaperData } from "./workpaper-data";
import { formatCount, formatMoney } from "@/lib/format/number";
import { formatByKind } from "@/templates/workpaper/parameter-value";

const ESTIMATORS: Record<string, string> = {
  "mean-per-unit": "Mean per unit",
  difference: "Difference",
  ratio: "Ratio",
  regression: "Regression",
  "separate-ratio": "Separate ratio",
  "combined-ratio": "Combined ratio",
};

export function estimatorName(estimator: string): string {
  return ESTIMATORS[estimator] ?? estimator;
}

function SizeComputation({ plan }: { plan: PlanBlock }) {
  return (
    <View wrap={false}>
      <SubHead>Sample-size computation</SubHead>
      <View style={s.callout}>
        <Text style={s.formula}>{plan.formula.text}</Text>
        {plan.formula.substituted && <Text style={s.formula}>{plan.formula.substituted}</Text>}
        <Text style={[s.small, s.faint, { marginTop: 2 }]}>Source: {plan.formula.source}</Text>
      </View>
      <Table
        repeatHeader={false}
        columns={[
          { label: "Symbol", width: 60 },
          { label: "Meaning", flex: 1 },
          { label: "Value", width: 110, align: "right" },
        ]}
        rows={plan.formula.inputs.map((input) => ({
          cells: [input.symbol, input.meaning, formatByKind(input.kind, input.value)],
        }))}
      />
    </View>
  );
}

function StrataPlan({ plan, currency }: { plan: PlanBlock; currency: string }) {
  if (!plan.strata) return null;
  return (
    <View>
      <SubHead>Strata</SubHead>
      <Table
        columns={[
          { label: "Stratum", width: 44 },
          { label: "Book-value band", flex: 1 },
          { label: "Items", width: 60, align: "right" },
          { label: `Book value (${currency})`, width: 110, align: "right" },
          { label: "Sample", width: 55, align: "right" },
        ]}
        rows={plan.strata.map((st) => ({
          cells: [
            String(st.number),
            st.label,
            formatCount(st.populationSize),
            formatMoney(st.bookValue),
            String(st.sampleSize),
          ],
        }))}
      />
    </View>
  );
}

export function PlanSection({ data }: { data: WorkpaperData }) {
  const plan = data.plan;
  const c = data.currency;
  const sizeFacts = [
    { label: "Computed sample size", value: formatCount(plan.computedSize) },
    { label: "Chosen sample size", value: formatCount(plan.chosenSize) },
    ...(plan.allowedDeviations !== null
      ? [{ label: "Deviations allowed by the plan", value: String(plan.allowedDeviations) }]
      : []),
    ...(plan.interval !== null ? [{ label: `Sampling interval (${c})`, value: formatMoney(plan.interval) }] : []),
    ...(plan.topStratumThreshold !== null
      ? [{ label: `Top stratum from (${c})`, value: formatMoney(plan.topStratumThreshold) }]
      : []),
    ...(plan.topStratum
      ? [
          {
            label: "Top stratum",
            value: `${plan.topStratum.count} items, ${c} ${formatMoney(plan.topStratum.total)}, examined 100%`,
          },
        ]
      : []),
  ];
  return (
    <Section number="3" title="Method and sample size">
      <Facts
        facts={[
          { label: "Method", value: methodTitle(plan.method) },
          ...(plan.estimator ? [{ label: "Estimator", value: estimatorName(plan.estimator) }] : []),
          ...plan.parameters.map((p) => ({ label: p.label, value: formatByKind(p.kind, p.value) })),
        ]}
      />
      {data.sizing && <SizingFacts sizing={data.sizing} />}
      <SizeComputation plan={plan} />
      <View style={{ marginTop: 6 }}>
        <Facts facts={sizeFacts} />
      </View>
      {plan.chosenSize !== plan.computedSize && (
        <Callout tone={plan.sizeReason ? "note" : "warning"}>
          {`The chosen size ${plan.chosenSize > plan.computedSize ? "exceeds" : "is below"} the computed size. Reason: ${plan.sizeReason ?? "not recorded"}`}
        </Callout>
      )}
      <StrataPlan plan={plan} currency={c} />
      {plan.warnings.map((w, i) => (
        <Callout key={i} tone="warning">
          {w}
        </Callout>
      ))}
      <MethodRationale data={data} />
    </Section>
  );
}
