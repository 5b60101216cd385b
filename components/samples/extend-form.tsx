"use client";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { ExtendSchema } from "@/lib/validation/sample";
import { Field, Input } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { apiFetch } from "@/components/ui/api";

type In = z.input<typeof ExtendSchema>;
type Out = z.output<typeof ExtendSchema>;

/** Adds items to a random or attribute sample, continuing down the same random-number ranking. */
export function ExtendForm({
  engagementId,
  sampleId,
  onExtended,
}: {
  engagementId: number;
  sampleId: number;
  onExtended: () => void;
}) {
  const [outcome, setOutcome] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const {
    register,
    handleSubmit,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<In, unknown, Out>({ resolver: zodResolver(ExtendSchema), defaultValues: { additional: "", reason: "" } });
  const onSubmit = handleSubmit(async (body) => {
    setOutcome(null);
    try {
      const { extension } = await apiFetch<{ extension: { added: number; streamPosition: number } }>(
        `/api/engagements/${engagementId}/samples/${sampleId}/extend`,
        { body },
      );
      setOutcome({
        tone: "success",
        text: `${extension.added} items added, continuing the random numbers after rank ${extension.streamPosition}.`,
      });
      reset({ additional: "", reason: "" });
      onExtended();
    } catch (err) {
      setOutcome({ tone: "error", text: err instanceof Error ? err.message : "The sample could not be extended" });
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-1">
      {outcome && (
        <div className="mb-2">
          <Alert tone={outcome.tone}>{outcome.text}</Alert>
        </div>
      )}
      <div className="grid gap-x-4 sm:grid-cols-3">
        <Field label="Items to add" error={errors.additional?.message}>
          <Input inputMode="numeric" className="figures text-right" {...register("additional")} />
        </Field>
        <div className="sm:col-span-2">
          <Field label="Why the sample is extended" error={errors.reason?.message}>
            <Input {...register("reason")} />
          </Field>
        </div>
      </div>
      <Button type="submit" variant="secondary" disabled={isSubmitting}>
        {isSubmitting ? "Adding…" : "Extend the sample"}
      </Button>
    </form>
  );
}
