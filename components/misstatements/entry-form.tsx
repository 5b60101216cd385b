"use client";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { EntrySchema } from "@/lib/validation/misstatements";
import { Field, Input, Select, Textarea } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { ApiError } from "@/components/ui/api";
import { useSummaryAction } from "./use-summary-action";

type FormIn = z.input<typeof EntrySchema>;
type FormOut = z.output<typeof EntrySchema>;

export interface EntryDefaults {
  id: number;
  version: number;
  values: FormIn;
}

const HINTS = {
  amount:
    "Misstatement of the account: positive overstates it, negative (−) understates it. Prior period: the amount carried forward.",
  incomeEffect:
    "Effect on profit before tax, positive = overstated. Prior period: its effect on this period's profit (income-statement approach).",
  balanceEffect:
    "Effect on net assets, positive = overstated. Prior period: its effect on the closing balance sheet (balance-sheet approach).",
};

/** Adds (or edits) a misstatement found outside sampling: the same zod schema as the route. */
export function EntryForm({
  engagementId,
  editing,
  onDone,
}: {
  engagementId: number;
  editing?: EntryDefaults;
  onDone?: () => void;
}) {
  const { act, busy, message } = useSummaryAction(engagementId);
  const [corrected, setCorrected] = useState(Boolean(editing?.values.corrected));
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors },
  } = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(EntrySchema),
    defaultValues: editing?.values ?? {
      kind: "judgemental",
      account: "",
      assertion: "",
      description: "",
      amount: "",
      incomeEffect: "",
      balanceEffect: "",
      corrected: null,
    },
  });
  const onSubmit = handleSubmit(async (values) => {
    const body = { ...values, corrected: corrected ? values.corrected : null };
    const fieldErrors = (err: unknown) => {
      if (err instanceof ApiError && err.fields)
        for (const [f, m] of Object.entries(err.fields)) setError(f as keyof FormIn, { message: m[0] });
    };
    const ok = editing
      ? await act(
          `/entries/${editing.id}`,
          { method: "PATCH", body: { ...body, version: editing.version } },
          "Entry saved.",
          fieldErrors,
        )
      : await act("/entries", { body }, "Misstatement added to the summary.", fieldErrors);
    if (ok) {
      if (!editing) reset();
      onDone?.();
    }
  });
  const field = (
    name: "account" | "assertion" | "amount" | "incomeEffect" | "balanceEffect",
    label: string,
    numeric = false,
  ) => (
    <Field label={label} error={errors[name]?.message} hint={numeric ? HINTS[name as keyof typeof HINTS] : undefined}>
      <Input
        inputMode={numeric ? "decimal" : undefined}
        className={numeric ? "figures text-right" : ""}
        {...register(name)}
      />
    </Field>
  );
  return (
    <form
      onSubmit={(e) => void onSubmit(e)}
      noValidate
      aria-label={editing ? "Edit misstatement" : "Add a misstatement"}
      className="grid gap-x-6 gap-y-1 sm:grid-cols-2 lg:grid-cols-3"
    >
      {message && (
        <div className="sm:col-span-2 lg:col-span-3">
          <Alert tone={message.tone}>{message.text}</Alert>
        </div>
      )}
      <Field label="Kind" error={errors.kind?.message}>
        <Select {...register("kind")}>
          <option value="factual">Factual — found outside sampling</option>
          <option value="judgemental">Judgemental — a difference in an estimate</option>
          <option value="prior-period">Prior period — uncorrected, carried forward</option>
        </Select>
      </Field>
      {field("account", "Account")}
      {field("assertion", "Assertion")}
      <div className="sm:col-span-2 lg:col-span-3">
        <Field label="Description" error={errors.description?.message}>
          <Textarea rows={2} {...register("description")} />
        </Field>
      </div>
      {field("amount", "Amount", true)}
      {field("incomeEffect", "Income-statement effect", true)}
      {field("balanceEffect", "Balance-sheet effect", true)}
      <div className="sm:col-span-2 lg:col-span-3">
        <label className="inline-flex items-center gap-2 text-sm">
          <input type="checkbox" checked={corrected} onChange={(e) => setCorrected(e.target.checked)} /> Corrected by
          the client
        </label>
      </div>
      {corrected && (
        <>
          <Field label="Corrected on" error={errors.corrected?.on?.message}>
            <Input type="date" {...register("corrected.on")} />
          </Field>
          <Field label="Client's adjustment reference" error={errors.corrected?.reference?.message}>
            <Input {...register("corrected.reference")} />
          </Field>
        </>
      )}
      <div className="flex gap-2 pt-2 sm:col-span-2 lg:col-span-3">
        <Button type="submit" disabled={busy}>
          {busy ? "Saving…" : editing ? "Save entry" : "Add misstatement"}
        </Button>
        {editing && (
          <Button type="button" variant="secondary" onClick={onDone}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}
