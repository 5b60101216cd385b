import type { LoadEvent } from "./read-load-stream";
import { ProgressBar } from "./progress-bar";
import { formatBytes, formatCount } from "@/lib/format/number";

type Progress = Extract<LoadEvent, { type: "progress" }>;

const STEPS = [
  ["checking", "Reading and checking every row"],
  ["storing-file", "Keeping the original file"],
  ["committing", "Committing the population"],
] as const;

/** The server's load phases as they stream in, with rows and bytes read while checking. */
export function LoadProgress({ progress, totalBytes }: { progress: Progress | null; totalBytes: number }) {
  const phase = progress?.phase ?? "checking";
  const current = STEPS.findIndex(([p]) => p === phase);
  const checking = progress?.phase === "checking" ? progress : null;
  const fraction = current > 0 ? 1 : checking ? checking.bytesRead / Math.max(1, checking.totalBytes) : 0;
  return (
    <div className="space-y-4">
      <ProgressBar
        label={current > 0 ? "All rows checked" : "Checking rows"}
        value={fraction}
        detail={
          checking
            ? `${formatCount(checking.rowsRead)} rows read · ${formatBytes(checking.bytesRead)} of ${formatBytes(checking.totalBytes)}`
            : current > 0
              ? "Every row read cleanly"
              : `Starting · ${formatBytes(totalBytes)} to read`
        }
      />
      <ol className="space-y-1.5 text-sm">
        {STEPS.map(([key, label], i) => (
          <li
            key={key}
            className={`flex items-center gap-2 ${i < current ? "text-ledger-700" : i === current ? "font-medium text-ink" : "text-ink-faint"}`}
          >
            <span
              aria-hidden
              className={`inline-flex h-5 w-5 items-center justify-center rounded-full text-xs ${i < current ? "bg-ledger-100" : i === current ? "bg-amber-100 text-amber-700" : "bg-paper-sunk"}`}
            >
              {i < current ? "✓" : i + 1}
            </span>
            {label}
          </li>
        ))}
      </ol>
    </div>
  );
}
