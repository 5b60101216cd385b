import type { MethodEvaluation } from "@/lib/samples/evaluate";
import { formatPercent } from "./labels";

type Attribute = Extract<MethodEvaluation, { kind: "attribute" }>;

/** Deviations against the tolerable rate, with the one-sided upper deviation limit. */
export function AttributeResult({ a }: { a: Attribute }) {
  const rows: [string, string, string?][] = [
    ["Items with a result", String(a.sampleSize)],
    ["Deviations (items that could not be audited count as deviations)", String(a.deviations), "deviations"],
    ["Sample deviation rate", formatPercent(a.sampleRate, 2), "sample-rate"],
    ["Upper deviation limit (Clopper–Pearson, one-sided)", formatPercent(a.upperLimit, 2), "upper-deviation-limit"],
    ["Tolerable deviation rate", formatPercent(a.tolerableRate, 2)],
  ];
  return (
    <table className="w-full text-sm" aria-label="Attribute result">
      <tbody>
        {rows.map(([label, value, id]) => (
          <tr key={label} className="border-t border-ink-line/60">
            <th scope="row" className="py-1.5 pr-3 text-left font-normal text-ink-soft">{label}</th>
            <td className="figures py-1.5 text-right font-medium" data-testid={id}>{value}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
