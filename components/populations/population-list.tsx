import Link from "next/link";
import type { PopulationRecord } from "@/lib/data/populations";
import { Amount } from "@/components/ui/amount";
import { Badge } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/card";
import { formatCount, POPULATION_STATUS_LABELS, populationStatusTone } from "./labels";

/** The engagement's populations for its overview card: name, items, total, state. */
export function PopulationList({ engagementId, populations, currency, mayLoad }: { engagementId: number; populations: PopulationRecord[]; currency: string; mayLoad: boolean }) {
  if (populations.length === 0) {
    return (
      <EmptyState title="No population loaded yet">
        {mayLoad ? "Load the client’s ledger (CSV or Excel) to reconcile it and sample from it." : "A senior on the team loads the client’s ledger; it will be listed here."}
      </EmptyState>
    );
  }
  return (
    <table className="w-full text-sm" aria-label="Populations">
      <thead className="text-left text-xs uppercase tracking-wider text-ink-soft">
        <tr>
          <th scope="col" className="py-2 pr-4 font-semibold">Population</th>
          <th scope="col" className="py-2 pr-4 text-right font-semibold">Items</th>
          <th scope="col" className="py-2 pr-4 text-right font-semibold">Total ({currency})</th>
          <th scope="col" className="py-2 font-semibold">Status</th>
        </tr>
      </thead>
      <tbody>
        {populations.map((p) => (
          <tr key={p.id} className={`border-t border-ink-line/70 ${p.status === "superseded" ? "text-ink-faint" : ""}`}>
            <td className="py-2.5 pr-4">
              <Link href={`/engagements/${engagementId}/populations/${p.id}`} className="font-medium text-ink hover:text-ledger-600 link">{p.name}</Link>
              <span className="block text-xs text-ink-faint">{p.sourceFileName}</span>
            </td>
            <td className="figures py-2.5 pr-4 text-right">{formatCount(p.rowCount)}</td>
            <td className="py-2.5 pr-4 text-right"><Amount value={p.total} /></td>
            <td className="py-2.5"><Badge tone={populationStatusTone(p.status)}>{POPULATION_STATUS_LABELS[p.status]}</Badge></td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
