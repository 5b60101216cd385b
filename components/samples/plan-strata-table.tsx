import type { PlannedStratum } from "@/lib/samples/plan";
import { Amount } from "@/components/ui/amount";
import { formatCount } from "@/lib/format/number";
import { Table, THead, Th, Td } from "@/components/ui/table";

/** Neyman allocation of the sample across book-value bands, as planned. */
export function PlanStrataTable({ strata }: { strata: PlannedStratum[] }) {
  const total = strata.reduce((n, s) => n + s.allocation, 0);
  return (
    <Table label="Allocation by stratum" density="compact">
      <caption className="mb-1 text-left text-xs font-semibold uppercase tracking-wider text-ink-soft">
        Neyman allocation by stratum
      </caption>
      <THead className="">
        <tr>
          <Th className="font-medium">Band</Th>
          <Th numeric className="font-medium">
            N<sub>h</sub>
          </Th>
          <Th numeric className="font-medium">
            Book value
          </Th>
          <Th numeric className="font-medium">
            S<sub>h</sub>
          </Th>
          <Th numeric className="font-medium">
            n<sub>h</sub>
          </Th>
        </tr>
      </THead>
      <tbody>
        {strata.map((s) => (
          <tr key={s.number} className="border-t border-ink-line/60">
            <Td>
              {s.number}. {s.label}
            </Td>
            <Td numeric>{formatCount(s.populationSize)}</Td>
            <Td className="text-right">
              <Amount value={s.bookValue} />
            </Td>
            <Td className="text-right">
              <Amount value={s.standardDeviation.toFixed(2)} />
            </Td>
            <Td numeric className="font-semibold">
              {formatCount(s.allocation)}
            </Td>
          </tr>
        ))}
        <tr className="border-t border-ink-line font-semibold">
          <Td colSpan={4}>Total</Td>
          <Td numeric>{formatCount(total)}</Td>
        </tr>
      </tbody>
    </Table>
  );
}
