"use client";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { DrawSchema } from "@/lib/validation/sample";
import { Field, Input } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { apiFetch, ApiError } from "@/components/ui/api";
import type { SampleView } from "./types";
import { textOf } from "@/lib/format/text";

type In = z.input<typeof DrawSchema>;
type Out = z.output<typeof DrawSchema>;

interface Props {
  engagementId: number;
  sampleId: number;
  currentVersion: number | null;
  populationReady: boolean;
  onDrawn: (view: SampleView) => void;
  /** A haphazard selection has no seed (the server refuses one): no seed field then. */
  seeded?: boolean;
}

/** Draws on the server; an entered seed re-performs a draw made elsewhere. Drawing again makes a new version. */
export function DrawForm({ engagementId, sampleId, currentVersion, populationReady, onDrawn, seeded = true }: Props) {
  const [failure, setFailure] = useState<string | null>(null);
  const [confirming, setConfirming] = useState(false);
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<In, unknown, Out>({ resolver: zodResolver(DrawSchema), defaultValues: { seed: "" } });

  const onSubmit = handleSubmit(async ({ seed }) => {
    if (currentVersion !== null && !confirming) {
      setConfirming(true);
      return;
    }
    setFailure(null);
    try {
      const view = await apiFetch<SampleView>(`/api/engagements/${engagementId}/samples/${sampleId}/draw`, {
        body: seed === undefined || !seeded ? {} : { seed },
      });
      setConfirming(false);
      reset({ seed: "" });
      onDrawn(view);
    } catch (err) {
      if (err instanceof ApiError && err.fields?.seed) setError("seed", { message: err.fields.seed[0] });
      setFailure(err instanceof Error ? err.message : "The sample could not be drawn");
    }
  });

  const next = (currentVersion ?? 0) + 1;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3">
      {failure && <Alert>{failure}</Alert>}
      {!populationReady && (
        <Alert tone="info">The population is not reconciled yet; the server will refuse the draw until it is.</Alert>
      )}
      {seeded ? (
        <Field
          label="Seed (optional)"
          error={errors.seed?.message}
          hint="Leave blank for a seed generated on the server. Enter one (0 to 4294967295) to re-perform a selection made elsewhere."
        >
          <Input
            inputMode="numeric"
            className="figures max-w-56"
            {...register("seed", { setValueAs: (v: unknown) => (textOf(v).trim() === "" ? undefined : v) })}
          />
        </Field>
      ) : (
        <p className="text-sm text-ink-soft">
          A haphazard selection has no seed: drawing sets the key items, then you pick the rest from the population on
          this tab.
        </p>
      )}
      {confirming && (
        <Alert tone="info">
          Drawing again creates version {next}. Version {currentVersion} and any results recorded on it are kept for the
          record; fieldwork continues on version {next}.
        </Alert>
      )}
      <div className="flex gap-2">
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting
            ? "Drawing…"
            : currentVersion === null
              ? "Draw the sample"
              : confirming
                ? `Confirm: draw version ${next}`
                : "Draw again…"}
        </Button>
        {confirming && (
          <Button type="button" variant="ghost" onClick={() => setConfirming(false)}>
            Keep version {currentVersion}
          </Button>
        )}
      </div>
    </form>
  );
}
