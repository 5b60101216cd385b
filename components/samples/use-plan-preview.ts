"use client";
import { useEffect, useMemo, useState } from "react";
import type { SamplePlan } from "@/lib/samples/plan";
import { PreviewPlanSchema } from "@/lib/validation/sample";
import { apiFetch, ApiError } from "@/components/ui/api";
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
  // The direction decides the sides of z_α for classical variables sizes (issue 13): one-sided for one direction.
  const key = JSON.stringify({ populationId: request.populationId, direction: request.direction, params: request.params });
  // The last answer from the server, and the request (key) it answers: while they differ, it is busy.
  const [answer, setAnswer] = useState<{ key: string | null; plan: SamplePlan | null; problem: string | null; fields: Record<string, string[]> | null }>(
    { key: null, plan: null, problem: null, fields: null },
  );
  const parsed = useMemo(() => PreviewPlanSchema.safeParse(JSON.parse(key)), [key]);

  useEffect(() => {
    if (!parsed.success) return;
    const body = JSON.parse(key) as { populationId: unknown; params: unknown };
    let live = true;
    const timer = setTimeout(() => {
      apiFetch<{ plan: SamplePlan }>(`/api/engagements/${engagementId}/samples/plan-preview`, { body }).then(
        ({ plan }) => { if (live) setAnswer({ key, plan, problem: null, fields: null }); },
        (err: unknown) => {
          if (!live) return;
          const fields = err instanceof ApiError ? err.fields ?? null : null;
          setAnswer((s) => ({ key, plan: s.plan, problem: err instanceof Error ? err.message : "The size could not be computed", fields }));
        },
      );
    }, delayMs);
    return () => { live = false; clearTimeout(timer); };
  }, [engagementId, key, parsed, delayMs]);

  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { plan: answer.plan, problem: issue ? issue.message : "Complete the plan", fields: null, busy: false };
  }
  return { plan: answer.plan, problem: answer.problem, fields: answer.fields, busy: answer.key !== key };
}
