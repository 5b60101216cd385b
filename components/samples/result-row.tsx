"use client";
import { useRouter } from "next/navigation";
import { createContext, useContext, useEffect, useRef, useState } from "react";
import { useForm, type FieldPath, type Resolver, type UseFormReturn } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import { SaveResultSchema, type SaveResult } from "@/lib/validation/sample";
import { apiFetch, ApiError } from "@/components/ui/api";
import { Button } from "@/components/ui/button";
import { rowValuesOf, saveBodyOf, type RowValues } from "./result-values";
import { formatMoney } from "@/lib/format/number";

export interface RowEditor {
  item: SampleItemRecord;
  form: UseFormReturn<RowValues, unknown, SaveResult>;
  formId: string;
  editable: boolean;
  attribute: boolean;
  saved: boolean;
}

const RowContext = createContext<RowEditor | null>(null);

export function useRowEditor(): RowEditor {
  const ctx = useContext(RowContext);
  if (!ctx) throw new Error("useRowEditor outside a result row");
  return ctx;
}

const schemaResolver = zodResolver(SaveResultSchema);

interface Props {
  item: SampleItemRecord;
  url: string;
  editable: boolean;
  attribute: boolean;
  columnCount: number;
  /** Called with the item as saved and as it was before (for the undo). */
  onSaved: (after: SampleItemRecord, before: SampleItemRecord) => void;
  onReload: () => void;
  children: React.ReactNode;
  /** Replace, Attach…: shown beside Save in the sticky actions cell. */
  actions?: React.ReactNode;
  /** A row under this one (the item's evidence), or null. */
  detail?: React.ReactNode;
  /** Evidence dropped on the row. */
  onDropFiles?: (files: File[]) => void;
}

/**
 * One sample item as an inline form: the row's inputs point at a form in its last cell. A save
 * sends the version the row was read at; if someone saved the item since, the server refuses
 * (409) and the row says who, keeps the auditor's entry on screen, and offers to reload.
 */
export function ResultRow({
  item,
  url,
  editable,
  attribute,
  columnCount,
  onSaved,
  onReload,
  children,
  actions,
  detail,
  onDropFiles,
}: Props) {
  const [dropping, setDropping] = useState(false);
  const storedKey = `${item.id}:${item.version}`;
  // A conflict belongs to the stored version it was met at: once the item is reloaded, it is gone.
  const [conflict, setConflict] = useState<{ at: string; message: string } | null>(null);
  const conflictMessage = conflict?.at === storedKey ? conflict.message : null;
  const setConflictMessage = (message: string | null) =>
    setConflict(message === null ? null : { at: storedKey, message });
  const [failure, setFailure] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const [signOffsCleared, setSignOffsCleared] = useState(false);
  const router = useRouter();
  const resolver: Resolver<RowValues, unknown, SaveResult> = (values, context, options) =>
    schemaResolver(saveBodyOf(values, item.version, attribute), context, options as never);
  const form = useForm<RowValues, unknown, SaveResult>({ resolver, defaultValues: rowValuesOf(item) });
  const { reset, handleSubmit, setError, getValues } = form;

  // Reset the entry only when the stored item changes, not on every refetch of the same version.
  const shownKey = useRef(storedKey);
  useEffect(() => {
    if (shownKey.current === storedKey) return;
    shownKey.current = storedKey;
    reset(rowValuesOf(item));
  }, [storedKey, item, reset]);

  const submit = handleSubmit(async (body) => {
    if (!form.formState.isDirty) return; // Enter on a row nobody changed moves on without a save
    setFailure(null);
    setSaved(false);
    try {
      const { item: after, signOffsCleared: cleared } = await apiFetch<{
        item: SampleItemRecord;
        signOffsCleared?: boolean;
      }>(`${url}/${item.id}`, { method: "PATCH", body });
      setSaved(true);
      setSignOffsCleared(Boolean(cleared));
      if (cleared) router.refresh(); // the review panel is server-rendered: show the cleared sign-offs
      onSaved(after, item);
    } catch (err) {
      if (err instanceof ApiError && err.status === 409) {
        setConflictMessage(err.message);
        return;
      }
      if (err instanceof ApiError && err.fields)
        for (const [k, m] of Object.entries(err.fields)) setError(k as FieldPath<RowValues>, { message: m[0] });
      setFailure(err instanceof Error ? err.message : "The result could not be saved");
    }
  });

  const mine = getValues();
  const attempted = attribute
    ? `deviation ${mine.deviation || "—"}`
    : mine.status === "not-auditable"
      ? "could not be audited"
      : `audited ${mine.auditedValue ? formatMoney(mine.auditedValue) : "—"}`;
  const void_ = item.status === "void";
  return (
    <RowContext.Provider
      value={{ item, form, formId: `result-${item.id}`, editable: editable && !void_, attribute, saved }}
    >
      <tr
        className={`border-t border-ink-line/70 align-top ${void_ ? "bg-paper-sunk text-ink-soft" : dropping ? "bg-ledger-50 outline-2 outline-dashed outline-ledger-600" : "bg-paper-raised hover:bg-paper"}`}
        data-testid={`item-row-${item.itemRef}`}
        data-item-id={item.id}
        onDragOver={
          onDropFiles && !void_
            ? (e) => {
                if (e.dataTransfer.types.includes("Files")) {
                  e.preventDefault();
                  setDropping(true);
                }
              }
            : undefined
        }
        onDragLeave={onDropFiles ? () => setDropping(false) : undefined}
        onDrop={
          onDropFiles && !void_
            ? (e) => {
                e.preventDefault();
                setDropping(false);
                onDropFiles(Array.from(e.dataTransfer.files));
              }
            : undefined
        }
      >
        {children}
        <td className="sticky right-0 z-10 bg-inherit px-1.5 py-2 text-right shadow-[-8px_0_8px_-8px_rgba(29,36,48,0.15)]">
          <div className="flex items-center justify-end gap-1">
            {actions}
            {!void_ && editable && (
              <form id={`result-${item.id}`} onSubmit={submit} noValidate>
                <Button
                  type="submit"
                  variant={form.formState.isDirty ? "primary" : "secondary"}
                  className="px-2.5 py-1 text-xs"
                  disabled={form.formState.isSubmitting}
                  aria-label={`Save ${item.itemRef}`}
                  tabIndex={-1}
                  data-row-action
                >
                  {form.formState.isSubmitting ? "Saving…" : saved && !form.formState.isDirty ? "Saved" : "Save"}
                </Button>
              </form>
            )}
          </div>
        </td>
      </tr>
      {detail}
      {signOffsCleared && (
        <tr>
          <td colSpan={columnCount + 1} className="px-2 pb-3">
            <div
              role="status"
              className="sticky left-2 max-w-4xl rounded-md border border-amber-100 bg-amber-50 px-3 py-2 text-sm text-amber-700"
              data-testid="sign-offs-cleared"
            >
              Saved. The sample had been signed off, so its sign-offs were cleared: the preparer and reviewer sign off
              again on what is there now.
            </div>
          </td>
        </tr>
      )}
      {(conflictMessage || failure) && (
        <tr>
          <td colSpan={columnCount + 1} className="px-2 pb-3">
            <div
              role="alert"
              className="sticky left-2 flex max-w-4xl flex-wrap items-center justify-between gap-3 rounded-md border border-brick-100 bg-brick-50 px-3 py-2 text-sm text-brick-700"
              data-testid="row-conflict"
            >
              <span>
                {conflictMessage ?? failure}
                {conflictMessage && (
                  <span className="block text-xs">
                    Your unsaved entry for {item.itemRef}: {attempted}.
                  </span>
                )}
              </span>
              {conflictMessage && (
                <Button
                  type="button"
                  variant="secondary"
                  className="px-2.5 py-1 text-xs"
                  onClick={() => {
                    setConflictMessage(null);
                    onReload();
                  }}
                >
                  Reload the item
                </Button>
              )}
            </div>
          </td>
        </tr>
      )}
    </RowContext.Provider>
  );
}
