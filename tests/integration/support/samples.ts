import { call } from "./call";
import { uploadAndLoad } from "./populations";
import * as reconcile from "@/app/api/engagements/[engagementId]/populations/[populationId]/reconciliation/route";
import * as samples from "@/app/api/engagements/[engagementId]/samples/route";
import * as draw from "@/app/api/engagements/[engagementId]/samples/[sampleId]/draw/route";
import * as items from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/route";
import * as item from "@/app/api/engagements/[engagementId]/samples/[sampleId]/items/[itemId]/route";
import * as evaluation from "@/app/api/engagements/[engagementId]/samples/[sampleId]/evaluation/route";
import * as conclusion from "@/app/api/engagements/[engagementId]/samples/[sampleId]/conclusion/route";

/**
 * The canonical 20-invoice population used in the methods reference's worked examples (302 bytes,
 * SHA-256 5952c03f…3a0e, computed there with Python and checked with sha256sum).
 */
export const CANONICAL_CSV =
  "id,book_value\nINV001,1250.00\nINV002,480.50\nINV003,0.00\nINV004,3625.75\nINV005,910.20\nINV006,12500.00\nINV007,155.00\nINV008,-420.00\n" +
  "INV009,2300.10\nINV010,777.77\nINV011,4100.00\nINV012,59.99\nINV013,1823.45\nINV014,960.00\nINV015,3333.33\nINV016,1200.00\nINV017,645.00\n" +
  "INV018,2750.00\nINV019,199.99\nINV020,888.88\n";
export const CANONICAL_SHA256 = "5952c03fa993e6c3f9ced11c4e18a47b10b687fbc16908b3cb70ac257f133a0e";

/** Loads and reconciles the canonical population; returns its id. */
export async function loadCanonicalPopulation(as: number, engagementId: number) {
  const { up, loaded } = await uploadAndLoad(as, engagementId, "canonical.csv", CANONICAL_CSV, {
    itemRefColumn: "id",
    bookValueColumn: "book_value",
  });
  if (loaded?.last?.type !== "loaded") throw new Error(`load failed: ${JSON.stringify(loaded?.last ?? up.json)}`);
  const populationId = loaded.last.populationId as number;
  const r = await call(reconcile.POST, "POST", {
    as,
    params: { engagementId: String(engagementId), populationId: String(populationId) },
    body: { controlTotal: loaded.last.total, controlCount: loaded.last.rowCount },
  });
  if (r.status !== 200) throw new Error(`reconcile failed: ${JSON.stringify(r.json)}`);
  return { populationId, sha256: up.json.upload.sha256 as string };
}

export const planSample = (as: number, engagementId: number, body: Record<string, unknown>) =>
  call(samples.POST, "POST", {
    as,
    params: { engagementId: String(engagementId) },
    body: {
      name: "Test sample",
      objective: "Test the existence of receivables",
      assertion: "Existence",
      direction: "overstatement",
      ...body,
    },
  });

export const drawSample = (as: number, engagementId: number, sampleId: number, seed?: number) =>
  call(draw.POST, "POST", {
    as,
    params: { engagementId: String(engagementId), sampleId: String(sampleId) },
    body: seed === undefined ? {} : { seed },
  });

export async function listSampleItems(as: number, engagementId: number, sampleId: number) {
  const r = await call(items.GET, "GET", {
    as,
    params: { engagementId: String(engagementId), sampleId: String(sampleId) },
    query: { pageSize: "500" },
  });
  return r.json.items as {
    id: number;
    itemRef: string;
    bookValue: string;
    version: number;
    topStratum: boolean;
    selectionOrder: number;
    hitPoints: number[] | null;
    populationRowNumber: number;
    status: string;
    misstatement: string | null;
  }[];
}

export const saveResult = (
  as: number,
  engagementId: number,
  sampleId: number,
  itemId: number,
  body: Record<string, unknown>,
) =>
  call(item.PATCH, "PATCH", {
    as,
    params: { engagementId: String(engagementId), sampleId: String(sampleId), itemId: String(itemId) },
    body,
  });

export async function getEvaluation(as: number, engagementId: number, sampleId: number) {
  return (
    await call(evaluation.GET, "GET", {
      as,
      params: { engagementId: String(engagementId), sampleId: String(sampleId) },
    })
  ).json.evaluation;
}

/** The preparer records the auditor's conclusion (with a response, valid whether or not one is called for). */
export const concludeSample = (
  as: number,
  engagementId: number,
  sampleId: number,
  body: Record<string, unknown> = {},
) =>
  call(conclusion.PUT, "PUT", {
    as,
    params: { engagementId: String(engagementId), sampleId: String(sampleId) },
    body: {
      conclusion: "Based on this sample and our judgement, the balance is not materially misstated.",
      responses: [{ kind: "alternative-procedures", note: "Subsequent receipts agreed" }],
      ...body,
    },
  });
