"use client";
import type { UseFormReturn } from "react-hook-form";
import { CONTROL_FREQUENCIES } from "@/lib/validation/methodology";
import { CONTROL_FREQUENCY_LABELS } from "@/lib/validation/sample";
import { Field, Select } from "@/components/ui/field";
import type { PlanFormIn, PlanFormOut } from "./plan-values";

/** Attribute plans: a statistical size, or the firm's minimum for a manual control by how often it operates. */
export function PlanAttributeMode({ form }: { form: UseFormReturn<PlanFormIn, unknown, PlanFormOut> }) {
  const {
    register,
    watch,
    formState: { errors },
  } = form;
  const e = errors.params;
  const byFrequency = watch("params.attributeMode") === "control-frequency";
  return (
    <>
      <Field
        label="Size set by"
        error={e?.attributeMode?.message}
        hint={
          byFrequency
            ? "The firm's control-frequency table (methodology settings)"
            : "Risk of overreliance and deviation rates"
        }
      >
        <Select {...register("params.attributeMode")}>
          <option value="statistical">Statistical attribute plan</option>
          <option value="control-frequency">Control frequency (manual control)</option>
        </Select>
      </Field>
      {byFrequency && (
        <Field label="How often the control operates" error={e?.controlFrequency?.message}>
          <Select {...register("params.controlFrequency")}>
            <option value="">Choose…</option>
            {CONTROL_FREQUENCIES.map((f) => (
              <option key={f} value={f}>
                {CONTROL_FREQUENCY_LABELS[f]}
              </option>
            ))}
          </Select>
        </Field>
      )}
    </>
  );
}
