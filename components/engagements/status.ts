import type { EngagementRecord } from "@/lib/data/engagements";

export const STATUS_LABELS: Record<EngagementRecord["status"], string> = {
  planning: "Planning",
  fieldwork: "Fieldwork",
  completion: "Completion",
  archived: "Archived",
};

export function statusTone(status: EngagementRecord["status"]) {
  return ({ planning: "blue", fieldwork: "amber", completion: "green", archived: "neutral" } as const)[status];
}
