"use client";
import { useId, useState } from "react";
import type { PopulationProfile } from "@/lib/data/population-items";
import { decimalToCents } from "@/lib/money";
import { Amount } from "@/components/ui/amount";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";
import { formatCount } from "@/lib/format/number";
import { useApi } from "@/components/ui/use-api";

type Threshold = NonNullable<PopulationProfile["threshold"]>;

/** How many items, and how much value, lie at or above an amount the auditor types (e.g. a top-stratum cut-off). */
export function ThresholdTool({
  url,
  populationCount,
  positiveTotal,
  currency,
  suggestion,
}: {
  url: string;
  populationCount: number;
  positiveTotal: string;
  currency: string;
  suggestion: string;
}) {
  const id = useId();
  const [amount, setAmount] = useState("");
  // The amount last asked about: its answer is read by URL, so a slow answer for an earlier amount never shows.
  const [asked, setAsked] = useState<string | null>(null);
  const read = useApi<{ profile: PopulationProfile }>(
    asked === null ? null : `${url}?threshold=${encodeURIComponent(asked)}`,
  );
  const result: Threshold | null = read.data?.profile.threshold ?? null;
  const error = read.error?.message ?? null;
  const busy = read.isLoading;

  const run = (e: React.FormEvent) => {
    e.preventDefault();
    setAsked(amount.trim());
  };

  const positive = decimalToCents(positiveTotal);
  const valueShare = result && positive > 0n ? Number((decimalToCents(result.total) * 10000n) / positive) / 100 : null;
  return (
    <div className="space-y-3">
      <form onSubmit={run} className="flex flex-wrap items-end gap-3">
        <div className="space-y-1.5">
          <label htmlFor={id} className="block text-sm font-medium text-ink">
            Amount ({currency})
          </label>
          <Input
            id={id}
            value={amount}
            onChange={(e) => setAmount(e.target.value)}
            inputMode="decimal"
            placeholder={suggestion}
            className="figures w-44 text-right"
            aria-describedby={`${id}-msg`}
          />
        </div>
        <Button type="submit" variant="secondary" disabled={busy || !amount.trim()}>
          {busy ? "Counting…" : "Count items at or above"}
        </Button>
      </form>
      <div id={`${id}-msg`} aria-live="polite">
        {error && <p className="text-sm text-brick-700">{error}</p>}
        {result && (
          <p className="text-sm" data-testid="threshold-result">
            <span className="figures font-semibold">{formatCount(result.count)}</span> of {formatCount(populationCount)}{" "}
            items are at or above <Amount value={result.amount} />, totalling{" "}
            <Amount value={result.total} currency={currency} />
            {valueShare !== null && (
              <>
                {" "}
                — <span className="figures">{valueShare.toFixed(1)}%</span> of the positive book value
              </>
            )}
            .
          </p>
        )}
      </div>
    </div>
  );
}
