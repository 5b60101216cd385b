"use client";
import type { UseFormReturn } from "react-hook-form";
import type { SamplePlan } from "@/lib/samples/plan";
import { Field, Input, Textarea } from "@/components/ui/field";
import type { PlanFormIn, PlanFormOut } from "./plan-values";
import { textOf } from "@/lib/format/text";

/** The size actually drawn: blank for the computed size, larger at will, smaller only with a recorded reason. */
export function SizeChoice({
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
  const typed = Number(textOf(watch("params.sampleSize")).trim() || NaN);
  const below = plan !== null && Number.isInteger(typed) && typed < plan.computedSize;
  return (
    <div className="grid gap-x-4 sm:grid-cols-2">
      <Field
        label="Items to select"
        error={errors.params?.sampleSize?.message}
        hint={
          plan
            ? `Blank: the computed ${plan.computedSize}. You may raise it; a smaller sample needs a recorded reason.`
            : "Blank: the computed size."
        }
      >
        <Input
          inputMode="numeric"
          className="figures text-right"
          placeholder={plan ? String(plan.computedSize) : ""}
          {...register("params.sampleSize")}
        />
      </Field>
      {(below || watch("params.sizeReason")) && (
        <div className="sm:col-span-2">
          <Field
            label="Reason for a size below the computed one"
            error={errors.params?.sizeReason?.message}
            hint="Kept with the plan and in the audit log; the reviewer sees it."
          >
            <Textarea rows={2} {...register("params.sizeReason")} />
          </Field>
        </div>
      )}
    </div>
  );
}
