import { formatCount, formatMoney, formatPercent } from "@/lib/format/number";

/** A plan parameter value printed by its kind. */
export function formatByKind(kind: "money" | "rate" | "count" | "text" | "factor", value: string): string {
  switch (kind) {
    case "money":
      return formatMoney(value);
    case "rate":
      return formatPercent(Number(value));
    case "count":
      return formatCount(Number(value));
    case "factor":
      return value;
    default:
      return value;
  }
}
