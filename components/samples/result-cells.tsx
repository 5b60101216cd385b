"use client";
import { ITEM_STATUSES, MISSTATEMENT_CAUSES, CAUSE_LABELS } from "@/lib/validation/sample";
import { Amount } from "@/components/ui/amount";
import { Badge } from "@/components/ui/badge";
import { ITEM_STATUS_LABELS } from "./labels";
import { liveMisstatement } from "./result-values";
import { useRowEditor } from "./result-row";
import { RequestStatusBadge } from "@/components/requests/status-badge";
import { NOTE_STATUS_LABELS, NOTE_STATUS_TONES, type ItemNoteMark } from "@/components/review/note-labels";
import { useUnauditableTreatment } from "./row-treatment";

const compact =
  "rounded border border-ink-line bg-paper-raised px-2 py-1 text-sm focus:border-ledger-500 focus:outline-none focus:ring-2 focus:ring-ledger-100 aria-[invalid=true]:border-brick-500 disabled:bg-paper-sunk/60 disabled:text-ink-faint";

function FieldError({ message, id }: { message?: string; id: string }) {
  return message ? (
    <p id={id} className="mt-1 text-xs text-brick-700" aria-live="polite">
      {message}
    </p>
  ) : null;
}

export function ReferenceCell({ notes }: { notes?: ItemNoteMark[] }) {
  const { item } = useRowEditor();
  return (
    <div className="w-32">
      <span className="font-medium">
        <span className="figures mr-1.5 text-xs font-normal text-ink-faint">{item.selectionOrder}</span>
        {item.itemRef}
      </span>
      {item.description && (
        <span className="block max-w-32 truncate text-xs text-ink-faint" title={item.description}>
          {item.description}
        </span>
      )}
      <span className="mt-0.5 flex flex-wrap gap-1">
        {item.topStratum && <Badge tone="blue">top stratum</Badge>}
        {item.stratum !== null && <Badge>stratum {item.stratum}</Badge>}
        {item.keyItem && <Badge tone="blue">key item</Badge>}
        {item.origin === "haphazard" && <Badge>picked</Badge>}
        {item.anomaly && (
          <Badge tone="amber">{item.anomaly.acceptedAt ? "anomaly accepted" : "anomaly proposed"}</Badge>
        )}
        {(item.origin === "extension" || item.origin === "replacement") && (
          <Badge tone="amber">{item.origin === "extension" ? "added" : "replacement"}</Badge>
        )}
        {item.hitPoints && item.hitPoints.length > 1 && <Badge>{item.hitPoints.length} hits</Badge>}
        {notes?.map((n) => (
          <Badge key={n.number} tone={NOTE_STATUS_TONES[n.status]}>
            Note {n.number}: {NOTE_STATUS_LABELS[n.status].toLowerCase()}
          </Badge>
        ))}
      </span>
      {item.status === "void" && <span className="block text-xs">Void: {item.voidReason}</span>}
    </div>
  );
}

export function AuditedValueCell() {
  const { item, form, formId, editable } = useRowEditor();
  const {
    register,
    watch,
    setValue,
    formState: { errors },
  } = form;
  const status = watch("status");
  const errId = `${formId}-audited-error`;
  return (
    <div className="w-28">
      <input
        form={formId}
        data-cell="audited"
        aria-label={`Audited value of ${item.itemRef}`}
        inputMode="decimal"
        className={`${compact} figures w-full text-right`}
        disabled={!editable || status === "not-auditable"}
        aria-invalid={Boolean(errors.auditedValue)}
        aria-describedby={errors.auditedValue ? errId : undefined}
        {...register("auditedValue", {
          onChange: (e: React.ChangeEvent<HTMLInputElement>) => {
            if (e.target.value.trim() !== "" && watch("status") === "not-started")
              setValue("status", "done", { shouldDirty: true });
          },
        })}
      />
      <FieldError id={errId} message={errors.auditedValue?.message} />
    </div>
  );
}

export function MisstatementCell() {
  const { item, form } = useRowEditor();
  const treatment = useUnauditableTreatment();
  const status = form.watch("status");
  const audited = form.watch("auditedValue");
  const m =
    item.status === "void"
      ? null
      : liveMisstatement(item.bookValue, { status, auditedValue: audited }, treatment?.direction ?? "overstatement");
  if (m === null) return <span className="text-ink-faint">—</span>;
  const zero = m === "0.00";
  return (
    <span className={zero ? "text-ink-soft" : "font-semibold text-brick-700"} data-testid="row-misstatement">
      <Amount value={m} />
    </span>
  );
}

export function StatusCell() {
  const { item, form, formId, editable } = useRowEditor();
  const treatment = useUnauditableTreatment();
  const status = form.watch("status");
  if (item.status === "void") return <span>{ITEM_STATUS_LABELS.void}</span>;
  const treatmentId = `${formId}-unauditable`;
  return (
    <div className="w-44">
      <select
        form={formId}
        data-cell="status"
        aria-label={`Status of ${item.itemRef}`}
        className={`${compact} w-44 text-[13px]`}
        disabled={!editable}
        aria-describedby={status === "not-auditable" && treatment ? treatmentId : undefined}
        {...form.register("status", {
          onChange: (e: React.ChangeEvent<HTMLSelectElement>) => {
            if (e.target.value === "not-auditable") form.setValue("auditedValue", "", { shouldDirty: true });
          },
        })}
      >
        {ITEM_STATUSES.map((s) => (
          <option key={s} value={s}>
            {ITEM_STATUS_LABELS[s]}
          </option>
        ))}
      </select>
      {status === "not-auditable" && treatment && (
        <span id={treatmentId} className="mt-0.5 block text-xs text-amber-700" data-testid="row-unauditable-treatment">
          {treatment.unauditableOnRow}
        </span>
      )}
      {item.updatedByName && <span className="mt-0.5 block text-xs text-ink-faint">saved by {item.updatedByName}</span>}
    </div>
  );
}

export function CauseCell() {
  const { item, form, formId, editable } = useRowEditor();
  const {
    register,
    watch,
    formState: { errors },
  } = form;
  const cause = watch("cause");
  const errId = `${formId}-cause-error`;
  return (
    <div className="w-32 space-y-1">
      <select
        form={formId}
        data-cell="cause"
        aria-label={`Cause of misstatement in ${item.itemRef}`}
        className={`${compact} w-full`}
        disabled={!editable}
        {...register("cause")}
      >
        <option value="">—</option>
        {MISSTATEMENT_CAUSES.map((c) => (
          <option key={c} value={c}>
            {CAUSE_LABELS[c]}
          </option>
        ))}
      </select>
      {(cause || watch("causeNote")) && (
        <input
          form={formId}
          data-cell="cause-note"
          aria-label={`Cause details for ${item.itemRef}`}
          placeholder={cause === "other" ? "Describe the cause" : "Details (optional)"}
          className={`${compact} w-full`}
          disabled={!editable}
          aria-invalid={Boolean(errors.causeNote)}
          aria-describedby={errors.causeNote ? errId : undefined}
          {...register("causeNote")}
        />
      )}
      <FieldError id={errId} message={errors.causeNote?.message} />
    </div>
  );
}

export function DeviationCell() {
  const { item, form, formId, editable } = useRowEditor();
  const {
    register,
    watch,
    setValue,
    formState: { errors },
  } = form;
  const deviation = watch("deviation");
  const errId = `${formId}-deviation-error`;
  return (
    <div className="w-60 space-y-1">
      <select
        form={formId}
        data-cell="deviation"
        aria-label={`Deviation found in ${item.itemRef}`}
        className={`${compact} w-full`}
        disabled={!editable}
        {...register("deviation", {
          onChange: (e: React.ChangeEvent<HTMLSelectElement>) => {
            if (e.target.value !== "" && watch("status") === "not-started")
              setValue("status", "done", { shouldDirty: true });
          },
        })}
      >
        <option value="">—</option>
        <option value="no">No deviation</option>
        <option value="yes">Deviation</option>
      </select>
      {deviation === "yes" && (
        <input
          form={formId}
          data-cell="deviation-nature"
          aria-label={`Nature of the deviation in ${item.itemRef}`}
          placeholder="Nature of the deviation"
          className={`${compact} w-full`}
          disabled={!editable}
          {...register("deviationNature")}
        />
      )}
      <FieldError id={errId} message={errors.deviation?.message ?? errors.auditedValue?.message} />
    </div>
  );
}

export function CommentCell() {
  const { item, form, formId, editable } = useRowEditor();
  return (
    <input
      form={formId}
      data-cell="comment"
      aria-label={`Comment on ${item.itemRef}`}
      className={`${compact} w-full min-w-28`}
      disabled={!editable}
      {...form.register("comment")}
    />
  );
}

/** The item's evidence count (a button that opens its files under the row) and its client request status. */
export function EvidenceCell({ open, onToggle }: { open: boolean; onToggle: () => void }) {
  const { item } = useRowEditor();
  const n = item.evidenceCount;
  return (
    <div className="flex flex-col items-end gap-1">
      <button
        type="button"
        tabIndex={-1}
        data-row-action
        aria-expanded={open}
        onClick={onToggle}
        aria-label={`Evidence of ${item.itemRef}: ${n === 0 ? "no files" : n === 1 ? "1 file" : `${n} files`}`}
        className={`figures rounded px-1.5 py-0.5 text-sm link ${n === 0 ? "text-ink-soft" : "text-ledger-700"}`}
      >
        {n === 0 ? "none" : n === 1 ? "1 file" : `${n} files`}
      </button>
      {item.requestStatus && <RequestStatusBadge status={item.requestStatus} />}
    </div>
  );
}
