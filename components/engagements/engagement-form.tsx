"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { CreateEngagementSchema } from "@/lib/validation/engagement";
import { Field, Input } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { apiFetch, ApiError } from "@/components/ui/api";
import type { EngagementRecord } from "@/lib/data/engagements";

type FormIn = z.input<typeof CreateEngagementSchema>;
type FormOut = z.output<typeof CreateEngagementSchema>;

export function EngagementForm() {
  const router = useRouter();
  const [failure, setFailure] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(CreateEngagementSchema),
    defaultValues: { currency: "USD" },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFailure(null);
    try {
      const { engagement } = await apiFetch<{ engagement: EngagementRecord }>("/api/engagements", { body: values });
      router.push(`/engagements/${engagement.id}`);
    } catch (err) {
      if (err instanceof ApiError && err.fields) {
        for (const [field, messages] of Object.entries(err.fields))
          setError(field as keyof FormIn, { message: messages[0] });
      }
      setFailure(err instanceof Error ? err.message : "Could not create the engagement");
    }
  });

  const text = (
    name: keyof FormIn,
    label: string,
    props: React.InputHTMLAttributes<HTMLInputElement> = {},
    hint?: string,
  ) => (
    <Field label={label} error={errors[name]?.message} hint={hint}>
      <Input {...props} {...register(name)} />
    </Field>
  );

  return (
    <form onSubmit={onSubmit} noValidate className="grid max-w-2xl gap-x-6 gap-y-1 sm:grid-cols-2">
      {failure && (
        <div className="sm:col-span-2">
          <Alert>{failure}</Alert>
        </div>
      )}
      <div className="sm:col-span-2">{text("clientName", "Client")}</div>
      <div className="sm:col-span-2">
        {text("name", "Engagement name", { placeholder: "e.g. Financial statement audit FY2026" })}
      </div>
      {text("periodEnd", "Period end", { type: "date" })}
      {text("currency", "Currency", { maxLength: 3, className: "uppercase" }, "ISO 4217 code")}
      {text("overallMateriality", "Overall materiality", { inputMode: "decimal", className: "figures text-right" })}
      {text(
        "performanceMateriality",
        "Performance materiality",
        { inputMode: "decimal", className: "figures text-right" },
        "Default tolerable misstatement for samples",
      )}
      <div className="pt-2 sm:col-span-2">
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? "Creating…" : "Create engagement"}
        </Button>
      </div>
    </form>
  );
}
