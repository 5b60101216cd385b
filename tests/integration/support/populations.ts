import { getDb } from "@/db/knex";
import { call, callEvents } from "./call";
import * as uploads from "@/app/api/engagements/[engagementId]/populations/uploads/route";
import * as load from "@/app/api/engagements/[engagementId]/populations/uploads/[uploadId]/load/route";
import type { PopulationMappingInput } from "@/lib/validation/population-mapping";

export const RECEIVABLES_MAPPING: PopulationMappingInput = {
  itemRefColumn: "Invoice",
  bookValueColumn: "Amount",
  descriptionColumn: "Customer",
};

export async function upload(as: number, engagementId: number, fileName: string, bytes: Uint8Array | string) {
  const file = typeof bytes === "string" ? new TextEncoder().encode(bytes) : bytes;
  return call(uploads.POST, "POST", { as, params: { engagementId: String(engagementId) }, query: { fileName }, file });
}

export async function uploadAndLoad(
  as: number,
  engagementId: number,
  fileName: string,
  bytes: Uint8Array | string,
  mapping: PopulationMappingInput = RECEIVABLES_MAPPING,
  extra: Record<string, unknown> = {},
) {
  const up = await upload(as, engagementId, fileName, bytes);
  if (up.status !== 201) return { up, loaded: null };
  const loaded = await callEvents(load.POST, "POST", {
    as,
    params: { engagementId: String(engagementId), uploadId: String(up.json.upload.id) },
    body: { name: `Population from ${fileName}`, mapping, ...extra },
  });
  return { up, loaded };
}

/** Everything a failed import must leave untouched. */
export async function populationState() {
  const db = getDb();
  const [p, i] = await Promise.all([
    db("populations").count({ n: "*" }).first(),
    db("population_items").count({ n: "*" }).first(),
  ]);
  return { populations: Number(p?.n), items: Number(i?.n) };
}
