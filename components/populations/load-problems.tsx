import { Alert } from "@/components/ui/alert";
import { formatCount } from "@/lib/format/number";
import { Table, THead, Th, Td } from "@/components/ui/table";

type Problem = { row: number; column: string | null; reason: string };

/** Row problems of a refused load: the first 100 on screen, the whole list as CSV. */
export function LoadProblems({
  problems,
  problemCount,
  downloadHref,
  fileName,
}: {
  problems: Problem[];
  problemCount: number;
  downloadHref: string;
  fileName: string;
}) {
  return (
    <div className="space-y-4">
      <Alert>
        <p className="font-semibold">
          {formatCount(problemCount)} {problemCount === 1 ? "row has a problem" : "problems were found"} in {fileName}.
          Nothing was stored.
        </p>
        <p className="mt-1">
          Correct the file (or the column mapping) and upload it again; the population loads only when every row reads
          cleanly.
        </p>
      </Alert>
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="text-sm text-ink-soft">
          {problems.length < problemCount
            ? `Showing the first ${formatCount(problems.length)} of ${formatCount(problemCount)} problems.`
            : `All ${formatCount(problemCount)} shown.`}
        </p>
        <a href={downloadHref} download className="text-sm font-medium text-ledger-600 link">
          Download all problems (CSV)
        </a>
      </div>
      <div className="max-h-[28rem] overflow-auto rounded-card border border-ink-line bg-paper-raised">
        <Table label="Problems found" density="boxed">
          <THead className="sticky top-0 bg-paper-sunk">
            <tr>
              <Th numeric>Row</Th>
              <Th>Column</Th>
              <Th>Problem</Th>
            </tr>
          </THead>
          <tbody>
            {problems.map((p, i) => (
              <tr key={`${p.row}-${p.column}-${i}`} className="border-t border-ink-line/60">
                <Td numeric>{p.row}</Td>
                <Td>{p.column ?? <span className="text-ink-faint">whole row</span>}</Td>
                <Td>{p.reason}</Td>
              </tr>
            ))}
          </tbody>
        </Table>
      </div>
    </div>
  );
}
