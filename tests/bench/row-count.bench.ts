/**
 * The cost of counting an upload's data rows (issue 17): the upload answer inspects the head of the
 * file (the preview) and then counts every data row with the load's own readers, so a file over the
 * row limit is refused before anything is stored and the inspection step can show the count.
 * Times, in this process, the inspection alone against inspection + count on a 1,000,000-row CSV
 * (and with --xlsx the same ledger as a workbook), median of 3 each, and prints the ratio.
 * Run: npx tsx --conditions=react-server tests/bench/row-count.bench.ts [--xlsx]  (part of `npm run bench`).
 */
import { existsSync, mkdirSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { loadavg } from "node:os";
import { inspectUpload } from "../../lib/imports/inspect-upload";
import { countDataRowsWithinLimit } from "../../lib/imports/count-data-rows";
import { MAX_DATA_ROWS } from "../../lib/imports/limits";
import { generateLedgerCsv } from "./generate-ledger";
import { csvToXlsx } from "./support/ledger-xlsx";
import { median } from "./support/stats";

const ROWS = 1_000_000;
const RUNS = 3;

async function timeIt<T>(work: () => Promise<T>): Promise<{ ms: number; value: T }> {
  const started = performance.now();
  const value = await work();
  return { ms: performance.now() - started, value };
}

async function measure(label: string, file: string): Promise<string> {
  const inspectOnly: number[] = [];
  const withCount: number[] = [];
  const countOnly: number[] = [];
  let rows = 0;
  for (let run = 0; run < RUNS; run++) {
    const a = await timeIt(() => inspectUpload(file));
    inspectOnly.push(a.ms);
    const b = await timeIt(async () => {
      const inspection = await inspectUpload(file);
      const c = await timeIt(() => countDataRowsWithinLimit(file, inspection, MAX_DATA_ROWS));
      countOnly.push(c.ms);
      return c.value;
    });
    withCount.push(b.ms);
    rows = b.value;
  }
  if (rows !== ROWS) throw new Error(`${label}: counted ${rows} data rows, not ${ROWS}`);
  const [i, w, c] = [median(inspectOnly), median(withCount), median(countOnly)];
  return `${label}: inspection alone ${i.toFixed(0)} ms; inspection + row count ${w.toFixed(0)} ms (${(w / i).toFixed(1)}× the inspection alone; the count itself ${(c / 1000).toFixed(2)} s, ${((ROWS / c) * 1000).toLocaleString("en-US", { maximumFractionDigits: 0 })} rows/s); ${rows.toLocaleString("en-US")} data rows counted`;
}

async function main() {
  const dir = path.join(tmpdir(), "sondage-row-count-bench");
  mkdirSync(dir, { recursive: true });
  const csv = path.join(dir, `ledger-${ROWS}.csv`);
  if (!existsSync(csv)) await generateLedgerCsv(csv, ROWS, 20261203);
  const lines = [await measure("CSV, 1,000,000 rows", csv)];
  if (process.argv.includes("--xlsx")) {
    const xlsx = path.join(dir, `ledger-${ROWS}.xlsx`);
    if (!existsSync(xlsx)) await csvToXlsx(csv, xlsx);
    lines.push(await measure("XLSX, the same 1,000,000 rows", xlsx));
  }
  console.log(
    `\n== row-count figures (median of ${RUNS}; load average ${loadavg()
      .map((l) => l.toFixed(2))
      .join(", ")} on a shared 2-core machine)\n` + lines.map((l) => `- ${l}`).join("\n"),
  );
}

main().catch((err: unknown) => {
  console.error("[row-count bench] failed:", err);
  process.exit(1);
});
