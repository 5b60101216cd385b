"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { ReconcileSchema } from "@/lib/validation/population";
import type { PopulationRecord } from "@/lib/data/populations";
import { centsToDecimal, decimalToCents } from "@/lib/money";
import { Field, Input, Textarea } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { Amount } from "@/components/ui/amount";
import { apiFetch, ApiError } from "@/components/ui/api";
import { formatDate } from "@/lib/format/date";
import { formatCount } from "@/lib/format/number";
import { textOf } from "@/lib/format/text";
import { Table, THead, Th, Td } from "@/components/ui/table";

type FormIn = z.input<typeof ReconcileSchema>;
type FormOut = z.output<typeof ReconcileSchema>;

/** Parses what the auditor typed as the form will; null while it is not yet an amount. */
function typedCents(text: unknown): bigint | null {
  const parsed = ReconcileSchema.shape.controlTotal.safeParse(text ?? "");
  return parsed.success ? decimalToCents(parsed.data) : null;
}

interface Props {
  engagementId: number;
  initial: PopulationRecord;
  currency: string;
  mayReconcile: boolean;
}

/** Loaded figures against the ledger's control figures, the difference, and the explanation that lets it proceed. */
export function ReconciliationPanel({ engagementId, initial, currency, mayReconcile }: Props) {
  const router = useRouter();
  const [p, setP] = useState(initial);
  const [failure, setFailure] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    watch,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(ReconcileSchema),
    defaultValues: {
      controlTotal: p.controlTotal ?? "",
      controlCount: p.controlCount ?? "",
      explanation: p.reconciliationExplanation ?? "",
    },
  });
  const loadedCents = decimalToCents(p.total);
  const typedTotal = typedCents(watch("controlTotal"));
  const countText = textOf(watch("controlCount")).trim();
  const typedCount = /^\d+$/.test(countText) ? Number(countText) : null;
  const diffTotal = typedTotal === null ? null : typedTotal - loadedCents;
  const diffCount = typedCount === null ? null : typedCount - p.rowCount;
  const differs = (diffTotal !== null && diffTotal !== 0n) || (diffCount !== null && diffCount !== 0);

  const onSubmit = handleSubmit(async (values) => {
    setFailure(null);
    try {
      const { population } = await apiFetch<{ population: PopulationRecord }>(
        `/api/engagements/${engagementId}/populations/${p.id}/reconciliation`,
        { body: values },
      );
      setP(population);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.fields)
        for (const [f, m] of Object.entries(err.fields)) setError(f as keyof FormIn, { message: m[0] });
      setFailure(err instanceof Error ? err.message : "Could not record the reconciliation");
    }
  });

  const editable = mayReconcile && p.status !== "superseded";
  return (
    <div className="space-y-4">
      <StatusNote population={p} />
      <Table label="Reconciliation" density="compact">
        <THead>
          <tr>
            <Th />
            <Th numeric>Loaded</Th>
            <Th numeric>Ledger (control)</Th>
            <Th numeric>Difference</Th>
          </tr>
        </THead>
        <tbody>
          <tr className="border-t border-ink-line/70">
            <Th scope="row" className="font-medium">
              Total
            </Th>
            <Td className="text-right">
              <Amount value={p.total} />
            </Td>
            <Td className="text-right">
              {typedTotal !== null ? (
                <Amount value={centsToDecimal(typedTotal)} />
              ) : (
                <span className="text-ink-faint">—</span>
              )}
            </Td>
            <Td
              className={`py-2 text-right ${diffTotal ? "font-semibold text-brick-700" : ""}`}
              data-testid="difference-total"
            >
              {diffTotal !== null ? <Amount value={centsToDecimal(diffTotal)} /> : "—"}
            </Td>
          </tr>
          <tr className="border-t border-ink-line/70">
            <Th scope="row" className="font-medium">
              Items
            </Th>
            <Td numeric>{formatCount(p.rowCount)}</Td>
            <Td numeric>{typedCount !== null ? formatCount(typedCount) : <span className="text-ink-faint">—</span>}</Td>
            <Td
              className={`figures py-2 text-right ${diffCount ? "font-semibold text-brick-700" : ""}`}
              data-testid="difference-count"
            >
              {diffCount !== null ? formatCount(diffCount) : "—"}
            </Td>
          </tr>
        </tbody>
      </Table>
      {editable ? (
        <form onSubmit={onSubmit} noValidate className="space-y-1 border-t border-ink-line pt-4">
          {failure && (
            <div className="mb-3">
              <Alert>{failure}</Alert>
            </div>
          )}
          <div className="grid gap-x-4 sm:grid-cols-2">
            <Field
              label={`Control total (${currency})`}
              error={errors.controlTotal?.message}
              hint="From the trial balance or the ledger's closing balance"
            >
              <Input inputMode="decimal" className="figures text-right" {...register("controlTotal")} />
            </Field>
            <Field label="Control count" error={errors.controlCount?.message} hint="Number of items in the ledger">
              <Input inputMode="numeric" className="figures text-right" {...register("controlCount")} />
            </Field>
          </div>
          {differs && (
            <Field
              label="Explanation of the difference"
              error={errors.explanation?.message}
              hint="The auditor can record an explanation (kept in the audit log) to proceed; otherwise correct the file and load it again."
            >
              <Textarea rows={3} {...register("explanation")} />
            </Field>
          )}
          <Button type="submit" disabled={isSubmitting}>
            {isSubmitting ? "Recording…" : p.controlTotal === null ? "Record the reconciliation" : "Record again"}
          </Button>
        </form>
      ) : (
        !mayReconcile &&
        p.status !== "superseded" && (
          <p className="text-sm text-ink-soft">
            A senior, manager or partner on the engagement records the reconciliation.
          </p>
        )
      )}
    </div>
  );
}

function StatusNote({ population: p }: { population: PopulationRecord }) {
  if (p.status === "superseded")
    return (
      <Alert tone="info">
        This population was superseded by a corrected file. It is kept for the record and cannot be sampled.
      </Alert>
    );
  if (p.status === "reconciled") {
    return (
      <Alert tone="success">
        <p className="font-semibold">
          Reconciled{p.reconciledByName ? ` by ${p.reconciledByName}` : ""}
          {p.reconciledAt ? ` on ${formatDate(p.reconciledAt)}` : ""}.
        </p>
        {p.reconciliationExplanation && <p className="mt-1">Difference explained: “{p.reconciliationExplanation}”</p>}
      </Alert>
    );
  }
  return (
    <div role="status" className="rounded-md border border-amber-100 bg-amber-50 px-3 py-2 text-sm text-amber-700">
      <p className="font-semibold">Unreconciled: this population cannot be sampled yet.</p>
      <p className="mt-1">
        {p.difference
          ? "The control figures recorded differ from what was loaded. Correct the file and load it again, or explain the difference."
          : "Enter the control total and count from the trial balance or ledger."}
      </p>
    </div>
  );
}
