import type { PopulationStatus } from "@/lib/data/populations";

export const POPULATION_STATUS_LABELS: Record<PopulationStatus, string> = {
  loading: "Loading",
  unreconciled: "Unreconciled",
  reconciled: "Reconciled",
  superseded: "Superseded",
};

export function populationStatusTone(status: PopulationStatus): "amber" | "green" | "neutral" | "blue" {
  return status === "reconciled"
    ? "green"
    : status === "unreconciled"
      ? "amber"
      : status === "loading"
        ? "blue"
        : "neutral";
}
