import { Table, Th, Td } from "@/components/ui/table";
const ROLE_TAGS: Record<string, string> = {
  ref: "Reference",
  book: "Book value",
  desc: "Description",
  date: "Date",
  extra: "Kept",
};

/** The first rows of the file as read, with each column's mapping shown above its name. */
export function PreviewTable({
  headers,
  rows,
  rowNumbers,
  roles,
}: {
  headers: string[];
  rows: string[][];
  rowNumbers: number[];
  roles: Record<string, keyof typeof ROLE_TAGS | undefined>;
}) {
  return (
    <div className="max-h-[28rem] overflow-auto rounded-card border border-ink-line bg-paper-raised">
      <Table label="File preview" className="text-xs">
        <thead className="sticky top-0 bg-paper-sunk text-left text-ink-soft">
          <tr>
            <Th numeric className="px-3 py-2">
              Row
            </Th>
            {headers.map((h) => {
              const role = roles[h];
              return (
                <Th
                  key={h}
                  className={`whitespace-nowrap px-3 py-2 ${role && role !== "extra" ? "bg-ledger-50 text-ledger-700" : role ? "bg-amber-50 text-amber-700" : ""}`}
                >
                  {role && <span className="block text-[10px] uppercase tracking-wider">{ROLE_TAGS[role]}</span>}
                  {h}
                </Th>
              );
            })}
          </tr>
        </thead>
        <tbody>
          {rows.map((cells, i) => (
            <tr key={rowNumbers[i] ?? i} className="border-t border-ink-line/60">
              <Td numeric className="px-3 py-1.5 text-ink-faint">
                {rowNumbers[i]}
              </Td>
              {cells.map((cell, j) => {
                const role = roles[headers[j]];
                return (
                  <Td
                    key={j}
                    numeric={role === "book"}
                    className={`max-w-56 truncate whitespace-nowrap px-3 py-1.5 ${role && role !== "extra" ? "bg-ledger-50/50" : ""}`}
                    title={cell}
                  >
                    {cell}
                  </Td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </Table>
    </div>
  );
}
