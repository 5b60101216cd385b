"use client";
import type { UseFormReturn } from "react-hook-form";
import { STRATIFIED_ESTIMATORS, VARIABLES_ESTIMATORS } from "@/lib/validation/sample";
import type { SamplePlan } from "@/lib/samples/plan";
import { Field, Input, Select } from "@/components/ui/field";
import { Amount } from "@/components/ui/amount";
import { ESTIMATOR_LABELS } from "./labels";
import { PercentInput } from "./percent-input";
import { StrataBoundsEditor } from "./strata-bounds-editor";
import type { PlanFormIn, PlanFormOut } from "./plan-values";
import { formatMoney } from "@/lib/format/number";
import { PlanSpreadFields, type EarlierSample } from "./plan-spread-fields";
import { PlanAttributeMode } from "./plan-attribute-mode";

interface Props {
  form: UseFormReturn<PlanFormIn, unknown, PlanFormOut>;
  plan: SamplePlan | null;
  currency: string;
  performanceMateriality: string;
  earlierSamples?: EarlierSample[];
}

const SIZE_METHOD_TEXT = {
  "confidence-factor": "confidence factors (current Guide)",
  "expansion-factor": "expansion factors (older Guide presentation)",
} as const;

const money = "figures text-right";

/** The parameters the chosen method needs, with the firm's usual defaults filled in. */
export function PlanParameters({ form, plan, currency, performanceMateriality, earlierSamples = [] }: Props) {
  const {
    register,
    watch,
    setValue,
    formState: { errors },
  } = form;
  const method = watch("params.method");
  const e = errors.params;
  const classical = method === "random" || method === "systematic" || method === "stratified";
  const estimators = method === "stratified" ? STRATIFIED_ESTIMATORS : VARIABLES_ESTIMATORS;
  const bounds = (watch("params.strataBounds") ?? []).map(String);
  const selection = watch("params.selection");
  const byFrequency = method === "attribute" && watch("params.attributeMode") === "control-frequency";

  return (
    <div className="grid gap-x-4 sm:grid-cols-2">
      {classical && (
        <Field
          label="Estimator"
          error={e?.estimator?.message}
          hint={
            method === "stratified"
              ? "Separate ratio suits strata with many misstatements each; combined ratio otherwise"
              : "Difference and ratio need misstatements in the sample to be reliable"
          }
        >
          <Select {...register("params.estimator")}>
            <option value="">Choose…</option>
            {estimators.map((k) => (
              <option key={k} value={k}>
                {ESTIMATOR_LABELS[k]}
              </option>
            ))}
          </Select>
        </Field>
      )}
      {method === "nonstatistical" && (
        <>
          <Field
            label="Selection of the rest"
            error={e?.selection?.message}
            hint={
              selection === "haphazard"
                ? "You pick the items on the population grid after the draw; each pick is recorded with who and when. It cannot be re-performed from a seed."
                : "Seeded, re-performable by anyone"
            }
          >
            <Select {...register("params.selection")}>
              <option value="random">Random (seeded)</option>
              <option value="systematic">Systematic with a random start</option>
              <option value="haphazard">Haphazard (picked by the auditor)</option>
              <option value="block">Block of contiguous items</option>
            </Select>
          </Field>
          <Field
            label="Projection of misstatement"
            error={e?.projection?.message}
            hint="Ratio: misstatement ÷ sampled book × remainder book. Difference: misstatement per item × remainder items."
          >
            <Select {...register("params.projection")}>
              <option value="ratio">Ratio</option>
              <option value="difference">Difference</option>
            </Select>
          </Field>
        </>
      )}
      {method === "attribute" && <PlanAttributeMode form={form} />}
      {method === "attribute" ? (
        !byFrequency && (
          <>
            <Field label="Tolerable deviation rate" error={e?.tolerableRate?.message}>
              <PercentInput {...register("params.tolerableRate")} />
            </Field>
            <Field label="Expected deviation rate" error={e?.expectedRate?.message}>
              <PercentInput {...register("params.expectedRate")} />
            </Field>
            <Field
              label="Plan"
              error={e?.attributePlan?.message}
              hint="A fixed sample is never extended once results exist; a two-stage plan fixes its stage 2 now, drawn only after exactly one deviation"
            >
              <Select {...register("params.attributePlan")}>
                <option value="fixed">Fixed size</option>
                <option value="two-stage">Two-stage (planned)</option>
              </Select>
            </Field>
          </>
        )
      ) : (
        <>
          <Field
            label={`Tolerable misstatement (${currency})`}
            error={e?.tolerableMisstatement?.message}
            hint={`Performance materiality on this engagement: ${formatMoney(performanceMateriality)}`}
          >
            <Input inputMode="decimal" className={money} {...register("params.tolerableMisstatement")} />
          </Field>
          <Field label={`Expected misstatement (${currency})`} error={e?.expectedMisstatement?.message}>
            <Input inputMode="decimal" className={money} {...register("params.expectedMisstatement")} />
          </Field>
        </>
      )}
      {classical && (
        <Field
          label="Risk of incorrect rejection"
          error={e?.riskOfIncorrectRejection?.message}
          hint="Two-sided when both directions are tested, one-sided for one direction; sets how wide the planned allowance is"
        >
          <PercentInput {...register("params.riskOfIncorrectRejection")} />
        </Field>
      )}
      {method === "mus" && (
        <>
          <Field
            label={`Top-stratum threshold (${currency})`}
            error={e?.topStratumThreshold?.message}
            hint={
              plan?.interval !== undefined
                ? `Blank: the sampling interval, ${formatMoney(plan.interval)}. Items at or above it are all tested.`
                : "Blank: the sampling interval. Items at or above it are all tested."
            }
          >
            <Input
              inputMode="decimal"
              className={money}
              placeholder={plan?.interval !== undefined ? String(plan.interval) : ""}
              {...register("params.topStratumThreshold")}
            />
          </Field>
          <p className="self-center text-xs text-ink-soft" data-testid="mus-methodology">
            {plan?.sizeMethod ? (
              <>
                Sized with {SIZE_METHOD_TEXT[plan.sizeMethod]}; factors{" "}
                {plan.factorMode === "table"
                  ? "rounded up to 2 decimals, as printed tables"
                  : "exact (gamma quantiles)"}
                . Both are set in the firm&apos;s methodology settings and recorded with the plan.
              </>
            ) : (
              "The size method and the factors come from the firm’s methodology settings and are recorded with the plan."
            )}
          </p>
        </>
      )}
      {(method === "random" || method === "systematic") && (
        <PlanSpreadFields form={form} earlierSamples={earlierSamples} currency={currency} />
      )}
      {method === "stratified" && (
        <div className="sm:col-span-2">
          <StrataBoundsEditor
            value={bounds}
            currency={currency}
            error={(e?.strataBounds as { message?: string } | undefined)?.message}
            onChange={(b) =>
              setValue("params.strataBounds", b, { shouldDirty: true, shouldValidate: form.formState.isSubmitted })
            }
          />
        </div>
      )}
      {plan?.topStratum && method === "mus" && plan.topStratum.count > 0 && (
        <p className="text-xs text-ink-soft sm:col-span-2">
          The top stratum holds {plan.topStratum.count} items worth{" "}
          <Amount value={plan.topStratum.total} currency={currency} />; each is examined in full and its misstatement is
          taken at its actual amount.
        </p>
      )}
    </div>
  );
}
