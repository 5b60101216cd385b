"use client";
import Link from "next/link";
import type { UseFormReturn } from "react-hook-form";
import { Field, Select } from "@/components/ui/field";
import { Amount } from "@/components/ui/amount";
import type { PlanFormIn, PlanFormOut, PopulationChoice } from "./plan-values";
import { formatCount } from "@/lib/format/number";

const WHY: Record<string, string> = {
  unreconciled: "not reconciled to the ledger yet",
  loading: "still loading",
  superseded: "superseded by a corrected file",
};

/** Populations to sample from; only reconciled ones can be chosen, the others say why not. */
export function PopulationPicker({
  form,
  populations,
  engagementId,
  currency,
}: {
  form: UseFormReturn<PlanFormIn, unknown, PlanFormOut>;
  populations: PopulationChoice[];
  engagementId: number;
  currency: string;
}) {
  const {
    register,
    formState: { errors },
  } = form;
  const blocked = populations.filter((p) => p.status !== "reconciled" && p.status !== "superseded");
  return (
    <div>
      <Field label="Population" error={errors.populationId?.message}>
        <Select {...register("populationId")}>
          <option value="">Choose a reconciled population…</option>
          {populations.map((p) => (
            <option key={p.id} value={p.id} disabled={p.status !== "reconciled"}>
              {p.name} — {formatCount(p.rowCount)} items{p.status !== "reconciled" ? ` (${WHY[p.status]})` : ""}
            </option>
          ))}
        </Select>
      </Field>
      {blocked.length > 0 && (
        <div
          className="-mt-2 mb-3 rounded-md bg-paper-sunk/60 p-3 text-xs text-ink-soft"
          data-testid="blocked-populations"
        >
          <p className="font-medium text-ink">Not available until reconciled</p>
          <ul className="mt-1 space-y-0.5">
            {blocked.map((p) => (
              <li key={p.id}>
                <Link href={`/engagements/${engagementId}/populations/${p.id}`} className="text-ledger-600 link">
                  {p.name}
                </Link>{" "}
                ({formatCount(p.rowCount)} items, <Amount value={p.total} currency={currency} />) is {WHY[p.status]}:
                record its control total and count first.
              </li>
            ))}
          </ul>
        </div>
      )}
      {populations.length === 0 && (
        <p className="-mt-2 mb-3 text-xs text-ink-soft">
          No population is loaded on this engagement yet.{" "}
          <Link href={`/engagements/${engagementId}/populations/new`} className="text-ledger-600 link">
            Load a ledger
          </Link>{" "}
          first.
        </p>
      )}
    </div>
  );
}
