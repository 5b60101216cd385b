"use client";
import { useState } from "react";
import type { AdvisorCell } from "@/lib/sampling";
import { ADVISED_ESTIMATOR_LABELS } from "@/lib/sampling/advise";
import { EstimateHistogram } from "./advisor-charts";

/**
 * One estimator's histogram on its own range, with the true total and its mean estimate marked: on
 * the shared scale the narrow estimators are a single spike, here bias and spread are seen apart.
 */
export function EstimateZoom({ cells, truth }: { cells: AdvisorCell[]; truth: number }) {
  const [chosen, setChosen] = useState(cells[0]?.estimator ?? null);
  const cell = cells.find((c) => c.estimator === chosen) ?? cells[0];
  if (!cell || cell.performance.histogram.length === 0) return null;
  const bins = cell.performance.histogram;
  const mean = cell.performance.meanEstimate;
  const from = Math.min(bins[0].from, truth, mean);
  const to = Math.max(bins[bins.length - 1].to, truth, mean);
  const pad = (to - from) * 0.04 || 1;
  return (
    <div className="mt-3 grid gap-3 sm:grid-cols-3">
      <fieldset className="text-sm">
        <legend className="mb-1 font-medium text-ink">Zoom on one estimator</legend>
        <p className="mb-2 text-xs text-ink-soft">
          Its own scale: the dashed line is the true audited total, the solid line its mean estimate — the gap is the
          bias, the width the spread.
        </p>
        {cells.map((c) => (
          <label key={c.estimator} className="flex items-center gap-2 py-0.5">
            <input
              type="radio"
              name="zoom-estimator"
              value={c.estimator}
              checked={c.estimator === cell.estimator}
              onChange={() => setChosen(c.estimator)}
            />
            {ADVISED_ESTIMATOR_LABELS[c.estimator]}
          </label>
        ))}
      </fieldset>
      <div className="sm:col-span-2" data-testid="estimate-zoom">
        <EstimateHistogram
          estimator={cell.estimator}
          bins={bins}
          truth={truth}
          from={from - pad}
          to={to + pad}
          mean={mean}
        />
      </div>
    </div>
  );
}
