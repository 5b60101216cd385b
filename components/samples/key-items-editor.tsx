"use client";
import { useFieldArray, type UseFormReturn } from "react-hook-form";
import type { SamplePlan } from "@/lib/samples/plan";
import { Field, Input } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Amount } from "@/components/ui/amount";
import type { PlanFormIn, PlanFormOut } from "./plan-values";

/** Key items: a threshold (every item at or above it) and items chosen one by one with a reason; all examined 100 %. */
export function KeyItemsEditor({
  form,
  plan,
  currency,
}: {
  form: UseFormReturn<PlanFormIn, unknown, PlanFormOut>;
  plan: SamplePlan | null;
  currency: string;
}) {
  const {
    register,
    control,
    formState: { errors },
  } = form;
  const { fields, append, remove } = useFieldArray({ control, name: "params.keyItems" });
  const e = errors.params;
  const k = plan?.keyItems;
  return (
    <div className="space-y-3" data-testid="key-items-editor">
      <Field
        label={`Key-item threshold (${currency})`}
        error={e?.keyItemThreshold?.message}
        hint="Blank: no threshold. Every item at or above it is examined in full and kept out of the sample."
      >
        <Input inputMode="decimal" className="figures text-right" {...register("params.keyItemThreshold")} />
      </Field>
      {fields.map((f, i) => (
        <div key={f.id} className="grid gap-x-3 rounded-md border border-ink-line/60 p-3 sm:grid-cols-[10rem_1fr_auto]">
          <Field label={`Key item ${i + 1}: reference`} error={e?.keyItems?.[i]?.itemRef?.message}>
            <Input {...register(`params.keyItems.${i}.itemRef`)} />
          </Field>
          <Field label={`Key item ${i + 1}: why it is examined in full`} error={e?.keyItems?.[i]?.reason?.message}>
            <Input {...register(`params.keyItems.${i}.reason`)} />
          </Field>
          <div className="self-center">
            <Button type="button" variant="secondary" onClick={() => remove(i)} aria-label={`Remove key item ${i + 1}`}>
              Remove
            </Button>
          </div>
        </div>
      ))}
      <Button type="button" variant="secondary" onClick={() => append({ itemRef: "", reason: "" })}>
        Add a key item by reference
      </Button>
      {k && (
        <p className="text-sm text-ink-soft" data-testid="key-items-summary">
          <span className="figures font-medium text-ink">{k.count}</span> key items worth{" "}
          <Amount value={k.total} currency={currency} /> are examined in full; the sample is sized and drawn on the
          other <span className="figures">{k.remainder.count.toLocaleString("en-US")}</span> items (
          <Amount value={k.remainder.total} currency={currency} />
          ).
        </p>
      )}
    </div>
  );
}
