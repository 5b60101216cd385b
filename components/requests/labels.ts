import {
  REQUEST_NEED_LABELS,
  REQUEST_STATUS_LABELS,
  type RequestItemStatus,
  type RequestNeed,
} from "@/lib/validation/requests";

export const STATUS_TONE: Record<RequestItemStatus, "neutral" | "green" | "amber" | "red" | "blue"> = {
  requested: "neutral",
  provided: "blue",
  accepted: "green",
  "needs-more": "amber",
};

export const FILE_STATUS_LABELS = { pending: "Awaiting review", accepted: "Accepted", returned: "Sent back" } as const;

export const needsText = (needs: RequestNeed[]) =>
  needs
    .filter((n) => n !== "other")
    .map((n) => REQUEST_NEED_LABELS[n])
    .join("; ");

export { REQUEST_STATUS_LABELS };
