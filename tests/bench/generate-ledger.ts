import { createWriteStream } from "node:fs";
import { once } from "node:events";

/**
 * Writes an invented receivables ledger CSV (header + `rows` lines), streaming to disk:
 * Invoice, Customer, Posted, Due, Amount, Currency. Amounts are skewed (many small invoices, a
 * long tail of large ones), with about 1% zero lines and 3% credit notes (negative, "CN-" refs).
 * Deterministic for a given seed; a small generator of its own, not the sampling engine's.
 */
export async function generateLedgerCsv(path: string, rows: number, seed: number): Promise<void> {
  const next = mulberry32(seed);
  const out = createWriteStream(path, { encoding: "utf8" });
  out.write("Invoice,Customer,Posted,Due,Amount,Currency\n");
  const start = Date.UTC(2024, 0, 1);
  let buffer = "";
  for (let i = 1; i <= rows; i += 1) {
    const kind = next();
    const credit = kind < 0.03;
    const zero = !credit && kind < 0.04;
    // Log-normal-ish: exp of a scaled uniform sum gives a right-skewed amount, mostly 50–5,000.
    const cents = zero ? 0 : Math.round(Math.exp(4 + 6 * ((next() + next() + next()) / 3)) * 100);
    const amount = `${credit ? "-" : ""}${Math.floor(cents / 100)}.${String(cents % 100).padStart(2, "0")}`;
    const posted = new Date(start + Math.floor(next() * 366) * 86_400_000);
    const due = new Date(posted.getTime() + 30 * 86_400_000);
    const ref = `${credit ? "CN" : "INV"}-${String(100000 + i)}`;
    buffer += `${ref},${customerName(next)},${iso(posted)},${iso(due)},${amount},EUR\n`;
    if (buffer.length > 1 << 16) {
      if (!out.write(buffer)) await once(out, "drain");
      buffer = "";
    }
  }
  out.end(buffer);
  await once(out, "finish");
}

const FIRST = ["Atelier", "Verger", "Quai", "Maison", "Ferme", "Cave", "Forge", "Moulin", "Comptoir", "Jardin"];
const SECOND = ["Brume", "du Nord", "Ouest", "Lumière", "des Sables", "Rivage", "Haut-Val", "Sel", "Cèdre", "Marée"];
const SUFFIX = ["SARL", "SAS", "& Fils", "Coopérative", "Ltd", "GmbH"];

function customerName(next: () => number): string {
  const name = `${pick(FIRST, next)} ${pick(SECOND, next)} ${pick(SUFFIX, next)}`;
  return next() < 0.1 ? `"${name}, Branch ${1 + Math.floor(next() * 9)}"` : name;
}

function pick<T>(list: readonly T[], next: () => number): T {
  return list[Math.floor(next() * list.length)];
}

function iso(date: Date): string {
  return date.toISOString().slice(0, 10);
}

/** mulberry32, a small 32-bit seeded generator (public-domain, common practice for test data). */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
