"use client";
import { useEffect, useState } from "react";
import type { SamplePlan } from "@/lib/samples/plan";
import { PreviewPlanSchema } from "@/lib/validation/sample";
import { api, ApiError } from "@/components/ui/api";
import type { PlanFormIn } from "./plan-values";

export interface PreviewState {
  plan: SamplePlan | null;
  /** Why there is no (current) plan: a missing input, or the server's message naming the field. */
  problem: string | null;
  fields: Record<string, string[]> | null;
  busy: boolean;
}

/**
 * Asks the server for the sample size as the auditor types (debounced), so the size, formula and
 * inputs shown are the ones the draw will use. Incomplete input is checked here first and not sent.
 */
export function usePlanPreview(engagementId: number, request: PlanFormIn, delayMs = 350): PreviewState {
  const [state, setState] = useState<PreviewState>({ plan: null, problem: null, fields: null, busy: false });
  const key = JSON.stringify({ populationId: request.populationId, params: request.params });

  useEffect(() => {
    const body = JSON.parse(key) as { populationId: unknown; params: unknown };
    const parsed = PreviewPlanSchema.safeParse(body);
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      setState((s) => ({ ...s, problem: issue ? issue.message : "Complete the plan", fields: null, busy: false }));
      return;
    }
    let live = true;
    setState((s) => ({ ...s, busy: true }));
    const timer = setTimeout(() => {
      api<{ plan: SamplePlan }>(`/api/engagements/${engagementId}/samples/plan-preview`, { body }).then(
        ({ plan }) => { if (live) setState({ plan, problem: null, fields: null, busy: false }); },
        (err: unknown) => {
          if (!live) return;
          const fields = err instanceof ApiError ? err.fields ?? null : null;
          setState((s) => ({ plan: s.plan, problem: err instanceof Error ? err.message : "The size could not be computed", fields, busy: false }));
        },
      );
    }, delayMs);
    return () => { live = false; clearTimeout(timer); };
  }, [engagementId, key, delayMs]);

  return state;
}
