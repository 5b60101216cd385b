/** Section 6 for monetary-unit samples: the Stringer bound, each direction on its own. */
import { Text, View } from "@react-pdf/renderer";
import { Callout, Facts, SubHead, Table } from "./primitives";
import { s } from "./styles";
import type { MusEvaluationBlock, StringerSide } from "./workpaper-data";
import { formatFactor, formatMoney, formatRate } from "@/lib/format/number";

function RankedTaintings({ title, side, currency }: { title: string; side: StringerSide; currency: string }) {
  return (
    <View>
      <SubHead>{title}</SubHead>
      {side.rows.length === 0 ? (
        <Text style={s.soft}>
          No taintings in this direction: the upper limit is the basic precision plus any top-stratum misstatement.
        </Text>
      ) : (
        <Table
          columns={[
            { label: "k", width: 18, align: "right" },
            { label: "Item", flex: 1 },
            { label: `Book (${currency})`, width: 62, align: "right" },
            { label: `Audited (${currency})`, width: 62, align: "right" },
            { label: "Tainting t", width: 48, align: "right" },
            { label: "RF(k)", width: 40, align: "right" },
            { label: "RF(k)−RF(k−1)", width: 58, align: "right" },
            { label: "Projected t·J", width: 62, align: "right" },
            { label: "Allowance", width: 60, align: "right" },
          ]}
          rows={side.rows.map((r) => ({
            cells: [
              String(r.rank),
              r.reference,
              formatMoney(r.bookValue),
              formatMoney(r.auditedValue),
              formatRate(r.tainting),
              formatFactor(r.factor),
              formatFactor(r.factorIncrement),
              formatMoney(r.projected),
              formatMoney(r.incrementalAllowance),
            ],
          }))}
        />
      )}
    </View>
  );
}

export function MusEvaluation({ e, currency }: { e: MusEvaluationBlock; currency: string }) {
  const o = e.overstatement;
  const u = e.understatement;
  const both = (label: string, formula: string, a: string, b: string, total = false) => ({
    total,
    cells: [label, formula, a, b],
  });
  return (
    <View>
      <Facts
        facts={[
          { label: "Confidence", value: formatRate(e.confidence, 0) },
          {
            label: "Limits compared with TM",
            value:
              e.limits === "gross"
                ? "Gross: each direction's upper limit as it stands (firm setting)"
                : "Net: less the other direction's projected misstatement (firm setting)",
          },
          { label: `Sampling interval J (${currency})`, value: formatMoney(e.interval) },
          {
            label: "Reliability factors",
            value:
              e.factorMode === "exact" ? "Exact Poisson (gamma quantile)" : "Table (Poisson, rounded up to 2 decimals)",
          },
          { label: "Items below the interval", value: String(e.sampleItems) },
          {
            label: "Top stratum (at actual)",
            value: `${e.topStratum.count} items, book ${formatMoney(e.topStratum.bookValue)}, audited ${formatMoney(e.topStratum.auditedValue)}`,
          },
        ]}
      />
      <SubHead>Upper misstatement limits</SubHead>
      <Table
        repeatHeader={false}
        columns={[
          { label: "Component", flex: 1 },
          { label: "Formula", width: 130 },
          { label: `Overstatement (${currency})`, width: 95, align: "right" },
          { label: `Understatement (${currency})`, width: 95, align: "right" },
        ]}
        rows={[
          both(
            `Basic precision (RF(0) = ${formatFactor(o.basicPrecisionFactor)})`,
            "RF(0) · J",
            formatMoney(o.basicPrecision),
            formatMoney(u.basicPrecision),
          ),
          both(
            "Projected from the sample",
            "Σ t_k · J",
            formatMoney(o.projectedFromSample),
            formatMoney(u.projectedFromSample),
          ),
          both(
            "Top stratum, at actual",
            "Σ (book − audited)",
            formatMoney(o.topStratumMisstatement),
            formatMoney(u.topStratumMisstatement),
          ),
          both(
            "Incremental allowance",
            "Σ (RF(k)−RF(k−1)−1) · t_k · J",
            formatMoney(o.incrementalAllowance),
            formatMoney(u.incrementalAllowance),
          ),
          both(
            "Upper misstatement limit",
            "sum of the above",
            formatMoney(o.upperLimit),
            formatMoney(u.upperLimit),
            true,
          ),
          both("Less projected in the other direction", "", formatMoney(u.projected), formatMoney(o.projected)),
          both(
            "Net upper misstatement limit",
            "",
            formatMoney(e.netUpperLimits.overstatement),
            formatMoney(e.netUpperLimits.understatement),
            true,
          ),
        ]}
      />
      <View style={{ marginTop: 6 }}>
        <Facts
          facts={[
            {
              label: `Most likely misstatement (${currency})`,
              value: `${formatMoney(e.mostLikelyMisstatement)} (projected overstatement less projected understatement)`,
            },
            { label: `Tolerable misstatement (${currency})`, value: formatMoney(e.tolerableMisstatement) },
          ]}
        />
      </View>
      <Callout>{e.statement}</Callout>
      {e.understatementCaution && <Callout tone="warning">{e.understatementCaution}</Callout>}
      <RankedTaintings title="Overstatement taintings, ranked" side={o} currency={currency} />
      <RankedTaintings title="Understatement taintings, ranked" side={u} currency={currency} />
    </View>
  );
}
