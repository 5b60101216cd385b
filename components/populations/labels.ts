import type { PopulationStatus } from "@/lib/data/populations";

export const POPULATION_STATUS_LABELS: Record<PopulationStatus, string> = {
  loading: "Loading",
  unreconciled: "Unreconciled",
  reconciled: "Reconciled",
  superseded: "Superseded",
};

export function populationStatusTone(status: PopulationStatus): "amber" | "green" | "neutral" | "blue" {
  return status === "reconciled" ? "green" : status === "unreconciled" ? "amber" : status === "loading" ? "blue" : "neutral";
}

/** 1,536 → "1.5 KB"; binary multiples, as file managers show them. */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  const units = ["KB", "MB", "GB"];
  let value = bytes / 1024;
  let unit = 0;
  while (value >= 1024 && unit < units.length - 1) {
    value /= 1024;
    unit += 1;
  }
  return `${value.toFixed(value < 10 ? 1 : 0)} ${units[unit]}`;
}

export const formatCount = (n: number) => n.toLocaleString("en-US");
