import type { SamplePlan } from "@/lib/samples/plan";
import { Amount } from "@/components/ui/amount";
import { Alert } from "@/components/ui/alert";
import { PlanStrataTable } from "./plan-strata-table";
import { formatCount } from "@/lib/format/number";
import { Table, Th, Td } from "@/components/ui/table";

const INPUT_NOTES: Record<string, string> = {
  BV: "book value of the frame (items above zero)",
  TM: "tolerable misstatement",
  EM: "expected misstatement",
  RF: "reliability factor, zero misstatements",
  EF: "expansion factor for expected misstatement",
  N: "items in the population",
  S: "standard deviation of book values",
  A: "planned allowance for sampling risk",
  "n′": "size before the finite population correction",
  TDR: "tolerable deviation rate",
  EDR: "expected deviation rate",
  "key items' BV": "book value of the key items, examined 100 %",
  "assurance factor": "from the firm's table for the two assessed risks (or −ln(1 − typed confidence))",
  "n (exact)": "size before rounding up",
  R: "confidence factor for EM/TM",
  "EM/TM": "expected over tolerable misstatement",
  factors: "factor mode (firm methodology)",
  M: "deviations assumed in the population, ⌈TDR × N⌉",
  s_d: "standard deviation of the differences",
  s_e: "standard deviation of the residuals",
  "spread basis": "where the standard deviation comes from",
};

function InputValue({ name, value }: { name: string; value: string | number }) {
  if (["BV", "TM", "EM", "A", "S", "s_d", "s_e", "key items' BV"].includes(name))
    return <Amount value={typeof value === "number" ? value.toFixed(2) : value} />;
  if (
    ["TDR", "EDR", "confidence", "risk of incorrect acceptance", "risk of incorrect rejection"].includes(name) &&
    typeof value === "number"
  )
    return <span className="figures">{Number((value * 100).toPrecision(10))}%</span>;
  return (
    <span className="figures">
      {typeof value === "number" ? value.toLocaleString("en-US", { maximumFractionDigits: 6 }) : value}
    </span>
  );
}

/** The computed size, as the server will draw it, with the formula and every input it used. */
export function SizePanel({
  plan,
  problem,
  busy,
  currency,
}: {
  plan: SamplePlan | null;
  problem: string | null;
  busy: boolean;
  currency: string;
}) {
  return (
    <div className="space-y-4" aria-live="polite" aria-busy={busy} data-testid="size-panel">
      {problem && <Alert tone={plan ? "error" : "info"}>{problem}</Alert>}
      {!plan ? (
        !problem && <p className="text-sm text-ink-soft">Choose a population and a method to see the sample size.</p>
      ) : (
        <div className={`space-y-4 transition-opacity ${busy || problem ? "opacity-60" : ""}`}>
          {problem && <p className="text-xs text-ink-soft">The figures below are from the last complete inputs.</p>}
          <div className="flex items-end justify-between gap-4">
            <div>
              <p className="text-xs font-semibold uppercase tracking-wider text-ink-soft">Items to select</p>
              <p className="figures text-4xl font-semibold text-ink" data-testid="chosen-size">
                {formatCount(plan.chosenSize)}
              </p>
            </div>
            <div className="text-right text-sm text-ink-soft">
              <p>
                Computed:{" "}
                <span className="figures font-medium text-ink" data-testid="computed-size">
                  {formatCount(plan.computedSize)}
                </span>
              </p>
              {plan.allowedDeviations !== undefined && (
                <p>
                  Deviations allowed: <span className="figures font-medium text-ink">{plan.allowedDeviations}</span>
                </p>
              )}
            </div>
          </div>
          {plan.interval !== undefined && (
            <dl className="grid grid-cols-2 gap-3 rounded-md bg-paper-sunk/60 p-3 text-sm">
              <div>
                <dt className="text-ink-soft">Sampling interval J</dt>
                <dd className="font-semibold" data-testid="plan-interval">
                  <Amount value={plan.interval.toFixed(2)} />
                </dd>
              </div>
              <div>
                <dt className="text-ink-soft">
                  Top stratum (≥ <Amount value={(plan.topStratumThreshold ?? plan.interval).toFixed(2)} />)
                </dt>
                <dd className="font-semibold">
                  <span className="figures">{formatCount(plan.topStratum?.count ?? 0)}</span> items,{" "}
                  <Amount value={plan.topStratum?.total ?? "0.00"} />
                </dd>
              </div>
            </dl>
          )}
          <div>
            <p className="text-xs font-semibold uppercase tracking-wider text-ink-soft">Formula</p>
            <p className="mt-1 text-sm leading-relaxed">{plan.formula}</p>
          </div>
          <Table label="Inputs to the size" density="compact">
            <tbody>
              {Object.entries(plan.inputs).map(([name, value]) => (
                <tr key={name} className="border-t border-ink-line/60">
                  <Th scope="row" className="align-top font-medium">
                    {name}
                    <span className="block text-xs font-normal text-ink-faint">{INPUT_NOTES[name]}</span>
                  </Th>
                  <Td className="text-right align-top">
                    <InputValue name={name} value={value} />
                  </Td>
                </tr>
              ))}
            </tbody>
          </Table>
          <p className="text-xs text-ink-soft">
            Frame: <span className="figures">{formatCount(plan.frameSize)}</span> items,{" "}
            <Amount value={plan.frameTotal} currency={currency} />.
          </p>
          {plan.excluded && (plan.excluded.zeroCount > 0 || plan.excluded.negativeCount > 0) && (
            <div
              className="rounded-md border border-amber-100 bg-amber-50 p-3 text-sm text-amber-700"
              data-testid="excluded-items"
            >
              <p className="font-semibold">Outside the monetary-unit frame — test as separate populations</p>
              <ul className="mt-1 list-disc pl-5">
                {plan.excluded.negativeCount > 0 && (
                  <li>
                    <span className="figures">{formatCount(plan.excluded.negativeCount)}</span> credit (negative) items
                    totalling <Amount value={plan.excluded.negativeTotal} />
                  </li>
                )}
                {plan.excluded.zeroCount > 0 && (
                  <li>
                    <span className="figures">{formatCount(plan.excluded.zeroCount)}</span> items at zero
                  </li>
                )}
              </ul>
              <p className="mt-1 text-xs">
                A monetary unit can only land on a positive amount; these items are never selected by this sample.
              </p>
            </div>
          )}
          {plan.strata && <PlanStrataTable strata={plan.strata} />}
          {plan.notes && plan.notes.length > 0 && (
            <ul className="space-y-1 text-xs text-ink-soft" data-testid="plan-notes">
              {plan.notes.map((n) => (
                <li key={n}>{n}</li>
              ))}
            </ul>
          )}
          {plan.warnings.length > 0 && (
            <ul className="space-y-1 text-xs text-amber-700">
              {plan.warnings.map((w) => (
                <li key={w}>⚠ {w}</li>
              ))}
            </ul>
          )}
        </div>
      )}
    </div>
  );
}
