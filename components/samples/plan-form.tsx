"use client";
import { useEffect, useRef, useState } from "react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useForm, type FieldPath, type Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { DIRECTIONS, PlanSampleSchema, SAMPLE_METHODS } from "@/lib/validation/sample";
import type { SampleRecord } from "@/lib/data/samples";
import { Field, Input, Select, Textarea } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { Card } from "@/components/ui/card";
import { apiFetch, ApiError } from "@/components/ui/api";
import { DIRECTION_LABELS, METHOD_LABELS } from "./labels";
import { PlanParameters } from "./plan-parameters";
import type { EarlierSample } from "./plan-spread-fields";
import { PopulationPicker } from "./population-picker";
import { SizePanel } from "./size-panel";
import { SizeChoice } from "./size-choice";
import { usePlanPreview } from "./use-plan-preview";
import { RiskSizingFields } from "./risk-sizing-fields";
import { KeyItemsEditor } from "./key-items-editor";
import { KEY_ITEM_METHODS } from "@/lib/validation/sample";
import {
  defaultPlanValues,
  formFieldOf,
  suggestedBounds,
  toRequest,
  type PlanFormIn,
  type PlanFormOut,
  type PopulationChoice,
} from "./plan-values";

const schemaResolver = zodResolver(PlanSampleSchema);
const resolver: Resolver<PlanFormIn, unknown, PlanFormOut> = (values, context, options) =>
  schemaResolver(toRequest(values), context, options);
const ASSERTIONS = [
  "Existence",
  "Occurrence",
  "Valuation and allocation",
  "Accuracy",
  "Completeness",
  "Cut-off",
  "Rights and obligations",
];

interface Props {
  engagementId: number;
  currency: string;
  performanceMateriality: string;
  populations: PopulationChoice[];
  /** When editing a plan not yet drawn. */
  editing?: { sampleId: number; values: PlanFormIn };
  initialPopulationId?: number;
  /** Drawn samples of this engagement with audited values, for a planning spread from their results. */
  earlierSamples?: EarlierSample[];
}

/** Plans a sample: what is tested, the method and its parameters, with the size computed live by the server. */
export function PlanForm({
  engagementId,
  currency,
  performanceMateriality,
  populations,
  editing,
  initialPopulationId,
  earlierSamples,
}: Props) {
  const router = useRouter();
  const [failure, setFailure] = useState<string | null>(null);
  const form = useForm<PlanFormIn, unknown, PlanFormOut>({
    resolver,
    defaultValues: editing?.values ?? defaultPlanValues(performanceMateriality, initialPopulationId),
  });
  const {
    register,
    handleSubmit,
    watch,
    setValue,
    setError,
    formState: { errors, isSubmitting },
  } = form;
  const values = watch();
  const preview = usePlanPreview(engagementId, toRequest(values));
  const population = populations.find((p) => p.id === Number(values.populationId));
  const { clearErrors } = form;
  const previewErrors = useRef<string[]>([]);

  // The server's field messages for the parameters being typed show under their fields, and go when fixed.
  useEffect(() => {
    for (const f of previewErrors.current) clearErrors(f as FieldPath<PlanFormIn>);
    previewErrors.current = Object.keys(preview.fields ?? {}).map(formFieldOf);
    for (const [k, m] of Object.entries(preview.fields ?? {}))
      setError(formFieldOf(k) as FieldPath<PlanFormIn>, { type: "server", message: m[0] });
  }, [preview.fields, clearErrors, setError]);

  const onMethod = (method: string) => {
    const estimator = String(values.params.estimator ?? "");
    if (method === "stratified") {
      if (!values.params.strataBounds?.length) setValue("params.strataBounds", suggestedBounds(population));
      if (estimator === "ratio" || estimator === "regression") setValue("params.estimator", undefined);
    } else if (estimator === "separate-ratio" || estimator === "combined-ratio")
      setValue("params.estimator", undefined);
  };

  const onSubmit = handleSubmit(async (body) => {
    setFailure(null);
    try {
      const path = editing
        ? `/api/engagements/${engagementId}/samples/${editing.sampleId}`
        : `/api/engagements/${engagementId}/samples`;
      const { sample } = await apiFetch<{ sample: SampleRecord }>(path, { method: editing ? "PATCH" : "POST", body });
      router.push(`/engagements/${engagementId}/samples/${sample.id}`);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.fields)
        for (const [k, m] of Object.entries(err.fields))
          setError(formFieldOf(k) as FieldPath<PlanFormIn>, { message: m[0] });
      setFailure(err instanceof Error ? err.message : "The plan could not be saved");
    }
  });

  const method = values.params.method;
  return (
    <form onSubmit={onSubmit} noValidate className="grid items-start gap-6 lg:grid-cols-5">
      <div className="space-y-6 lg:col-span-3">
        {failure && <Alert>{failure}</Alert>}
        <Card title="What is tested">
          <PopulationPicker form={form} populations={populations} engagementId={engagementId} currency={currency} />
          <Field label="Sample name" error={errors.name?.message} hint="e.g. Trade receivables — existence at year end">
            <Input {...register("name")} />
          </Field>
          <Field label="Objective of the test" error={errors.objective?.message}>
            <Textarea rows={3} {...register("objective")} />
          </Field>
          <div className="grid gap-x-4 sm:grid-cols-2">
            <Field label="Assertion" error={errors.assertion?.message}>
              <Input list="assertion-suggestions" {...register("assertion")} />
              <datalist id="assertion-suggestions">
                {ASSERTIONS.map((a) => (
                  <option key={a} value={a} />
                ))}
              </datalist>
            </Field>
            {method !== "attribute" && (
              <Field label="Misstatement tested for" error={errors.direction?.message}>
                <Select {...register("direction")}>
                  {DIRECTIONS.map((d) => (
                    <option key={d} value={d}>
                      {DIRECTION_LABELS[d]}
                    </option>
                  ))}
                </Select>
              </Field>
            )}
          </div>
        </Card>
        <Card title="Method and parameters">
          <Field label="Sampling method" error={errors.params?.method?.message}>
            <Select
              {...register("params.method", {
                onChange: (e: React.ChangeEvent<HTMLSelectElement>) => onMethod(e.target.value),
              })}
            >
              {SAMPLE_METHODS.map((m) => (
                <option key={m} value={m}>
                  {METHOD_LABELS[m]}
                </option>
              ))}
            </Select>
          </Field>
          <PlanParameters
            form={form}
            plan={preview.plan}
            currency={currency}
            performanceMateriality={performanceMateriality}
            earlierSamples={earlierSamples}
          />
        </Card>
        <Card title="Risk assessment">
          <RiskSizingFields form={form} plan={preview.plan} />
        </Card>
        {KEY_ITEM_METHODS.includes(method) && (
          <Card title="Key items (examined 100 %)">
            <KeyItemsEditor form={form} plan={preview.plan} currency={currency} />
          </Card>
        )}
        <Card title="Size to draw">
          <SizeChoice form={form} plan={preview.plan} />
        </Card>
        <div className="flex items-center gap-3">
          <Button type="submit" disabled={isSubmitting}>
            {isSubmitting ? "Saving…" : editing ? "Save the changed plan" : "Save the plan"}
          </Button>
          <Link
            href={editing ? `/engagements/${engagementId}/samples/${editing.sampleId}` : `/engagements/${engagementId}`}
            className="text-sm text-ink-soft link"
          >
            Cancel
          </Link>
        </div>
      </div>
      <div className="lg:sticky lg:top-6 lg:col-span-2">
        <Card title="Sample size, live">
          <SizePanel plan={preview.plan} problem={preview.problem} busy={preview.busy} currency={currency} />
        </Card>
      </div>
    </form>
  );
}
