"use client";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field, Input } from "@/components/ui/field";

/** Date and the client's adjustment reference, for marking a sample's part as corrected. */
export function CorrectionForm({
  busy,
  onSave,
  onCancel,
}: {
  busy: boolean;
  onSave: (c: { on: string; reference: string }) => void;
  onCancel: () => void;
}) {
  const [on, setOn] = useState(new Date().toISOString().slice(0, 10));
  const [reference, setReference] = useState("");
  return (
    <form
      className="mt-2 grid gap-2 sm:grid-cols-[10rem_1fr_auto]"
      onSubmit={(e) => {
        e.preventDefault();
        onSave({ on, reference });
      }}
      aria-label="Mark corrected"
    >
      <Field label="Corrected on">
        <Input type="date" value={on} onChange={(e) => setOn(e.target.value)} />
      </Field>
      <Field label="Client's adjustment reference">
        <Input value={reference} onChange={(e) => setReference(e.target.value)} />
      </Field>
      <div className="flex items-center gap-2">
        <Button type="submit" disabled={busy}>
          Save
        </Button>
        <Button type="button" variant="ghost" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
