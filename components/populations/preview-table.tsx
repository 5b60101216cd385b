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
      <table className="w-full text-xs" aria-label="File preview">
        <thead className="sticky top-0 bg-paper-sunk text-left text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2 text-right font-semibold">
              Row
            </th>
            {headers.map((h) => {
              const role = roles[h];
              return (
                <th
                  key={h}
                  scope="col"
                  className={`whitespace-nowrap px-3 py-2 font-semibold ${role && role !== "extra" ? "bg-ledger-50 text-ledger-700" : role ? "bg-amber-50 text-amber-700" : ""}`}
                >
                  {role && <span className="block text-[10px] uppercase tracking-wider">{ROLE_TAGS[role]}</span>}
                  {h}
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody>
          {rows.map((cells, i) => (
            <tr key={rowNumbers[i] ?? i} className="border-t border-ink-line/60">
              <td className="figures px-3 py-1.5 text-right text-ink-faint">{rowNumbers[i]}</td>
              {cells.map((cell, j) => {
                const role = roles[headers[j]];
                return (
                  <td
                    key={j}
                    className={`max-w-56 truncate whitespace-nowrap px-3 py-1.5 ${role === "book" ? "figures text-right" : ""} ${role && role !== "extra" ? "bg-ledger-50/50" : ""}`}
                    title={cell}
                  >
                    {cell}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
