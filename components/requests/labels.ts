import { REQUEST_NEED_LABELS, REQUEST_STATUS_LABELS, type RequestItemStatus, type RequestNeed } from "@/lib/validation/requests";

export const STATUS_TONE: Record<RequestItemStatus, "neutral" | "green" | "amber" | "red" | "blue"> = {
  requested: "neutral", provided: "blue", accepted: "green", "needs-more": "amber",
};

export const FILE_STATUS_LABELS = { pending: "Awaiting review", accepted: "Accepted", returned: "Sent back" } as const;

export const needsText = (needs: RequestNeed[]) => needs.filter((n) => n !== "other").map((n) => REQUEST_NEED_LABELS[n]).join("; ");

export { REQUEST_STATUS_LABELS };

export function formatDay(day: string): string {
  return new Date(`${day}T00:00:00Z`).toLocaleDateString("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
}

export function formatBytes(n: number): string {
  return n < 1024 ? `${n} B` : n < 1024 * 1024 ? `${(n / 1024).toFixed(1)} KB` : `${(n / 1024 / 1024).toFixed(1)} MB`;
}
