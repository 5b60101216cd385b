"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm, type FieldPath } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { CONTROL_FREQUENCY_LABELS } from "@/lib/validation/sample";
import {
  CONTROL_FREQUENCIES,
  DEFAULT_METHODOLOGY,
  MethodologySettingsSchema,
  RISK_LEVELS,
  RISK_LEVEL_LABELS,
  confidenceForFactor,
  type MethodologySettings,
} from "@/lib/validation/methodology";
import type { MethodologyVersion } from "@/lib/data/firm-methodology";
import { Field, Input, Select } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { Card } from "@/components/ui/card";
import { Table, THead, Th, Td } from "@/components/ui/table";
import { apiFetch, ApiError } from "@/components/ui/api";
import { formatDateTime } from "@/lib/format/date";

const num = { valueAsNumber: true } as const;
const cellControl =
  "rounded-md border border-ink-line bg-paper-raised px-2 py-1 text-sm focus:border-ledger-500 focus:outline-none aria-[invalid=true]:border-brick-500";
const cellInput = `${cellControl} w-24 text-right figures`;

/** The firm's methodology settings, validated by the same schema as PUT /api/firm/methodology. */
export function MethodologyForm({ initial }: { initial: MethodologyVersion }) {
  const router = useRouter();
  const [status, setStatus] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const form = useForm<MethodologySettings>({
    resolver: zodResolver(MethodologySettingsSchema),
    defaultValues: initial.settings,
  });
  const {
    register,
    handleSubmit,
    setValue,
    getValues,
    reset,
    setError,
    formState: { errors, isSubmitting, isDirty },
  } = form;

  const onSubmit = handleSubmit(async (settings) => {
    setStatus(null);
    try {
      const { methodology } = await apiFetch<{ methodology: MethodologyVersion }>("/api/firm/methodology", {
        method: "PUT",
        body: settings,
      });
      reset(methodology.settings);
      setStatus({
        tone: "success",
        text: `Saved as version ${methodology.version}. Plans saved from now on are stamped with it; existing plans keep theirs.`,
      });
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.fields)
        for (const [f, m] of Object.entries(err.fields))
          setError(f as FieldPath<MethodologySettings>, { message: m[0] });
      setStatus({ tone: "error", text: err instanceof Error ? err.message : "The settings could not be saved" });
    }
  });
  const deriveConfidences = () =>
    RISK_LEVELS.forEach((_, r) =>
      RISK_LEVELS.forEach((__, c) => {
        setValue(
          `assuranceFactors.${r}.${c}.confidence`,
          confidenceForFactor(Number(getValues(`assuranceFactors.${r}.${c}.factor`))),
          { shouldDirty: true },
        );
      }),
    );

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6" aria-label="Methodology settings">
      {status && <Alert tone={status.tone}>{status.text}</Alert>}
      <p className="text-sm text-ink-soft" data-testid="methodology-version">
        {initial.version === 0
          ? "The shipped defaults apply (version 0): no administrator has saved the firm's own settings yet."
          : `Version ${initial.version}, saved by ${initial.updatedBy ?? "unknown"} on ${formatDateTime(initial.updatedAt)}.`}
      </p>
      <Card title="Assurance factors">
        <div
          role="note"
          className="mb-4 rounded-md border border-amber-100 bg-amber-50 p-3 text-sm text-amber-800"
          data-testid="defaults-note"
        >
          The shipped defaults follow the layout of the AICPA Audit Guide &ldquo;Audit Sampling&rdquo; nonstatistical
          assurance-factor table, as it is commonly reproduced.
          <strong> Every default factor is from memory</strong> and was not checked against the printed Guide; each
          default confidence is derived as 1 − e<sup>−factor</sup> (common practice: 3.0 ≈ 95 %, 2.3 ≈ 90 %, 1.6 ≈ 80
          %). The control-frequency minimums are common practice, also from memory.{" "}
          <strong>The firm must confirm every value against its own methodology</strong> before relying on it.
        </div>
        <div className="overflow-x-auto">
          <Table label="Assurance-factor table">
            <caption className="mb-2 text-left text-xs text-ink-soft">
              Rows: assessed risk of material misstatement. Columns: risk that other substantive procedures fail to
              detect a material misstatement. Each cell: assurance factor, and the confidence it stands for in
              statistical plans (a fraction, 0.9502 = 95.02 %).
            </caption>
            <THead>
              <tr>
                <Th className="p-2 font-medium">RMM \ other procedures</Th>
                {RISK_LEVELS.map((c) => (
                  <Th key={c} className="p-2 font-medium">
                    {RISK_LEVEL_LABELS[c]}
                  </Th>
                ))}
              </tr>
            </THead>
            <tbody>
              {RISK_LEVELS.map((r, ri) => (
                <tr key={r} className="border-t border-ink-line/60">
                  <Th scope="row" className="p-2 font-medium">
                    {RISK_LEVEL_LABELS[r]}
                  </Th>
                  {RISK_LEVELS.map((c, ci) => {
                    const cellErr = errors.assuranceFactors?.[ri]?.[ci];
                    return (
                      <Td key={c} className="p-2 align-top">
                        <div className="flex flex-col gap-1">
                          <input
                            aria-label={`Factor, RMM ${RISK_LEVEL_LABELS[r]}, other procedures ${RISK_LEVEL_LABELS[c]}`}
                            aria-invalid={Boolean(cellErr?.factor)}
                            inputMode="decimal"
                            step="0.01"
                            type="number"
                            className={cellInput}
                            {...register(`assuranceFactors.${ri}.${ci}.factor`, num)}
                          />
                          <input
                            aria-label={`Confidence, RMM ${RISK_LEVEL_LABELS[r]}, other procedures ${RISK_LEVEL_LABELS[c]}`}
                            aria-invalid={Boolean(cellErr?.confidence)}
                            inputMode="decimal"
                            step="0.0001"
                            type="number"
                            className={cellInput}
                            {...register(`assuranceFactors.${ri}.${ci}.confidence`, num)}
                          />
                          {(cellErr?.factor?.message || cellErr?.confidence?.message) && (
                            <span className="text-xs text-brick-700" aria-live="polite">
                              {cellErr?.factor?.message ?? cellErr?.confidence?.message}
                            </span>
                          )}
                        </div>
                      </Td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </Table>
        </div>
        <div className="mt-3 flex gap-3">
          <Button type="button" variant="secondary" onClick={deriveConfidences}>
            Derive every confidence from its factor (1 − e<sup>−factor</sup>)
          </Button>
          <Button
            type="button"
            variant="secondary"
            onClick={() => reset(DEFAULT_METHODOLOGY, { keepDefaultValues: true })}
          >
            Fill in the shipped defaults
          </Button>
        </div>
      </Card>
      <Card title="Statistical methods">
        <div className="grid gap-x-4 sm:grid-cols-2">
          <Field label="Monetary-unit sample size" error={errors.musSizeMethod?.message}>
            <Select {...register("musSizeMethod")}>
              <option value="confidence-factor">Confidence factors (current Guide presentation)</option>
              <option value="expansion-factor">Expansion factors (older presentation)</option>
            </Select>
          </Field>
          <Field label="Poisson and confidence factors" error={errors.factorMode?.message}>
            <Select {...register("factorMode")}>
              <option value="exact">Exact</option>
              <option value="table">Table (rounded up to 2 decimals)</option>
            </Select>
          </Field>
          <Field label="Classical variables quantiles" error={errors.classicalDistribution?.message}>
            <Select {...register("classicalDistribution")}>
              <option value="z">Normal (z)</option>
              <option value="t">Student&rsquo;s t</option>
            </Select>
          </Field>
          <Field label="Monetary-unit limits" error={errors.musLimits?.message}>
            <Select {...register("musLimits")}>
              <option value="gross">Gross</option>
              <option value="net">Net of the opposite direction</option>
            </Select>
          </Field>
          <Field label="Hypergeometric attribute plans below (items)" error={errors.hypergeometricBelow?.message}>
            <Input type="number" {...register("hypergeometricBelow", num)} />
          </Field>
        </div>
        <Table label="Control frequency table" className="mt-2">
          <THead>
            <tr>
              <Th className="p-2 font-medium">Control frequency</Th>
              <Th className="p-2 font-medium">Minimum sample size</Th>
            </tr>
          </THead>
          <tbody>
            {getValues("controlFrequencies").map((row, i) => (
              <tr key={`${row.frequency}-${i}`} className="border-t border-ink-line/60">
                <Td className="p-2">
                  <select
                    aria-label={`Frequency ${i + 1}`}
                    className={`${cellControl} w-48`}
                    {...register(`controlFrequencies.${i}.frequency`)}
                  >
                    {CONTROL_FREQUENCIES.map((f) => (
                      <option key={f} value={f}>
                        {CONTROL_FREQUENCY_LABELS[f]}
                      </option>
                    ))}
                  </select>
                </Td>
                <Td className="p-2">
                  <input
                    aria-label={`Minimum sample size, ${CONTROL_FREQUENCY_LABELS[row.frequency]}`}
                    type="number"
                    className={cellInput}
                    {...register(`controlFrequencies.${i}.minimumSampleSize`, num)}
                  />
                </Td>
              </tr>
            ))}
          </tbody>
        </Table>
      </Card>
      <Card title="Nonstatistical samples">
        <div className="grid gap-x-4 sm:grid-cols-2">
          <Field
            label="Expected misstatement in the size"
            error={errors.nonstatistical?.expectedMisstatementAdjustment?.message}
            hint="The Guide's formula ignores it (and warns when EM > 0); some firms divide by TM − EM instead"
          >
            <Select {...register("nonstatistical.expectedMisstatementAdjustment")}>
              <option value="none">None (warn when EM &gt; 0)</option>
              <option value="subtract-from-tolerable">Subtract it from tolerable misstatement</option>
            </Select>
          </Field>
          <Field label="Minimum nonstatistical sample size" error={errors.nonstatistical?.minimumSampleSize?.message}>
            <Input type="number" {...register("nonstatistical.minimumSampleSize", num)} />
          </Field>
          <Field
            label="“Well below” tolerable misstatement means"
            error={errors.nonstatistical?.wellBelowBasis?.message}
          >
            <Select {...register("nonstatistical.wellBelowBasis")}>
              <option value="expected-misstatement">At most the expected misstatement used in planning</option>
              <option value="share-of-tolerable">At most a share of tolerable misstatement</option>
            </Select>
          </Field>
          <Field
            label="Share of tolerable misstatement (fraction)"
            error={errors.nonstatistical?.wellBelowShare?.message}
            hint="Used only with the share basis, e.g. 0.5"
          >
            <Input type="number" step="0.01" {...register("nonstatistical.wellBelowShare", num)} />
          </Field>
        </div>
        <label className="mt-2 flex items-start gap-2 text-sm">
          <input type="checkbox" className="mt-1" {...register("anomaliesAllowed")} />
          <span>
            Allow misstatements to be marked anomalous (ISA 530 ¶13, AU-C 530.13). Switch off for PCAOB engagements: AS
            2315 has no anomaly provision.
          </span>
        </label>
      </Card>
      <div className="flex items-center gap-3">
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? "Saving…" : "Save as a new version"}
        </Button>
        {isDirty && <span className="text-sm text-ink-soft">Unsaved changes</span>}
      </div>
    </form>
  );
}
