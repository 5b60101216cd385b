"use client";
import type { UseFormReturn } from "react-hook-form";
import { RISK_LEVELS, RISK_LEVEL_LABELS } from "@/lib/validation/methodology";
import type { SamplePlan } from "@/lib/samples/plan";
import { Field, Select, Textarea } from "@/components/ui/field";
import { PercentInput } from "./percent-input";
import type { PlanFormIn, PlanFormOut } from "./plan-values";
import { formatPercent } from "@/lib/format/number";

const riskOptions = [
  <option key="" value="">
    Choose…
  </option>,
  ...RISK_LEVELS.map((r) => (
    <option key={r} value={r}>
      {RISK_LEVEL_LABELS[r]}
    </option>
  )),
];

/**
 * The two assessed risks that set the confidence (and the assurance factor) through the firm's
 * table, or a typed confidence as an override with its reason.
 */
export function RiskSizingFields({
  form,
  plan,
}: {
  form: UseFormReturn<PlanFormIn, unknown, PlanFormOut>;
  plan: SamplePlan | null;
}) {
  const {
    register,
    watch,
    formState: { errors },
  } = form;
  const e = errors.params;
  const basis = watch("params.sizingBasis");
  const method = watch("params.method");
  const risk = plan?.risk;
  return (
    <div className="grid gap-x-4 sm:grid-cols-2">
      <div className="sm:col-span-2">
        <Field
          label="Confidence from"
          error={e?.sizingBasis?.message}
          hint="The firm's assurance-factor table maps the two assessed risks to a factor and a confidence."
        >
          <Select {...register("params.sizingBasis")}>
            <option value="risk-assessment">The risk assessment</option>
            <option value="confidence-override">A typed confidence (override, with a reason)</option>
          </Select>
        </Field>
      </div>
      <Field
        label="Assessed risk of material misstatement"
        error={e?.assessedRisk?.message}
        hint="Inherent and control risk combined"
      >
        <Select {...register("params.assessedRisk")}>{riskOptions}</Select>
      </Field>
      <Field
        label="Risk other substantive procedures fail to detect"
        error={e?.otherProceduresRisk?.message}
        hint="Reliance on analytical and other tests of the same assertion"
      >
        <Select {...register("params.otherProceduresRisk")}>{riskOptions}</Select>
      </Field>
      {risk && risk.tableFactor !== null && (
        <p className="text-sm sm:col-span-2" data-testid="risk-mapping">
          Table cell: assurance factor <span className="figures font-semibold">{risk.tableFactor.toFixed(2)}</span>,
          confidence <span className="figures font-semibold">{formatPercent(risk.tableConfidence ?? 0, 2)}</span>
          <span className="text-ink-soft">
            {" "}
            — firm methodology{" "}
            {risk.tableVersion === 0
              ? "defaults (version 0, values from memory; the firm must confirm them)"
              : `version ${risk.tableVersion}`}
          </span>
        </p>
      )}
      {basis === "confidence-override" && (
        <>
          <Field
            label="Confidence"
            error={e?.confidence?.message}
            hint={
              method === "attribute" ? "1 − risk of overreliance on the control" : "1 − risk of incorrect acceptance"
            }
          >
            <PercentInput {...register("params.confidence")} />
          </Field>
          <Field
            label="Reason for typing the confidence"
            error={e?.confidenceReason?.message}
            hint="Kept with the plan; printed in the workpaper."
          >
            <Textarea rows={2} {...register("params.confidenceReason")} />
          </Field>
        </>
      )}
    </div>
  );
}
