"use client";
import { useEffect, useMemo, useState } from "react";
import type { SamplePlan } from "@/lib/samples/plan";
import { PreviewPlanSchema } from "@/lib/validation/sample";
import useSWR from "swr";
import { apiFetch, ApiError } from "@/components/ui/api";
import { API_READ_OPTIONS } from "@/components/ui/use-api";
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
 * A preview is a read sent as POST (the plan travels in the body), so it goes through SWR keyed by
 * the request: an answer for a request since changed is never shown.
 */
export function usePlanPreview(engagementId: number, request: PlanFormIn, delayMs = 350): PreviewState {
  // The direction decides the sides of z_α for classical variables sizes (issue 13): one-sided for one direction.
  const key = JSON.stringify({
    populationId: request.populationId,
    direction: request.direction,
    params: request.params,
  });
  const parsed = useMemo(() => PreviewPlanSchema.safeParse(JSON.parse(key)), [key]);
  // The last complete request the auditor stopped changing: only it is sent, and only its answer is shown.
  const settled = useSettled(parsed.success ? key : null, delayMs);
  const url = `/api/engagements/${engagementId}/samples/plan-preview`;
  const { data, error, isValidating } = useSWR<{ plan: SamplePlan }, Error, readonly [string, string] | null>(
    settled === null ? null : [url, settled],
    ([path, body]) => apiFetch<{ plan: SamplePlan }>(path, { body: JSON.parse(body) as unknown }),
    { ...API_READ_OPTIONS, keepPreviousData: true },
  );
  // While a new request is waiting or on its way, the last plan stays on show.
  const plan = data?.plan ?? null;
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { plan, problem: issue ? issue.message : "Complete the plan", fields: null, busy: false };
  }
  const problem = error ? error.message || "The size could not be computed" : null;
  const fields = error instanceof ApiError ? (error.fields ?? null) : null;
  return { plan, problem, fields, busy: settled !== key || isValidating };
}

/** `value` once it has stayed the same for `delayMs` (null values are ignored: the last one stands). */
function useSettled(value: string | null, delayMs: number): string | null {
  const [settled, setSettled] = useState<string | null>(null);
  useEffect(() => {
    if (value === null) return;
    const timer = setTimeout(() => setSettled(value), delayMs);
    return () => clearTimeout(timer);
  }, [value, delayMs]);
  return settled;
}
