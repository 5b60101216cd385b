import type { PopulationProfile } from "@/lib/data/population-items";
import { Amount } from "@/components/ui/amount";
import { formatCount } from "@/lib/format/number";

const th = "px-3 py-2 font-semibold";
const td = "px-3 py-1.5";

export function LargestItems({ items, currency }: { items: PopulationProfile["largest"]; currency: string }) {
  if (items.length === 0) return <p className="text-sm text-ink-soft">No items.</p>;
  return (
    <table className="w-full text-sm" aria-label="Largest items">
      <thead className="text-left text-xs uppercase tracking-wider text-ink-soft">
        <tr><th scope="col" className={`${th} text-right`}>Row</th><th scope="col" className={th}>Reference</th><th scope="col" className={th}>Description</th><th scope="col" className={`${th} text-right`}>Book value ({currency})</th></tr>
      </thead>
      <tbody>
        {items.map((i) => (
          <tr key={i.rowNumber} className="border-t border-ink-line/60">
            <td className={`${td} figures text-right text-ink-faint`}>{i.rowNumber}</td>
            <td className={`${td} whitespace-nowrap font-medium`}>{i.itemRef}</td>
            <td className={`${td} max-w-48 truncate text-ink-soft`} title={i.description ?? undefined}>{i.description}</td>
            <td className={`${td} text-right`}><Amount value={i.bookValue} /></td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

export function DuplicateRefs({ duplicates, duplicateRefCount }: { duplicates: PopulationProfile["duplicates"]; duplicateRefCount: number }) {
  if (duplicateRefCount === 0) return <p className="text-sm text-ledger-700">Every item reference is unique.</p>;
  return (
    <div className="space-y-2">
      <p className="text-sm text-amber-700">
        {formatCount(duplicateRefCount)} {duplicateRefCount === 1 ? "reference appears" : "references appear"} more than once. Check whether they are split lines or double postings.
        {duplicates.length < duplicateRefCount && ` The ${duplicates.length} most repeated are shown.`}
      </p>
      <div className="max-h-72 overflow-auto">
        <table className="w-full text-sm" aria-label="Duplicate item references">
          <thead className="text-left text-xs uppercase tracking-wider text-ink-soft">
            <tr><th scope="col" className={th}>Reference</th><th scope="col" className={`${th} text-right`}>Times</th><th scope="col" className={`${th} text-right`}>Combined book value</th></tr>
          </thead>
          <tbody>
            {duplicates.map((d) => (
              <tr key={d.itemRef} className="border-t border-ink-line/60">
                <td className={`${td} font-medium`}>{d.itemRef}</td>
                <td className={`${td} figures text-right`}>{formatCount(d.count)}</td>
                <td className={`${td} text-right`}><Amount value={d.total} /></td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
