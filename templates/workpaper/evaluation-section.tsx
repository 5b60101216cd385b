/** Section 6: the evaluation table for the sample's method, with its formula references and warnings. */
import { Text, View } from "@react-pdf/renderer";
import { AttributesEvaluation } from "./evaluation-attributes";
import { NonstatisticalEvaluation } from "./evaluation-nonstatistical";
import { MusEvaluation } from "./evaluation-mus";
import { StratifiedEvaluation, VariablesEvaluation } from "./evaluation-variables";
import { Callout, Section, SubHead } from "./primitives";
import { s } from "./styles";
import type { EvaluationBlock, WorkpaperData } from "./workpaper-data";

function Body({ e, currency }: { e: EvaluationBlock; currency: string }) {
  switch (e.method) {
    case "mus":
      return <MusEvaluation e={e} currency={currency} />;
    case "variables":
      return <VariablesEvaluation e={e} currency={currency} />;
    case "stratified":
      return <StratifiedEvaluation e={e} currency={currency} />;
    case "attributes":
      return <AttributesEvaluation e={e} />;
    case "nonstatistical":
      return <NonstatisticalEvaluation e={e} currency={currency} />;
  }
}

export function EvaluationSection({ data }: { data: WorkpaperData }) {
  const e = data.evaluation;
  if (!e) {
    return (
      <Section number="6" title="Evaluation">
        <Callout tone="warning">{`Not evaluated yet: ${data.conclusion.computed.statement}`}</Callout>
      </Section>
    );
  }
  return (
    <Section number="6" title="Evaluation">
      <Body e={e} currency={data.currency} />
      {e.warnings.map((w, i) => (
        <Callout key={i} tone="warning">
          {w}
        </Callout>
      ))}
      <View wrap={false}>
        <SubHead>Formula references</SubHead>
        {e.formulaReferences.map((ref, i) => (
          <Text key={i} style={[s.small, s.soft]}>{`[${i + 1}] ${ref}`}</Text>
        ))}
      </View>
    </Section>
  );
}
