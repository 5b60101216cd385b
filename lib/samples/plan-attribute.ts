import "server-only";
import { formatCount } from "@/lib/format/number";
import { attributeSampleSize } from "@/lib/sampling";
import { centsToDecimal } from "@/lib/money";
import { fieldError } from "@/lib/errors";
import type { MethodologySettings } from "@/lib/validation/methodology";
import { CONTROL_FREQUENCY_LABELS as FREQUENCY_LABELS, type SampleParams } from "@/lib/validation/sample";
import type { Frame } from "./population-frame";
import type { SamplePlan } from "./plan";

/** An attribute plan: by the firm's control-frequency table, or statistically (hypergeometric below the firm's threshold). */
export function planAttribute(frame: Frame, p: SampleParams, methodology: MethodologySettings): SamplePlan {
  const N = frame.bookValues.length;
  const base = {
    method: "attribute" as const,
    frameSize: N,
    frameTotal: centsToDecimal(frame.totalCents),
    excluded: null,
  };
  if (p.attributeMode === "control-frequency") {
    const row = methodology.controlFrequencies.find((r) => r.frequency === p.controlFrequency);
    if (!row)
      throw fieldError("controlFrequency", `the firm's control-frequency table has no row for "${p.controlFrequency}"`);
    const computedSize = Math.min(row.minimumSampleSize, N);
    return {
      ...base,
      computedSize,
      chosenSize: p.sampleSize ?? computedSize,
      allowedDeviations: 0,
      controlFrequencyRow: row,
      formula:
        "n = the minimum sample size the firm's control-frequency table sets for how often the manual control operates (firm methodology; not a statistical size)",
      inputs: {
        frequency: FREQUENCY_LABELS[row.frequency],
        "minimum sample size": row.minimumSampleSize,
        "occurrences in the population": N,
      },
      notes: [
        `Row used: ${FREQUENCY_LABELS[row.frequency]} → ${row.minimumSampleSize} items (firm control-frequency table, methodology settings). The shipped defaults are common practice, from memory; the firm confirms its own.`,
      ],
      warnings:
        computedSize < row.minimumSampleSize
          ? [
              `The population holds only ${N} occurrences, fewer than the table's ${row.minimumSampleSize}: every occurrence is tested.`,
            ]
          : [],
    };
  }
  const hypergeometric = N < methodology.hypergeometricBelow;
  const r = attributeSampleSize({
    tolerableRate: p.tolerableRate!,
    expectedRate: p.expectedRate,
    confidence: p.confidence,
    ...(hypergeometric ? { populationSize: N } : {}),
  });
  const inputs: SamplePlan["inputs"] = {
    TDR: p.tolerableRate!,
    EDR: p.expectedRate,
    confidence: p.confidence,
    "allowed deviations": r.allowedDeviations,
  };
  if (hypergeometric) Object.assign(inputs, { N, M: r.populationDeviations! });
  return {
    ...base,
    computedSize: r.sampleSize,
    chosenSize: p.sampleSize ?? r.sampleSize,
    allowedDeviations: r.allowedDeviations,
    model: r.model,
    formula: hypergeometric
      ? "smallest n with HypergeometricCDF(k; N, M, n) ≤ 1 − confidence, M = ⌈TDR × N⌉ deviations assumed in the population, k = ⌈EDR × n⌉ (AICPA Audit Guide “Audit Sampling”, small populations; exact search, not the finite-population shortcut)"
      : "smallest n with BinomialCDF(k; n, TDR) ≤ 1 − confidence, k = ⌈EDR × n⌉ (AICPA Audit Guide “Audit Sampling”, Tables A-1/A-2)",
    inputs,
    notes: hypergeometric
      ? [
          `The population holds ${formatCount(N)} items, under the firm's threshold of ${formatCount(methodology.hypergeometricBelow)}: sized and evaluated with the hypergeometric distribution (exact for sampling without replacement from a small population).`,
        ]
      : [],
    warnings: [],
  };
}
