import { createReadStream } from "node:fs";
import { createInterface } from "node:readline";

export interface LedgerTotals {
  rows: number;
  totalCents: bigint;
  lineEnding: "\n" | "\r\n";
  header: string[];
}

/** "-1234.56" → -123456n; the generator always writes two decimals. */
function amountToCents(text: string): bigint {
  const m = /^(-?)(\d+)\.(\d\d)$/.exec(text);
  if (!m) throw new Error(`unexpected amount "${text}" in the generated ledger`);
  const cents = BigInt(m[2]) * 100n + BigInt(m[3]);
  return m[1] ? -cents : cents;
}

/**
 * Counts the data rows of a generated ledger and totals its Amount column in BigInt cents,
 * independently of lib/imports. Only Customer can be quoted (it may hold a comma), so Amount is
 * the second field from the right of every line.
 */
export async function readLedgerTotals(filePath: string): Promise<LedgerTotals> {
  const lines = createInterface({
    input: createReadStream(filePath, { encoding: "utf8", highWaterMark: 1 << 20 }),
    crlfDelay: Infinity,
  });
  let header: string[] | null = null;
  let rows = 0;
  let totalCents = 0n;
  let sawCr = false;
  let amountFromRight = 0;
  for await (const line of lines) {
    if (line.endsWith("\r")) sawCr = true;
    if (header === null) {
      header = line.replace(/\r$/, "").split(",");
      amountFromRight = header.length - header.indexOf("Amount");
      if (amountFromRight > header.length) throw new Error("the generated ledger has no Amount column");
      continue;
    }
    if (line === "") continue;
    let end = line.length;
    for (let i = 1; i < amountFromRight; i += 1) end = line.lastIndexOf(",", end - 1);
    const start = line.lastIndexOf(",", end - 1) + 1;
    totalCents += amountToCents(line.slice(start, end));
    rows += 1;
  }
  if (header === null) throw new Error("the generated ledger is empty");
  return { rows, totalCents, lineEnding: sawCr ? "\r\n" : "\n", header };
}

export function centsToDecimal(cents: bigint): string {
  const sign = cents < 0n ? "-" : "";
  const abs = cents < 0n ? -cents : cents;
  return `${sign}${abs / 100n}.${String(abs % 100n).padStart(2, "0")}`;
}
