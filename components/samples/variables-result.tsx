import type { MethodEvaluation } from "@/lib/samples/evaluate";
import { Amount } from "@/components/ui/amount";
import { ESTIMATOR_LABELS } from "./labels";

type Variables = Extract<MethodEvaluation, { kind: "variables" }>;
const amt = (v: number | null) => (v === null || !Number.isFinite(v) ? <span className="text-ink-faint">—</span> : <Amount value={v.toFixed(2)} />);
const SIDES = { two: "two-sided", upper: "one-sided, upper", lower: "one-sided, lower" } as const;

/** The classical variables estimate with its standard error, allowance and bounds. */
export function VariablesResult({ v, bookValue }: { v: Variables; bookValue: string }) {
  const r = v.result;
  const rows: [string, React.ReactNode, string?][] = [
    ["Estimator", `${ESTIMATOR_LABELS[v.estimator] ?? v.estimator} (${SIDES[v.sides]})`],
    ["Recorded book value", <Amount key="bv" value={bookValue} />],
    ["Estimated audited value", amt(r.estimatedAuditedValue), "estimated-audited"],
    ["Projected misstatement (book − estimate)", amt(r.projectedMisstatement), "projected-misstatement"],
    ["Standard error", amt(r.standardError), "standard-error"],
    ["Normal quantile z", <span key="z" className="figures">{r.zValue.toFixed(4)}</span>],
    ["Allowance for sampling risk (z × SE)", amt(r.allowance), "allowance"],
    ["Lower bound on the audited value", amt(r.lowerBound)],
    ["Upper bound on the audited value", amt(r.upperBound)],
    ["Bound on overstatement (book − lower bound)", amt(v.misstatementBounds.overstatement), "bound-over"],
    ["Bound on understatement (upper bound − book)", amt(v.misstatementBounds.understatement), "bound-under"],
    ["Items with a misstatement in the sample", <span key="m" className="figures">{r.misstatementsInSample}</span>],
  ];
  return (
    <table className="w-full text-sm" aria-label="Variables estimate">
      <tbody>
        {rows.map(([label, value, id]) => (
          <tr key={label} className="border-t border-ink-line/60">
            <th scope="row" className="py-1.5 pr-3 text-left font-normal text-ink-soft">{label}</th>
            <td className="py-1.5 text-right font-medium" data-testid={id}>{value}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
