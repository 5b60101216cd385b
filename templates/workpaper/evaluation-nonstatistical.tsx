/** Section 6 for nonstatistical samples: the projection, key items and anomalies at actual, the total against TM. */
import { Text, View } from "@react-pdf/renderer";
import { formatMoney } from "./format";
import { Callout, SubHead, Table } from "./primitives";
import { s } from "./styles";
import type { NonstatisticalEvaluationBlock } from "./workpaper-data";

const METHOD = {
  ratio: "Σ misstatement ÷ sampled BV × remainder BV",
  difference: "Σ misstatement ÷ n × remainder items",
} as const;

export function NonstatisticalEvaluation({ e, currency }: { e: NonstatisticalEvaluationBlock; currency: string }) {
  const m = formatMoney;
  return (
    <View>
      <SubHead>{`Projected misstatement — ${e.projection} method (${currency})`}</SubHead>
      <Table
        repeatHeader={false}
        columns={[
          { label: "Measure", flex: 1 },
          { label: "Formula", width: 190 },
          { label: "Value", width: 95, align: "right" },
        ]}
        rows={[
          { cells: ["Items in the sample (outside key items)", "n", String(e.sampleCount)] },
          { cells: ["Sampled book value", "", m(e.sampleBookValue)] },
          { cells: ["Misstatement found in the sample", "book − audited", m(e.sampleMisstatement)] },
          {
            cells: [
              "Remainder the sample represents",
              "",
              `${e.remainderCount.toLocaleString("en-US")} items, ${m(e.remainderBookValue)}`,
            ],
          },
          { cells: ["Projected misstatement of the remainder", METHOD[e.projection], m(e.projectedMisstatement)] },
          { cells: [`Key items, at actual (${e.keyItemsCount})`, "examined 100 %", m(e.keyItemsMisstatement)] },
          ...(e.anomaliesCount > 0
            ? [
                {
                  cells: [
                    `Accepted anomalous misstatements, at actual (${e.anomaliesCount})`,
                    "ISA 530 ¶13",
                    m(e.anomaliesMisstatement),
                  ],
                },
              ]
            : []),
          { total: true, cells: ["Total projected misstatement", "", m(e.totalProjected)] },
          { cells: ["Tolerable misstatement", "TM", m(e.tolerableMisstatement)] },
          { cells: ["Expected misstatement used in planning", "EM", m(e.expectedMisstatement)] },
          { cells: ["“Well below” TM means at most", e.wellBelowBasis, m(e.wellBelowAmount)] },
        ]}
      />
      <Callout tone={e.verdict === "supports" ? "note" : "warning"}>
        {e.verdict === "supports"
          ? "The total projected misstatement is well below tolerable misstatement: the sample supports the recorded amount."
          : e.verdict === "approaches"
            ? "The total projected misstatement is below tolerable misstatement but not well below it: the risk that actual misstatement exceeds tolerable misstatement may be unacceptably high."
            : "The total projected misstatement reaches or exceeds tolerable misstatement: the sampling risk is unacceptably high."}
      </Callout>
      <Text style={[s.small, s.soft]}>
        {
          "No statistical bound is claimed for a nonstatistical sample: sampling risk is weighed by the auditor's judgement (PCAOB AS 2315.26)."
        }
      </Text>
      {e.responses.length > 0 && (
        <View>
          <SubHead>Usual responses</SubHead>
          {e.responses.map((r, i) => (
            <Text key={i} style={s.small}>{`• ${r}`}</Text>
          ))}
        </View>
      )}
    </View>
  );
}
