import type { PopulationProfile } from "@/lib/data/population-items";
import { Amount } from "@/components/ui/amount";
import { formatCount } from "@/lib/format/number";
import { Table, THead, Th, Td } from "@/components/ui/table";

const th = "px-3 py-2 font-semibold";
const td = "px-3 py-1.5";

export function LargestItems({ items, currency }: { items: PopulationProfile["largest"]; currency: string }) {
  if (items.length === 0) return <p className="text-sm text-ink-soft">No items.</p>;
  return (
    <Table label="Largest items" density="compact">
      <THead>
        <tr>
          <Th className={`${th} text-right`}>Row</Th>
          <Th className={th}>Reference</Th>
          <Th className={th}>Description</Th>
          <Th className={`${th} text-right`}>Book value ({currency})</Th>
        </tr>
      </THead>
      <tbody>
        {items.map((i) => (
          <tr key={i.rowNumber} className="border-t border-ink-line/60">
            <Td className={`${td} figures text-right text-ink-faint`}>{i.rowNumber}</Td>
            <Td className={`${td} whitespace-nowrap font-medium`}>{i.itemRef}</Td>
            <Td className={`${td} max-w-48 truncate text-ink-soft`} title={i.description ?? undefined}>
              {i.description}
            </Td>
            <Td className={`${td} text-right`}>
              <Amount value={i.bookValue} />
            </Td>
          </tr>
        ))}
      </tbody>
    </Table>
  );
}

export function DuplicateRefs({
  duplicates,
  duplicateRefCount,
}: {
  duplicates: PopulationProfile["duplicates"];
  duplicateRefCount: number;
}) {
  if (duplicateRefCount === 0) return <p className="text-sm text-ledger-700">Every item reference is unique.</p>;
  return (
    <div className="space-y-2">
      <p className="text-sm text-amber-700">
        {formatCount(duplicateRefCount)} {duplicateRefCount === 1 ? "reference appears" : "references appear"} more than
        once. Check whether they are split lines or double postings.
        {duplicates.length < duplicateRefCount && ` The ${duplicates.length} most repeated are shown.`}
      </p>
      <div className="max-h-72 overflow-auto">
        <Table label="Duplicate item references" density="compact">
          <THead>
            <tr>
              <Th className={th}>Reference</Th>
              <Th className={`${th} text-right`}>Times</Th>
              <Th className={`${th} text-right`}>Combined book value</Th>
            </tr>
          </THead>
          <tbody>
            {duplicates.map((d) => (
              <tr key={d.itemRef} className="border-t border-ink-line/60">
                <Td className={`${td} font-medium`}>{d.itemRef}</Td>
                <Td className={`${td} figures text-right`}>{formatCount(d.count)}</Td>
                <Td className={`${td} text-right`}>
                  <Amount value={d.total} />
                </Td>
              </tr>
            ))}
          </tbody>
        </Table>
      </div>
    </div>
  );
}
