"use client";
import { useEffect, useRef, useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import { ReplaceItemSchema } from "@/lib/validation/sample";
import { Field, Input } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { apiFetch } from "@/components/ui/api";

type In = z.input<typeof ReplaceItemSchema>;
type Out = z.output<typeof ReplaceItemSchema>;

/** Voids an item that cannot be used (with the reason) and takes the next one from the same random stream. */
export function ReplaceDialog({
  url,
  item,
  onClose,
  onReplaced,
}: {
  url: string;
  item: SampleItemRecord;
  onClose: () => void;
  onReplaced: () => void;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const [failure, setFailure] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<In, unknown, Out>({ resolver: zodResolver(ReplaceItemSchema), defaultValues: { reason: "" } });
  useEffect(() => {
    ref.current?.showModal();
  }, []);
  const onSubmit = handleSubmit(async (body) => {
    setFailure(null);
    try {
      await apiFetch(url, { body });
      onReplaced();
    } catch (err) {
      setFailure(err instanceof Error ? err.message : "The item could not be replaced");
    }
  });
  return (
    <dialog
      ref={ref}
      onClose={onClose}
      aria-labelledby="replace-title"
      className="w-full max-w-lg rounded-card border border-ink-line bg-paper-raised p-0 shadow-card backdrop:bg-ink/30"
    >
      <form onSubmit={onSubmit} noValidate className="space-y-3 p-5">
        <h2 id="replace-title" className="text-lg font-semibold">
          Replace {item.itemRef}
        </h2>
        <p className="text-sm text-ink-soft">
          The item is kept, marked void with your reason, and the next item in the random-number order takes its place.
          Use this only for items that cannot be part of the population (e.g. a voided document) — an item you simply
          cannot audit is recorded as “could not be audited” instead.
        </p>
        {failure && <Alert>{failure}</Alert>}
        <Field label="Why the item cannot be used" error={errors.reason?.message}>
          <Input autoFocus {...register("reason")} />
        </Field>
        <div className="flex justify-end gap-2">
          <Button type="button" variant="ghost" onClick={() => ref.current?.close()}>
            Cancel
          </Button>
          <Button type="submit" disabled={isSubmitting}>
            {isSubmitting ? "Replacing…" : "Void and replace"}
          </Button>
        </div>
      </form>
    </dialog>
  );
}
