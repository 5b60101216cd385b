import "server-only";
import { musSampleSize } from "@/lib/sampling";
import { centsToDecimal } from "@/lib/money";
import { fieldError } from "@/lib/errors";
import type { MethodologySettings } from "@/lib/validation/methodology";
import type { SampleParams } from "@/lib/validation/sample";
import type { Frame } from "./population-frame";
import type { PlanDirection, SamplePlan } from "./plan";
import { MUS_UNDERSTATEMENT_CAUTION } from "./evaluation-words";

const SOURCE = {
  "confidence-factor":
    "AICPA Audit Guide “Audit Sampling” (2008 and later editions), monetary-unit sample size with confidence factors",
  "expansion-factor":
    "AICPA Audit Guide “Audit Sampling”, older presentation with expansion factors (kept because the firm's methodology uses it)",
} as const;

/** Items above zero form the monetary-unit frame; the rest are reported for separate testing. */
export function signSummary(frame: Frame) {
  let zeroCount = 0,
    negativeCount = 0,
    negativeCents = 0n,
    positiveCents = 0n,
    positiveCount = 0;
  frame.bookCents.forEach((c) => {
    if (c === 0n) zeroCount++;
    else if (c < 0n) {
      negativeCount++;
      negativeCents += c;
    } else {
      positiveCount++;
      positiveCents += c;
    }
  });
  return { zeroCount, negativeCount, negativeCents, positiveCount, positiveCents };
}

/** Monetary-unit plan sized by the method and factor mode of the firm's methodology stamped on the plan. */
export function planMus(
  frame: Frame,
  p: SampleParams,
  tolerable: number,
  expected: number,
  { methodology, direction }: { methodology: MethodologySettings; direction: PlanDirection },
): SamplePlan {
  const s = signSummary(frame);
  const bookValue = Number(centsToDecimal(s.positiveCents));
  const method = methodology.musSizeMethod;
  const mode = methodology.factorMode;
  const r = musSampleSize({
    bookValue,
    tolerableMisstatement: tolerable,
    expectedMisstatement: expected,
    confidence: p.confidence,
    method,
    mode,
  });
  const chosenSize = p.sampleSize ?? r.sampleSize;
  const interval = chosenSize === r.sampleSize ? r.interval : Math.floor(bookValue / chosenSize);
  if (interval < 1)
    throw fieldError(
      "sampleSize",
      "the sampling interval would be below one currency unit",
      "Too large for this population",
    );
  const threshold = Number(p.topStratumThreshold ?? interval);
  if (threshold > interval)
    throw fieldError(
      "topStratumThreshold",
      `must not exceed the sampling interval (${interval})`,
      `At most the interval, ${interval}`,
    );
  let topCount = 0,
    topCents = 0n;
  frame.bookValues.forEach((v, i) => {
    if (v >= threshold) {
      topCount++;
      topCents += frame.bookCents[i];
    }
  });
  const modeText = mode === "table" ? "rounded up to 2 decimals, as the printed table" : "exact";
  const common = {
    BV: centsToDecimal(s.positiveCents),
    TM: tolerable.toFixed(2),
    EM: expected.toFixed(2),
    confidence: p.confidence,
  };
  const inputs: SamplePlan["inputs"] =
    method === "confidence-factor"
      ? {
          ...common,
          "EM/TM": Number((expected / tolerable).toFixed(6)),
          R: Number(r.confidenceFactor.toFixed(mode === "table" ? 2 : 6)),
          factors: modeText,
        }
      : {
          ...common,
          RF: Number(r.reliabilityFactor.toFixed(mode === "table" ? 2 : 6)),
          EF: r.expansionFactor ?? 1,
          factors: modeText,
        };
  const formula =
    method === "confidence-factor"
      ? `n = ⌈R × BV / TM⌉, R the root of R = Γ⁻¹(confidence; shape 1 + R × EM/TM) (confidence factor, ${modeText}); sampling interval J = ⌊BV / n⌋ (${SOURCE[method]})`
      : `n = ⌈BV × RF / (TM − EM × EF)⌉; sampling interval J = ⌊BV / n⌋ (${SOURCE[method]})`;
  return {
    method: "mus",
    frameSize: s.positiveCount,
    frameTotal: centsToDecimal(s.positiveCents),
    excluded: {
      zeroCount: s.zeroCount,
      negativeCount: s.negativeCount,
      negativeTotal: centsToDecimal(s.negativeCents),
    },
    computedSize: r.sampleSize,
    chosenSize,
    formula,
    inputs,
    sizeMethod: method,
    factorMode: mode,
    interval,
    topStratumThreshold: threshold,
    topStratum: { count: topCount, total: centsToDecimal(topCents) },
    notes:
      method === "expansion-factor"
        ? [
            "Sized with expansion factors, the older presentation of the Guide, as the firm's methodology sets; the current Guide uses confidence factors.",
          ]
        : [],
    warnings: direction === "overstatement" ? [] : [MUS_UNDERSTATEMENT_CAUTION],
  };
}
