import type { NonstatisticalEvaluationBlock } from "@/lib/samples/evaluation-types";
import { Amount } from "@/components/ui/amount";
import { Table, Th, Td } from "@/components/ui/table";
import { DIRECTION_LABELS } from "@/lib/validation/sample";

const amt = (v: string) => <Amount value={v} />;
const METHOD = {
  ratio: "Ratio: misstatement ÷ sampled book value × remainder book value",
  difference: "Difference: misstatement per item × items in the remainder",
} as const;

/** The nonstatistical projection: sample, remainder, key items, anomalies, the total against TM, and the usual responses. */
export function NonstatisticalResult({ n }: { n: NonstatisticalEvaluationBlock }) {
  const rows: [string, React.ReactNode, string?][] = [
    ["Projection method", METHOD[n.projection]],
    [
      "Items in the sample with a result (outside key items)",
      <span key="c" className="figures">
        {n.sampleCount}
      </span>,
    ],
    ["Sampled book value", amt(n.sampleBookValue)],
    ["Misstatement found in the sample", amt(n.sampleMisstatement)],
    [
      "Remainder the sample represents",
      <span key="r">
        <span className="figures">{n.remainderCount.toLocaleString("en-US")}</span> items, {amt(n.remainderBookValue)}
      </span>,
    ],
    ["Projected misstatement of the remainder", amt(n.projectedMisstatement), "ns-projected"],
    [
      `Key items at actual (${n.keyItems.evaluated} of ${n.keyItems.planned} with a result)`,
      amt(n.keyItems.misstatement),
      "ns-key-items",
    ],
    [
      `Accepted anomalous misstatements at actual (${n.anomalies.count})`,
      amt(n.anomalies.misstatement),
      "ns-anomalies",
    ],
    ["Total projected misstatement", amt(n.totalProjected), "ns-total"],
    ...(n.comparedAmount !== n.totalProjected
      ? [
          [
            `Compared with tolerable misstatement (${DIRECTION_LABELS[n.direction].toLowerCase()} tested)`,
            amt(n.comparedAmount),
          ] as [string, React.ReactNode],
        ]
      : []),
    ["Tolerable misstatement", amt(n.tolerableMisstatement)],
    ["Expected misstatement used in planning", amt(n.expectedMisstatement)],
    [`“Well below” tolerable misstatement means at most`, amt(n.wellBelowAmount)],
  ];
  return (
    <div className="space-y-4">
      <Table label="Nonstatistical projection" density="compact">
        <tbody>
          {rows.map(([label, value, id]) => (
            <tr key={label} className="border-t border-ink-line/60">
              <Th scope="row" className="font-normal text-ink-soft">
                {label}
              </Th>
              <Td data-testid={id} className="text-right font-medium">
                {value}
              </Td>
            </tr>
          ))}
        </tbody>
      </Table>
      <p className="text-sm" data-testid="ns-statement">
        {n.statement}
      </p>
      {n.responses.length > 0 && (
        <div
          className="rounded-md border border-amber-100 bg-amber-50 p-3 text-sm text-amber-800"
          data-testid="ns-responses"
        >
          <p className="font-semibold">Usual responses</p>
          <ul className="mt-1 list-disc pl-5">
            {n.responses.map((r) => (
              <li key={r}>{r}</li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
