/** A determinate bar (value 0–1) with its label and the figures underneath; indeterminate when value is null. */
export function ProgressBar({
  label,
  value,
  detail,
}: {
  label: string;
  value: number | null;
  detail?: React.ReactNode;
}) {
  const percent = value === null ? null : Math.round(Math.min(1, Math.max(0, value)) * 100);
  return (
    <div className="space-y-1.5">
      <div className="flex items-baseline justify-between gap-4 text-sm">
        <span className="font-medium text-ink">{label}</span>
        {percent !== null && <span className="figures text-ink-soft">{percent}%</span>}
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent ?? undefined}
        className="h-2.5 overflow-hidden rounded-full bg-paper-sunk ring-1 ring-inset ring-ink-line/60"
      >
        <div
          className={`h-full rounded-full bg-ledger-500 transition-[width] duration-200 ${percent === null ? "w-1/3 animate-pulse" : ""}`}
          style={percent === null ? undefined : { width: `${percent}%` }}
        />
      </div>
      {detail && (
        <p className="figures text-xs text-ink-soft" aria-live="polite">
          {detail}
        </p>
      )}
    </div>
  );
}
