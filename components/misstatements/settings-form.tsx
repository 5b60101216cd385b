"use client";
import { useState } from "react";
import type { SummaryMateriality } from "@/lib/misstatements/types";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field, Input } from "@/components/ui/field";
import { useSummaryAction } from "./use-summary-action";

/** Managers and partners: the clearly trivial threshold and the share of performance materiality that counts as approaching. */
export function SettingsForm({ engagementId, materiality }: { engagementId: number; materiality: SummaryMateriality }) {
  const { act, busy, message } = useSummaryAction(engagementId);
  const [trivial, setTrivial] = useState(materiality.clearlyTrivial);
  const [share, setShare] = useState(String(Math.round(materiality.approachingShare * 10000) / 100));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const save = () =>
    void act(
      "/settings",
      { method: "PUT", body: { clearlyTrivial: trivial, approachingShare: Number(share) / 100 } },
      "Thresholds saved.",
      (err) => {
        const fields = (err as { fields?: Record<string, string[]> }).fields ?? {};
        setErrors(Object.fromEntries(Object.entries(fields).map(([k, v]) => [k, v[0]])));
      },
    );
  return (
    <form
      onSubmit={(e) => {
        e.preventDefault();
        setErrors({});
        save();
      }}
      className="grid gap-x-6 sm:grid-cols-[1fr_1fr_auto] sm:items-start"
      aria-label="Thresholds"
    >
      {message && (
        <div className="sm:col-span-3">
          <Alert tone={message.tone}>{message.text}</Alert>
        </div>
      )}
      <Field
        label="Clearly trivial threshold"
        error={errors.clearlyTrivial}
        hint="Entries below it are listed but not accumulated (AU-C 450 / ISA 450)."
      >
        <Input
          inputMode="decimal"
          className="figures text-right"
          value={trivial}
          onChange={(e) => setTrivial(e.target.value)}
        />
      </Field>
      <Field
        label="Approaching above (% of performance materiality)"
        error={errors.approachingShare}
        hint="Default 75 % (common practice)."
      >
        <Input
          inputMode="decimal"
          className="figures text-right"
          value={share}
          onChange={(e) => setShare(e.target.value)}
        />
      </Field>
      <div className="pt-6">
        <Button type="submit" variant="secondary" disabled={busy}>
          Save thresholds
        </Button>
      </div>
    </form>
  );
}
