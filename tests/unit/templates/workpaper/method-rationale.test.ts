import { describe, expect, it } from "vitest";
import { createRng } from "@/lib/sampling";
import { runAdvisorJob } from "@/lib/advisor/compute";
import { methodRationaleBlock } from "@/lib/advisor/describe";
import type { AdvisorRunRecord } from "@/lib/data/advisor-runs";
import { variablesFixture } from "@/tests/support/workpaper";
import { renderAndRead, squash } from "./pdf-support";
import { formatMoney } from "@/lib/format/number";

describe("workpaper: the estimator advisor run kept as the method's rationale", () => {
  it(
    "prints the scenario, seed, every estimator's figures at every size and the recommendation",
    { timeout: 180_000 },
    async () => {
      const rng = createRng(404);
      const bookValues = Array.from(
        { length: 1500 },
        () => Math.round((20 + 3000 * rng.nextDouble() ** 2) * 100) / 100,
      );
      const scenario = { kind: "pattern", misstatedShare: 0.2, tainting: "spread", overstatementShare: 1 } as const;
      const result = runAdvisorJob({
        bookValues,
        scenario,
        sampleSizes: [30, 60],
        trials: 1000,
        seed: 99,
        confidence: 0.95,
        sides: "lower",
        plannedSize: 60,
        includeStringer: false,
        factors: "exact",
      });
      const run: AdvisorRunRecord = {
        id: 12,
        sampleId: 1,
        populationId: 1,
        planVersion: 1,
        status: "done",
        error: null,
        durationMs: 120,
        createdAt: "2026-12-02T09:00:00.000Z",
        createdByName: "A. Senior",
        finishedAt: "2026-12-02T09:00:01.000Z",
        request: {
          scenario,
          scenarioSource: { kind: "pattern" },
          sampleSizes: [30, 60],
          trials: 1000,
          seed: 99,
          seedSource: "entered",
          confidence: 0.95,
          sides: "lower",
          method: "random",
          plannedSize: 60,
        },
        result,
      };
      const data = { ...variablesFixture({ draft: true }), methodRationale: methodRationaleBlock(run, 2) };
      const pdf = await renderAndRead("variables-with-rationale", data);
      const text = squash(pdf.text);
      expect(text).toContain("Rationale for the method: estimator advisor (run 12)");
      expect(pdf.flat).toContain("20.0% of items misstated");
      expect(text).toContain("1,000 per sample size; seed 99 (entered)");
      for (const c of result.cells) expect(text).toContain(formatMoney(c.performance.rmse.toFixed(2)));
      expect(pdf.flat).toContain(squash(result.recommendation.summary).slice(0, 40));
      expect(pdf.flat).toContain("The plan was changed after this run");
    },
  );
});
