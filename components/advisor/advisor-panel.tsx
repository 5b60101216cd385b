"use client";
import { useRef, useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import {
  AdvisorRunSchema,
  TAINTING_PATTERN_KEYS,
  TAINTING_PATTERN_LABELS,
  type AdvisorRun,
  type AdvisorRunInput,
} from "@/lib/validation/advisor";
import type { AdvisorRunRecord } from "@/lib/data/advisor-runs";
import type { AdvisorState } from "@/lib/advisor/state";
import { Card } from "@/components/ui/card";
import { Field, Input, Select } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { useSWRConfig } from "swr";
import { apiFetch, apiStream } from "@/components/ui/api";
import { useApi } from "@/components/ui/use-api";
import { readNdjson } from "@/components/ui/ndjson";
import { AdvisorResults } from "./advisor-results";
import { formatCount } from "@/lib/format/number";
import { formatDateTime } from "@/lib/format/date";

const CAUTION =
  "The advisor's figures come from assumed misstatements, not from evidence: they support, and do not replace, the auditor's professional judgement, the applicable standards (AU-C 530, ISA 530, AS 2315) and the firm's methodology.";

type RunEvent =
  | { type: "started"; runId: number; total: number }
  | { type: "progress"; done: number; total: number }
  | { type: "result"; run: AdvisorRunRecord; cached: boolean }
  | { type: "cancelled"; runId: number }
  | { type: "error"; message: string };

function defaultSizes(planned: number, items: number): string {
  const sizes = [Math.max(3, Math.round(planned / 2)), planned, planned * 2].filter((n) => n >= 3 && n <= items);
  return [...new Set(sizes)].join(", ");
}

/**
 * Simulates every applicable estimator on this population under an assumed misstatement pattern,
 * before the sample is drawn, and lets a senior keep a run as the rationale for the method.
 */
export function AdvisorPanel({
  engagementId,
  sampleId,
  initial,
  mayRun,
  currency,
  plannedSize,
  populationItems,
}: {
  engagementId: number;
  sampleId: number;
  initial: AdvisorState;
  mayRun: boolean;
  currency: string;
  plannedSize: number;
  populationItems: number;
}) {
  const base = `/api/engagements/${engagementId}/samples/${sampleId}/advisor`;
  const stateRead = useApi<AdvisorState>(base, { initial });
  const state = stateRead.data ?? initial;
  // The run on show is read by its URL: a slow answer for a run clicked before can never replace it.
  const { mutate: setCached } = useSWRConfig();
  const [shownId, setShownId] = useState<number | null>(initial.adopted?.id ?? null);
  const shownRead = useApi<{ run: AdvisorRunRecord }>(shownId === null ? null : `${base}/${shownId}`, {
    initial: initial.adopted && shownId === initial.adopted.id ? { run: initial.adopted } : undefined,
  });
  const shown = shownRead.data?.run ?? null;
  const [progress, setProgress] = useState<{ runId: number | null; done: number; total: number } | null>(null);
  const [message, setMessage] = useState<{ tone: "error" | "info" | "success"; text: string } | null>(null);
  const abort = useRef<AbortController | null>(null);
  const canRun = mayRun && state.canRun;

  const {
    register,
    handleSubmit,
    control,
    formState: { errors, isSubmitting },
  } = useForm<AdvisorRunInput, unknown, AdvisorRun>({
    resolver: zodResolver(AdvisorRunSchema),
    defaultValues: {
      scenario: { kind: "pattern", misstatedPercent: 5, tainting: "mostly-small", overstatementPercent: 90 },
      sampleSizes: defaultSizes(plannedSize, populationItems) as unknown as number[],
      trials: 10000,
      seed: "" as unknown as number,
    },
  });
  const kind = useWatch({ control, name: "scenario.kind" });
  const scenarioErrors = errors.scenario as Record<string, { message?: string } | undefined> | undefined;

  const refreshRuns = () => stateRead.mutate();

  const onRunEvent = (event: RunEvent) => {
    if (event.type === "started") setProgress({ runId: event.runId, done: 0, total: event.total });
    else if (event.type === "progress")
      setProgress((p) => ({ runId: p?.runId ?? null, done: event.done, total: event.total }));
    else if (event.type === "result") {
      void setCached(`${base}/${event.run.id}`, { run: event.run }, { revalidate: false });
      setShownId(event.run.id);
      setMessage(
        event.cached
          ? { tone: "info", text: "These inputs and seed were run before: the stored figures are shown." }
          : null,
      );
    } else if (event.type === "cancelled") setMessage({ tone: "info", text: "The run was cancelled." });
    else if (event.type === "error") setMessage({ tone: "error", text: event.message });
  };

  const runAdvisor = async (body: Parameters<Parameters<typeof handleSubmit>[0]>[0]) => {
    setMessage(null);
    const controller = new AbortController();
    abort.current = controller;
    setProgress({ runId: null, done: 0, total: 1 });
    try {
      await readNdjson<RunEvent>(await apiStream(base, { body, signal: controller.signal }), onRunEvent);
    } catch (err) {
      if (!controller.signal.aborted)
        setMessage({ tone: "error", text: err instanceof Error ? err.message : "The advisor run failed" });
    } finally {
      abort.current = null;
      setProgress(null);
      void refreshRuns();
    }
  };

  const cancel = async () => {
    const runId = progress?.runId;
    if (runId) await apiFetch(`${base}/${runId}`, { method: "DELETE" }).catch(() => undefined);
    abort.current?.abort();
    setMessage({ tone: "info", text: "The run was cancelled." });
  };

  const showRun = (runId: number) => {
    setMessage(null);
    setShownId(runId);
  };

  const [keepReason, setKeepReason] = useState("");
  const adopt = async (runId: number) => {
    try {
      const next = await apiFetch<AdvisorState>(`${base}/${runId}/adopt`, {
        body: keepReason.trim() ? { reason: keepReason.trim() } : {},
      });
      setKeepReason("");
      await stateRead.mutate(next, { revalidate: false });
      setMessage({
        tone: "success",
        text: "Kept with the plan as the rationale for the method; the workpaper prints it.",
      });
    } catch (err) {
      setMessage({ tone: "error", text: err instanceof Error ? err.message : "The run could not be kept" });
    }
  };

  const running = progress !== null;
  const percent = progress ? Math.floor((100 * progress.done) / Math.max(1, progress.total)) : 0;
  const finished = state.runs.filter((r) => r.status === "done");

  return (
    <Card
      title="Estimator advisor"
      action={state.adopted ? <Badge tone="green">Rationale kept: run {state.adopted.id}</Badge> : undefined}
    >
      <div className="space-y-4">
        <p className="text-sm text-ink-soft">
          Before drawing, see how each estimator would perform on this population: thousands of seeded samples are drawn
          from its actual book values, with audited values made up from the misstatements you assume. The lowest error
          is not always the least biased estimator (mean squared error = bias² + variance).
        </p>
        {state.unavailable && <Alert tone="info">{state.unavailable}</Alert>}
        {canRun && (
          <form
            onSubmit={(e) => void handleSubmit(runAdvisor)(e)}
            noValidate
            aria-label="Advisor inputs"
            className="space-y-2"
          >
            <fieldset className="flex flex-wrap gap-4 text-sm">
              <legend className="mb-1 text-sm font-medium text-ink">Assumed misstatements</legend>
              <label className="inline-flex items-center gap-2">
                <input type="radio" value="pattern" {...register("scenario.kind")} /> A pattern I describe
              </label>
              <label className="inline-flex items-center gap-2">
                <input
                  type="radio"
                  value="previous-sample"
                  disabled={state.previousSamples.length === 0}
                  {...register("scenario.kind")}
                />{" "}
                As found in an earlier sample
              </label>
            </fieldset>
            {kind === "pattern" ? (
              <div className="grid gap-x-4 sm:grid-cols-3">
                <Field label="Items misstated (%)" error={scenarioErrors?.misstatedPercent?.message}>
                  <Input
                    inputMode="decimal"
                    className="figures text-right"
                    {...register("scenario.misstatedPercent")}
                  />
                </Field>
                <Field label="Size of each misstatement" error={scenarioErrors?.tainting?.message}>
                  <Select {...register("scenario.tainting")}>
                    {TAINTING_PATTERN_KEYS.map((k) => (
                      <option key={k} value={k}>
                        {TAINTING_PATTERN_LABELS[k]}
                      </option>
                    ))}
                  </Select>
                </Field>
                <Field label="Of which overstatements (%)" error={scenarioErrors?.overstatementPercent?.message}>
                  <Input
                    inputMode="decimal"
                    className="figures text-right"
                    {...register("scenario.overstatementPercent")}
                  />
                </Field>
              </div>
            ) : (
              <Field
                label="Earlier sample"
                error={scenarioErrors?.sampleId?.message}
                hint="Its audited values give the share misstated and the taintings to draw from."
              >
                <Select {...register("scenario.sampleId")}>
                  {state.previousSamples.map((s) => (
                    <option key={s.id} value={s.id}>
                      {s.name}
                    </option>
                  ))}
                </Select>
              </Field>
            )}
            <div className="grid gap-x-4 sm:grid-cols-3">
              <Field
                label="Sample sizes"
                error={errors.sampleSizes?.message}
                hint={`Up to 6, separated by commas; the plan's is ${plannedSize}.`}
              >
                <Input className="figures" {...register("sampleSizes")} />
              </Field>
              <Field label="Trials per size" error={errors.trials?.message}>
                <Input inputMode="numeric" className="figures text-right" {...register("trials")} />
              </Field>
              <Field
                label="Simulation seed (optional)"
                error={errors.seed?.message}
                hint="Leave empty for a fresh random seed; it is stored with the run."
              >
                <Input inputMode="numeric" className="figures text-right" {...register("seed")} />
              </Field>
            </div>
            <div className="flex items-center gap-3">
              <Button type="submit" disabled={running || isSubmitting}>
                {running ? "Running…" : "Run the advisor"}
              </Button>
              {running && (
                <Button type="button" variant="secondary" onClick={cancel}>
                  Cancel
                </Button>
              )}
            </div>
            {running && (
              <div>
                <div
                  role="progressbar"
                  aria-label="Advisor progress"
                  aria-valuemin={0}
                  aria-valuemax={100}
                  aria-valuenow={percent}
                  className="h-2 overflow-hidden rounded-full bg-paper-sunk"
                >
                  <div className="h-full bg-ledger-600 transition-[width]" style={{ width: `${percent}%` }} />
                </div>
                <p className="mt-1 text-xs text-ink-soft figures">
                  {percent}% · {formatCount(progress.done)} of {formatCount(progress.total)} trials
                </p>
              </div>
            )}
          </form>
        )}
        {message && <Alert tone={message.tone}>{message.text}</Alert>}
        {shownRead.error && <Alert tone="error">{shownRead.error.message}</Alert>}
        {shown?.result && (
          <div className="space-y-3 border-t border-ink-line pt-4">
            <div className="flex flex-wrap items-center justify-between gap-2">
              <h3 className="text-sm font-semibold text-ink">
                Run {shown.id} · {formatDateTime(shown.createdAt)} · {shown.createdByName}
              </h3>
              {canRun && state.adopted?.id !== shown.id && (
                <Button type="button" variant="secondary" onClick={() => adopt(shown.id)}>
                  Keep as the rationale for the method
                </Button>
              )}
              {state.adopted?.id === shown.id && <Badge tone="green">Kept with the plan</Badge>}
            </div>
            {canRun && state.adopted?.id !== shown.id && (
              <Field
                label="Reason for keeping this run (required when it recommends another estimator or none)"
                hint="Printed beside the run in the workpaper"
              >
                <Input value={keepReason} maxLength={4000} onChange={(e) => setKeepReason(e.target.value)} />
              </Field>
            )}
            {state.adopted?.id === shown.id && state.adopted.keptReason && (
              <p className="text-sm text-ink-soft">Kept with this reason: {state.adopted.keptReason}</p>
            )}
            <AdvisorResults run={shown} currency={currency} />
          </div>
        )}
        {finished.length > 0 && (
          <details className="text-sm">
            <summary className="cursor-pointer text-ink-soft">Earlier runs ({state.runs.length})</summary>
            <ul className="mt-2 space-y-1">
              {state.runs.map((r) => (
                <li key={r.id} className="flex flex-wrap items-center gap-2">
                  <span className="figures text-ink-soft">#{r.id}</span>
                  <span>
                    {formatDateTime(r.createdAt)} · {r.createdByName} · n = {r.request.sampleSizes.join(", ")} · seed{" "}
                    {r.request.seed}
                  </span>
                  <Badge tone={r.status === "done" ? "green" : r.status === "running" ? "blue" : "neutral"}>
                    {r.status}
                  </Badge>
                  {r.status === "done" && (
                    <button type="button" className="text-ledger-700 underline" onClick={() => showRun(r.id)}>
                      Show
                    </button>
                  )}
                </li>
              ))}
            </ul>
          </details>
        )}
        <p className="text-xs text-ink-faint">{CAUTION}</p>
      </div>
    </Card>
  );
}
