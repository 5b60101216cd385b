/** Section 6 for nonstatistical samples: the projection, key items and anomalies at actual, the total against TM. */
import { Text, View } from "@react-pdf/renderer";
import { Callout, SubHead, Table } from "./primitives";
import { s } from "./styles";
import type { NonstatisticalEvaluationBlock } from "./workpaper-data";
import { formatMoney } from "@/lib/format/number";
import { DIRECTION_LABELS } from "@/lib/validation/sample";

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
          { cells: ["Items in the sample with a result (outside key items)", "n", String(e.sampleCount)] },
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
          {
            cells: [
              `Key items, at actual (${e.keyItems.evaluated} of ${e.keyItems.planned} with a result)`,
              "examined 100 %",
              m(e.keyItems.misstatement),
            ],
          },
          {
            cells: [
              `Accepted anomalous misstatements, at actual (${e.anomalies.count})`,
              "ISA 530 ¶13",
              m(e.anomalies.misstatement),
            ],
          },
          { total: true, cells: ["Total projected misstatement", "", m(e.totalProjected)] },
          ...(e.comparedAmount !== e.totalProjected
            ? [
                {
                  cells: [
                    `Compared with TM (${DIRECTION_LABELS[e.direction].toLowerCase()} tested)`,
                    "",
                    m(e.comparedAmount),
                  ],
                },
              ]
            : []),
          { cells: ["Tolerable misstatement", "TM", m(e.tolerableMisstatement)] },
          { cells: ["Expected misstatement used in planning", "EM", m(e.expectedMisstatement)] },
          { cells: ["“Well below” TM means at most", e.wellBelowBasis, m(e.wellBelowAmount)] },
        ]}
      />
      <Callout tone={e.supported ? "note" : "warning"}>{e.statement}</Callout>
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
