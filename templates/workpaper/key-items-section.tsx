/** Sizing from the risk assessment, key items examined 100 %, haphazard picks and anomalies (issue 15, issue 14 §4). */
import { Text, View } from "@react-pdf/renderer";
import { formatMoney, formatRate, formatTime } from "./format";
import { Callout, Facts, SubHead, Table } from "./primitives";
import { s } from "./styles";
import type { SizingBlock, WorkpaperData } from "./workpaper-data";

const RISK: Record<string, string> = {
  maximum: "Maximum",
  "slightly-below-maximum": "Slightly below maximum",
  moderate: "Moderate",
  low: "Low",
};
const risk = (r: string | null) => (r ? (RISK[r] ?? r) : "not recorded");

export function SizingFacts({ sizing }: { sizing: SizingBlock }) {
  const table =
    sizing.tableVersion === 0
      ? "shipped defaults (version 0; AICPA Audit Guide layout, values from memory — to be confirmed by the firm)"
      : `firm methodology version ${sizing.tableVersion}`;
  return (
    <View wrap={false}>
      <SubHead>Sizing from the risk assessment</SubHead>
      <Facts
        facts={[
          {
            label: "Basis",
            value:
              sizing.basis === "risk-assessment"
                ? "The two assessed risks, through the firm's assurance-factor table"
                : sizing.basis === "confidence-override"
                  ? "Typed confidence overriding the risk assessment"
                  : "Typed confidence (planned without a risk assessment)",
          },
          { label: "Assessed risk of material misstatement", value: risk(sizing.assessedRisk) },
          { label: "Risk other substantive procedures fail to detect", value: risk(sizing.otherProceduresRisk) },
          ...(sizing.tableFactor !== null
            ? [
                {
                  label: "Table cell",
                  value: `factor ${sizing.tableFactor.toFixed(2)}, confidence ${formatRate(sizing.tableConfidence ?? 0, 1)}`,
                },
              ]
            : []),
          {
            label: "Used",
            value: `assurance factor ${sizing.factor.toFixed(2)}, confidence ${formatRate(sizing.confidence, 1)}`,
          },
          { label: "Table version", value: table },
          ...(sizing.overrideReason ? [{ label: "Reason for the override", value: sizing.overrideReason }] : []),
        ]}
      />
    </View>
  );
}

export function KeyItemsAndPicks({ data }: { data: WorkpaperData }) {
  const k = data.keyItems,
    picks = data.picks,
    anomalies = data.anomalies ?? [];
  if (!k && !picks && anomalies.length === 0) return null;
  return (
    <View>
      {k && (
        <View>
          <SubHead>{`Key items examined 100 % (${k.count}, ${formatMoney(k.total)} ${data.currency})`}</SubHead>
          <Text
            style={[s.small, s.soft]}
          >{`${k.threshold ? `Every item at or above ${formatMoney(k.threshold)}, and items` : "Items"} chosen by the auditor with a reason. They are kept apart: the sample is sized and drawn on the remaining ${k.remainder.count.toLocaleString("en-US")} items (${formatMoney(k.remainder.total)}), and each key item's misstatement is added at its actual amount.`}</Text>
          <Table
            columns={[
              { label: "Item", width: 80 },
              { label: "Row", width: 40, align: "right" },
              { label: "Book value", width: 80, align: "right" },
              { label: "Why", flex: 1 },
              { label: "Misstatement", width: 75, align: "right" },
            ]}
            rows={k.items.map((i) => ({
              cells: [
                i.reference,
                String(i.rowNumber),
                formatMoney(i.bookValue),
                i.basis === "threshold"
                  ? `at or above the threshold${i.reason ? `; ${i.reason}` : ""}`
                  : (i.reason ?? ""),
                i.misstatement === null ? "—" : formatMoney(i.misstatement),
              ],
            }))}
          />
        </View>
      )}
      {picks && (
        <View>
          <SubHead>{`Haphazard picks (${picks.length})`}</SubHead>
          <Callout tone="warning">
            {
              "A haphazard selection cannot be re-performed by a seed: the items below were picked by the auditor on the population's item grid, avoiding conscious bias (ISA 530, Appendix 4(d)); who picked each and when is recorded."
            }
          </Callout>
          <Table
            columns={[
              { label: "Item", width: 90 },
              { label: "Row", width: 45, align: "right" },
              { label: "Book value", width: 85, align: "right" },
              { label: "Picked by", flex: 1 },
              { label: "When (UTC)", width: 110 },
            ]}
            rows={picks.map((p) => ({
              cells: [
                p.reference,
                String(p.rowNumber),
                formatMoney(p.bookValue),
                p.pickedBy ?? "",
                formatTime(p.pickedAt),
              ],
            }))}
          />
        </View>
      )}
      {anomalies.length > 0 && (
        <View>
          <SubHead>Misstatements marked anomalous</SubHead>
          <Table
            columns={[
              { label: "Item", width: 70 },
              { label: "Misstatement", width: 70, align: "right" },
              { label: "Justification", flex: 1 },
              { label: "Marked / accepted", width: 120 },
              { label: "Treatment", width: 110 },
            ]}
            rows={anomalies.map((a) => ({
              cells: [
                a.reference,
                a.misstatement === null ? "—" : formatMoney(a.misstatement),
                a.justification,
                `${a.markedBy ?? ""} ${formatTime(a.markedAt)}\n${a.acceptedBy ? `${a.acceptedBy} ${formatTime(a.acceptedAt)}` : "not accepted"}`,
                a.treatment,
              ],
            }))}
          />
        </View>
      )}
    </View>
  );
}
