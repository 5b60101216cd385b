"use client";
import { useEffect, useMemo, useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { LoadPopulationSchema } from "@/lib/validation/population";
import { Field, Input, Select } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { guessColumns } from "./column-guess";
import { PreviewTable } from "./preview-table";
import type { UploadView } from "./upload-file";
import { formatCount } from "@/lib/format/number";

type FormIn = z.input<typeof LoadPopulationSchema>;
export type MappingValues = z.output<typeof LoadPopulationSchema>;
/** A population a corrected file may replace, with the samples planned on it (named in the warning). */
export interface ReplaceablePopulation {
  id: number;
  name: string;
  rowCount: number;
  samples: string[];
}

interface Props {
  upload: UploadView;
  replaceable: ReplaceablePopulation[];
  disabled: boolean;
  onSubmit: (values: MappingValues) => void;
}

/** Column mapping, formats and name for an inspected upload; validated with the load route's own schema. */
export function MappingForm({ upload, replaceable, disabled, onSubmit }: Props) {
  const { inspection } = upload;
  const [understood, setUnderstood] = useState(false);
  const guess = useMemo(() => guessColumns(inspection.headers), [inspection.headers]);
  const {
    register,
    handleSubmit,
    watch,
    setValue,
    formState: { errors },
  } = useForm<FormIn, unknown, MappingValues>({
    resolver: zodResolver(LoadPopulationSchema),
    defaultValues: {
      name: upload.fileName.replace(/\.[^.]+$/, "").replace(/[-_]+/g, " "),
      mapping: {
        itemRefColumn: guess.itemRef,
        bookValueColumn: guess.bookValue,
        descriptionColumn: guess.description,
        dateColumn: guess.date,
        extraColumns: [],
        numberFormat: inspection.detectedNumberFormat ?? "dot-decimal",
        dateOrder: inspection.detectedDateOrder ?? "",
        sheet: inspection.kind === "xlsx" ? inspection.sheet : undefined,
      },
    },
  });
  const mapping = watch("mapping");
  const mapped = [mapping.itemRefColumn, mapping.bookValueColumn, mapping.descriptionColumn, mapping.dateColumn].filter(
    Boolean,
  ) as string[];
  const extraColumns = mapping.extraColumns;
  const extras = extraColumns ?? [];
  const mappedKey = mapped.join("\u0000");

  useEffect(() => {
    // A column given a role above can no longer be an extra one.
    const roleColumns = mappedKey ? mappedKey.split("\u0000") : [];
    const current = extraColumns ?? [];
    const kept = current.filter((c) => !roleColumns.includes(c));
    if (kept.length !== current.length) setValue("mapping.extraColumns", kept);
  }, [mappedKey, extraColumns, setValue]);

  const roles: Record<string, "ref" | "book" | "desc" | "date" | "extra" | undefined> = {};
  for (const c of extras) roles[c] = "extra";
  if (mapping.dateColumn) roles[mapping.dateColumn] = "date";
  if (mapping.descriptionColumn) roles[mapping.descriptionColumn] = "desc";
  if (mapping.bookValueColumn) roles[mapping.bookValueColumn] = "book";
  if (mapping.itemRefColumn) roles[mapping.itemRefColumn] = "ref";

  const columnSelect = (
    name: "itemRefColumn" | "bookValueColumn" | "descriptionColumn" | "dateColumn",
    label: string,
    optional: boolean,
    hint?: string,
  ) => (
    <Field label={label} error={errors.mapping?.[name]?.message} hint={hint}>
      <Select disabled={disabled} {...register(`mapping.${name}`)}>
        <option value="">{optional ? "— none —" : "Choose a column…"}</option>
        {inspection.headers.map((h) => (
          <option key={h} value={h}>
            {h}
          </option>
        ))}
      </Select>
    </Field>
  );

  const toggleExtra = (column: string, on: boolean) =>
    setValue("mapping.extraColumns", on ? [...extras, column] : extras.filter((c) => c !== column), {
      shouldValidate: true,
    });

  return (
    <form onSubmit={handleSubmit(onSubmit)} noValidate className="space-y-6">
      <div>
        <h3 className="mb-2 text-sm font-semibold text-ink">
          What the file holds{" "}
          <span className="font-normal text-ink-soft">
            — the first {formatCount(inspection.preview.length)} data rows, as read (header on row{" "}
            {inspection.headerRow})
          </span>
        </h3>
        <PreviewTable
          headers={inspection.headers}
          rows={inspection.preview}
          rowNumbers={inspection.previewRowNumbers}
          roles={roles}
        />
        {inspection.autoNamedColumns.length > 0 && (
          <p className="mt-2 text-xs text-amber-700">
            Columns without a heading were named for you: {inspection.autoNamedColumns.join(", ")}.
          </p>
        )}
      </div>

      <fieldset className="grid gap-x-6 gap-y-1 sm:grid-cols-2 lg:grid-cols-4">
        <legend className="mb-3 text-sm font-semibold text-ink">Columns</legend>
        {columnSelect("itemRefColumn", "Item reference", false, "Identifies each item (invoice, document number)")}
        {columnSelect("bookValueColumn", "Book value", false, "The recorded amount that is sampled")}
        {columnSelect("descriptionColumn", "Description", true)}
        {columnSelect("dateColumn", "Date", true)}
      </fieldset>

      <fieldset>
        <legend className="mb-2 text-sm font-semibold text-ink">
          Also keep with each item <span className="font-normal text-ink-soft">(optional)</span>
        </legend>
        <div className="flex flex-wrap gap-x-5 gap-y-2">
          {inspection.headers.map((h) => {
            const isMapped = mapped.includes(h);
            return (
              <label
                key={h}
                className={`inline-flex items-center gap-2 text-sm ${isMapped ? "text-ink-faint" : "text-ink"}`}
              >
                <input
                  type="checkbox"
                  className="h-4 w-4 accent-ledger-600"
                  disabled={disabled || isMapped}
                  checked={!isMapped && extras.includes(h)}
                  onChange={(e) => toggleExtra(h, e.target.checked)}
                />
                {h}
                {isMapped && <span className="text-xs">(mapped)</span>}
              </label>
            );
          })}
        </div>
        {errors.mapping?.extraColumns && (
          <p className="mt-1 text-xs text-brick-700" aria-live="polite">
            {errors.mapping.extraColumns.message ?? "Check the extra columns"}
          </p>
        )}
      </fieldset>

      <div className="grid gap-x-6 gap-y-1 sm:grid-cols-2 lg:grid-cols-4">
        <Field
          label="Number format"
          hint={
            inspection.detectedNumberFormat
              ? "Detected from the file; change it if the amounts read wrongly"
              : "Nothing in the file decides it; check the preview"
          }
        >
          <Select disabled={disabled} {...register("mapping.numberFormat")}>
            <option value="dot-decimal">1,234.56 — dot for decimals</option>
            <option value="comma-decimal">1.234,56 — comma for decimals</option>
          </Select>
        </Field>
        <Field label="Date order" hint="How a date such as 03/04/2026 is read; ISO dates need no choice">
          <Select disabled={disabled} {...register("mapping.dateOrder")}>
            <option value="">{inspection.detectedDateOrder ? "As detected" : "ISO dates only (2026-04-03)"}</option>
            <option value="day-first">Day first — 31/12/2026</option>
            <option value="month-first">Month first — 12/31/2026</option>
          </Select>
        </Field>
        <div className="sm:col-span-2">
          <Field label="Population name" error={errors.name?.message}>
            <Input disabled={disabled} placeholder="e.g. Trade receivables at 30 Sep 2026" {...register("name")} />
          </Field>
        </div>
        {replaceable.length > 0 && (
          <div className="sm:col-span-2">
            <Field
              label="Replaces a population"
              hint="A corrected file replaces the earlier population, which is kept, marked superseded"
            >
              <Select
                disabled={disabled}
                {...register("supersedesId", {
                  setValueAs: (v) => (v === "" || v === undefined ? undefined : Number(v)),
                })}
              >
                <option value="">No — this is a new population</option>
                {replaceable.map((p) => (
                  <option key={p.id} value={p.id}>
                    Yes — replaces “{p.name}” ({formatCount(p.rowCount)} items)
                  </option>
                ))}
              </Select>
            </Field>
            <SupersedeWarning
              target={replaceable.find((p) => p.id === Number(watch("supersedesId")))}
              understood={understood}
              onUnderstood={setUnderstood}
            />
          </div>
        )}
      </div>

      <div className="flex items-center gap-4 border-t border-ink-line pt-4">
        <Button
          type="submit"
          disabled={
            disabled ||
            (Boolean(replaceable.find((p) => p.id === Number(watch("supersedesId")))?.samples.length) && !understood)
          }
        >
          Check and load
        </Button>
        <p className="text-sm text-ink-soft">
          Every row is checked first; if any row has a problem, nothing is stored.
        </p>
      </div>
    </form>
  );
}

/** Before a population that samples use is replaced: which samples, what it means for them, and a tick to go on. */
function SupersedeWarning({
  target,
  understood,
  onUnderstood,
}: {
  target: ReplaceablePopulation | undefined;
  understood: boolean;
  onUnderstood: (v: boolean) => void;
}) {
  if (!target || target.samples.length === 0) return null;
  const n = target.samples.length;
  return (
    <div
      role="alert"
      className="mt-3 space-y-2 rounded-md border border-amber-100 bg-amber-50 px-3 py-2 text-sm text-amber-700"
      data-testid="supersede-warning"
    >
      <p className="font-medium">
        &ldquo;{target.name}&rdquo; is used by {n === 1 ? "1 sample" : `${formatCount(n)} samples`}:
      </p>
      <ul className="list-disc pl-5">
        {target.samples.map((s) => (
          <li key={s}>{s}</li>
        ))}
      </ul>
      <p>
        Replacing it does not change {n === 1 ? "that sample" : "those samples"}: {n === 1 ? "it keeps" : "they keep"}{" "}
        the items drawn from the old file and {n === 1 ? "its" : "their"} evaluation still projects onto the old book
        value. Each will show a banner saying its population was superseded, so its preparer can decide whether to draw
        again from the corrected population.
      </p>
      <label className="flex items-center gap-2 font-medium">
        <input
          type="checkbox"
          checked={understood}
          onChange={(e) => onUnderstood(e.target.checked)}
          className="h-4 w-4 accent-ledger-600"
        />
        Replace it anyway
      </label>
    </div>
  );
}
