// The screens issue 19 touched name the product's formats by these words; both come from lib/format/date.ts.
import { formatDate as longDay, formatWhen } from "./date";

/** "2026-09-30" or an instant → "30 September 2026"; nothing → "—". */
export function formatDate(value: string | Date | null | undefined): string {
  return value == null || value === "" ? "—" : longDay(value);
}

/** An instant → "3 December 2026 at 14:05 UTC" (lib/format/date.ts formatWhen); nothing → "—". */
export function formatDateTime(value: string | Date | null | undefined): string {
  return value == null || value === "" ? "—" : formatWhen(value);
}
