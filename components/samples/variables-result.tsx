import type { StratifiedEvaluationBlock, VariablesEvaluationBlock } from "@/lib/samples/evaluation-types";
import { Amount } from "@/components/ui/amount";
import { DIRECTION_LABELS, ESTIMATOR_LABELS } from "./labels";
import { formatPercent } from "@/lib/format/number";
import { Table, THead, Th, Td } from "@/components/ui/table";

/** Key items and accepted anomalies taken at actual outside the estimator, when there are any. */
function atActualRows(v: VariablesEvaluationBlock | StratifiedEvaluationBlock): [string, React.ReactNode, string?][] {
  const a = v.atActual;
  if (!a) return [];
  return [
    [
      `Remainder estimated from the sample (${a.remainderSize.toLocaleString("en-US")} items): book value`,
      <Amount key="rb" value={a.remainderBookValue} />,
    ],
    [
      "Remainder: estimated audited value (Ŷ_r) · projected misstatement",
      <span key="re">
        <Amount value={a.remainderEstimatedAuditedValue} /> · <Amount value={a.remainderProjectedMisstatement} />
      </span>,
    ],
    [
      `Key items at actual (${a.keyItems.count}): book · audited · misstatement`,
      <span key="ki">
        <Amount value={a.keyItems.bookValue} /> · <Amount value={a.keyItems.auditedValue} /> ·{" "}
        <Amount value={a.keyItems.misstatement} />
      </span>,
      "key-items-actual",
    ],
    [
      `Accepted anomalies at actual (${a.anomalies.count}): misstatement`,
      <Amount key="an" value={a.anomalies.misstatement} />,
      "anomalies-actual",
    ],
  ];
}

/** The classical variables estimate and the Audit Guide's decision rule, as the evaluation view model gives them. */
export function VariablesResult({ v }: { v: VariablesEvaluationBlock | StratifiedEvaluationBlock }) {
  const d = v.decision;
  const coefficient =
    d.distribution === "t" ? `Student t_α, ${d.degreesOfFreedom?.toFixed(1)} df` : "Normal quantile z_α";
  const rows: [string, React.ReactNode, string?][] = [
    [
      "Estimator",
      `${ESTIMATOR_LABELS[v.estimator] ?? v.estimator}${v.method === "stratified" ? " (stratified)" : ""}, tested for ${DIRECTION_LABELS[d.direction].toLowerCase()}`,
    ],
    ["Recorded book value (X)", <Amount key="bv" value={v.populationBookValue} />],
    ...atActualRows(v),
    ["Tolerable misstatement (TM)", <Amount key="tm" value={v.tolerableMisstatement} />],
    ["Estimated audited value (Ŷ)", <Amount key="y" value={v.estimatedAuditedValue} />, "estimated-audited"],
    ["Projected misstatement (X − Ŷ)", <Amount key="pm" value={v.projectedMisstatement} />, "projected-misstatement"],
    ["Standard error (SE)", <Amount key="se" value={v.standardError} />, "standard-error"],
    [
      `${coefficient}, ${d.coefficientSides}-sided (risk of incorrect rejection ${formatPercent(d.riskOfIncorrectRejection)})`,
      <span key="z" className="figures">
        {d.coefficient.toFixed(4)}
      </span>,
    ],
    ["Planned allowance (A)", <Amount key="a" value={d.plannedAllowance} />, "planned-allowance"],
    ["Achieved allowance (A′ = z_α · SE)", <Amount key="a1" value={d.achievedAllowance} />, "achieved-allowance"],
    ...(d.adjustedAllowance !== null
      ? [
          [
            "Adjusted allowance (A″ = A′ + TM · (1 − A′/A))",
            <Amount key="a2" value={d.adjustedAllowance} />,
            "adjusted-allowance",
          ] as [string, React.ReactNode, string],
        ]
      : []),
    ...(d.lowerLimit !== null
      ? [
          ["Lower limit (Ŷ − allowance)", <Amount key="lo" value={d.lowerLimit} />, "lower-limit"] as [
            string,
            React.ReactNode,
            string,
          ],
        ]
      : []),
    ...(d.upperLimit !== null
      ? [
          ["Upper limit (Ŷ + allowance)", <Amount key="hi" value={d.upperLimit} />, "upper-limit"] as [
            string,
            React.ReactNode,
            string,
          ],
        ]
      : []),
    ["Beyond the nearest limit", <Amount key="b" value={d.beyondLimit} />, "beyond-limit"],
    [
      "Items with a misstatement in the sample",
      <span key="m" className="figures">
        {v.misstatementsInSample}
      </span>,
    ],
  ];
  return (
    <div className="space-y-3">
      <Table label="Variables estimate" density="compact">
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
      {v.method === "stratified" && (
        <Table label="Strata" density="compact">
          <THead>
            <tr>
              <Th>h</Th>
              <Th>Band</Th>
              <Th numeric>N_h</Th>
              <Th numeric>X_h</Th>
              <Th numeric>n_h</Th>
              <Th numeric>Sample book</Th>
              <Th numeric>Sample audited</Th>
              <Th numeric>Ŷ_h</Th>
              <Th numeric>SE_h</Th>
            </tr>
          </THead>
          <tbody className="figures">
            {v.strata.map((st) => (
              <tr key={st.number} className="border-t border-ink-line/60">
                <Td>{st.number}</Td>
                <Td className="font-sans">{st.label}</Td>
                <Td className="text-right">{st.populationSize}</Td>
                <Td className="text-right">
                  <Amount value={st.populationBookValue} />
                </Td>
                <Td className="text-right">{st.sampleSize}</Td>
                <Td className="text-right">
                  <Amount value={st.sampleBookValue} />
                </Td>
                <Td className="text-right">
                  <Amount value={st.sampleAuditedValue} />
                </Td>
                <Td className="text-right">
                  <Amount value={st.estimatedAuditedValue} />
                </Td>
                <Td className="text-right">
                  <Amount value={st.standardError} />
                </Td>
              </tr>
            ))}
          </tbody>
        </Table>
      )}
      {v.method === "variables" && (
        <p className="text-xs text-ink-soft">
          Sample: n = {v.sampleSize}, book <Amount value={v.sampleBookValue} />, audited{" "}
          <Amount value={v.sampleAuditedValue} />.
        </p>
      )}
      <p className="text-sm" data-testid="decision-rule">
        {d.rule}
      </p>
    </div>
  );
}
