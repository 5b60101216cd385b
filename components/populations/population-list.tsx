import Link from "next/link";
import type { PopulationRecord } from "@/lib/data/populations";
import { Amount } from "@/components/ui/amount";
import { Badge } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/card";
import { POPULATION_STATUS_LABELS, populationStatusTone } from "./labels";
import { formatCount } from "@/lib/format/number";
import { Table, THead, Th, Td } from "@/components/ui/table";

/** The engagement's populations for its overview card: name, items, total, state. */
export function PopulationList({
  engagementId,
  populations,
  currency,
  mayLoad,
}: {
  engagementId: number;
  populations: PopulationRecord[];
  currency: string;
  mayLoad: boolean;
}) {
  if (populations.length === 0) {
    return (
      <EmptyState title="No population loaded yet">
        {mayLoad
          ? "Load the client’s ledger (CSV or Excel) to reconcile it and sample from it."
          : "A senior on the team loads the client’s ledger; it will be listed here."}
      </EmptyState>
    );
  }
  return (
    <Table label="Populations" density="list">
      <THead>
        <tr>
          <Th>Population</Th>
          <Th numeric>Items</Th>
          <Th numeric>Total ({currency})</Th>
          <Th>Status</Th>
        </tr>
      </THead>
      <tbody>
        {populations.map((p) => (
          <tr key={p.id} className={`border-t border-ink-line/70 ${p.status === "superseded" ? "text-ink-faint" : ""}`}>
            <Td>
              <Link
                href={`/engagements/${engagementId}/populations/${p.id}`}
                className="font-medium text-ink hover:text-ledger-600 link"
              >
                {p.name}
              </Link>
              <span className="block text-xs text-ink-faint">{p.sourceFileName}</span>
            </Td>
            <Td numeric>{formatCount(p.rowCount)}</Td>
            <Td numeric>
              <Amount value={p.total} />
            </Td>
            <Td>
              <Badge tone={populationStatusTone(p.status)}>{POPULATION_STATUS_LABELS[p.status]}</Badge>
            </Td>
          </tr>
        ))}
      </tbody>
    </Table>
  );
}
