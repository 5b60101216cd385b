import { readFile } from "node:fs/promises";
import { expect, type APIRequestContext } from "@playwright/test";
import { generateLedgerCsv } from "../../bench/generate-ledger";

export const LEDGER_MAPPING = { itemRefColumn: "Invoice", bookValueColumn: "Amount", descriptionColumn: "Customer" };

export interface LoadedPopulation {
  id: number;
  rowCount: number;
  total: string;
  positiveTotal: string;
}

/**
 * Loads a generated ledger through the API as the signed-in user (the calls the load screen makes:
 * upload the raw file, load it with a mapping, reconcile it to the control figures it was loaded with).
 */
export async function loadReconciledLedger(
  request: APIRequestContext,
  a: { engagementId: number; path: string; rows: number; seed: number; name: string },
): Promise<LoadedPopulation> {
  await generateLedgerCsv(a.path, a.rows, a.seed);
  const base = `/api/engagements/${a.engagementId}/populations`;
  const up = await request.post(`${base}/uploads?fileName=${encodeURIComponent("receivables-e2e.csv")}`, {
    data: await readFile(a.path),
    headers: { "content-type": "application/octet-stream" },
  });
  expect(up.status(), await up.text()).toBe(201);
  const { upload } = await up.json();
  const load = await request.post(`${base}/uploads/${upload.id}/load`, {
    data: { name: a.name, mapping: LEDGER_MAPPING },
  });
  const events = (await load.text())
    .split("\n")
    .filter(Boolean)
    .map((l) => JSON.parse(l));
  const loaded = events.at(-1);
  expect(loaded?.type, JSON.stringify(loaded)).toBe("loaded");
  const rec = await request.post(`${base}/${loaded.populationId}/reconciliation`, {
    data: { controlTotal: loaded.total, controlCount: loaded.rowCount },
  });
  expect(rec.status(), await rec.text()).toBe(200);
  const { population } = await rec.json();
  expect(population.status).toBe("reconciled");
  return {
    id: loaded.populationId,
    rowCount: loaded.rowCount,
    total: loaded.total,
    positiveTotal: population.positive.total,
  };
}

export async function engagementIdByClient(request: APIRequestContext, clientName: string): Promise<number> {
  const res = await request.get("/api/engagements");
  expect(res.status()).toBe(200);
  const { engagements } = await res.json();
  const found = engagements.find((e: { clientName: string }) => e.clientName === clientName);
  expect(found, `engagement of ${clientName}`).toBeTruthy();
  return found.id;
}
