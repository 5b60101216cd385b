"use client";
import type { UseFormReturn } from "react-hook-form";
import { SPREAD_BASES, type SpreadBasis } from "@/lib/validation/sample";
import { Field, Input, Select, Textarea } from "@/components/ui/field";
import type { PlanFormIn, PlanFormOut } from "./plan-values";

export interface EarlierSample {
  id: number;
  name: string;
}

const BASIS_LABELS: Record<SpreadBasis, string> = {
  "book-values": "Book values of this population",
  "prior-sample": "An earlier sample's results (this engagement)",
  entered: "A figure I enter, with its reason",
};

/** The expected standard deviation a classical plan is sized with, and where it comes from. */
export function PlanSpreadFields({
  form,
  earlierSamples,
  currency,
}: {
  form: UseFormReturn<PlanFormIn, unknown, PlanFormOut>;
  earlierSamples: EarlierSample[];
  currency: string;
}) {
  const {
    register,
    watch,
    formState: { errors },
  } = form;
  const e = errors.params;
  const basis = watch("params.spreadBasis");
  const estimator = String(watch("params.estimator") ?? "mean-per-unit");
  const symbol =
    estimator === "difference"
      ? "s_d, the spread of the differences"
      : estimator === "ratio" || estimator === "regression"
        ? "s_e, the spread of the residuals"
        : "the spread of the audited values";
  return (
    <>
      <Field
        label="Expected standard deviation from"
        error={e?.spreadBasis?.message}
        hint={`The size depends on ${symbol}`}
      >
        <Select {...register("params.spreadBasis")}>
          <option value="">Book values (default)</option>
          {SPREAD_BASES.filter((b) => b !== "book-values").map((b) => (
            <option key={b} value={b}>
              {BASIS_LABELS[b]}
            </option>
          ))}
          <option value="book-values">{BASIS_LABELS["book-values"]}, chosen</option>
        </Select>
      </Field>
      {basis === "prior-sample" && (
        <Field
          label="Earlier sample"
          error={e?.spreadSampleId?.message}
          hint={
            earlierSamples.length === 0
              ? "No drawn sample with audited values on this engagement yet"
              : "Its recorded results give the spread for this estimator"
          }
        >
          <Select {...register("params.spreadSampleId")}>
            <option value="">Choose…</option>
            {earlierSamples.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </Select>
        </Field>
      )}
      {basis === "entered" && (
        <>
          <Field label={`Expected standard deviation (${currency})`} error={e?.expectedStdDev?.message}>
            <Input inputMode="decimal" className="figures text-right" {...register("params.expectedStdDev")} />
          </Field>
          <div className="sm:col-span-2">
            <Field
              label="Where the figure comes from"
              error={e?.spreadReason?.message}
              hint="e.g. prior-year sample of the same account, residuals of the ratio estimator"
            >
              <Textarea rows={2} {...register("params.spreadReason")} />
            </Field>
          </div>
        </>
      )}
    </>
  );
}
