import "server-only";
import type { Knex } from "knex";
import { populationMappingSchema, type PopulationMapping } from "@/lib/validation/population-mapping";
import { parseJsonColumn } from "./json-column";
import type { Reconcile } from "@/lib/validation/population";
import { recordAudit } from "./audit-log";
import { conflict, notFound } from "@/lib/errors";
import { centsToDecimal, decimalToCents } from "@/lib/money";

export type PopulationStatus = "loading" | "unreconciled" | "reconciled" | "superseded";

export interface PopulationRecord {
  id: number;
  engagementId: number;
  name: string;
  sourceFileName: string;
  sourceSizeBytes: number;
  sourceSha256: string;
  sourceObjectKey: string;
  mapping: PopulationMapping;
  rowCount: number;
  total: string;
  positive: { count: number; total: string };
  zero: { count: number };
  negative: { count: number; total: string };
  controlTotal: string | null;
  controlCount: number | null;
  /** Ledger figures minus loaded figures; null until the auditor enters the control figures. */
  difference: { total: string; count: number } | null;
  reconciliationExplanation: string | null;
  reconciledAt: string | null;
  reconciledByName: string | null;
  status: PopulationStatus;
  supersedesId: number | null;
  /** When it was archived (kept, out of the lists), or null. */
  archivedAt: string | null;
  createdAt: string;
  createdByName: string;
}

function toPopulation(r: Record<string, unknown>): PopulationRecord {
  const controlTotal = r.control_total === null ? null : String(r.control_total);
  const controlCount = r.control_count === null ? null : Number(r.control_count);
  return {
    id: Number(r.id),
    engagementId: Number(r.engagement_id),
    name: String(r.name),
    sourceFileName: String(r.source_file_name),
    sourceSizeBytes: Number(r.source_size_bytes),
    sourceSha256: String(r.source_sha256),
    sourceObjectKey: String(r.source_object_key),
    mapping: parseJsonColumn(populationMappingSchema, r.mapping_json, "populations.mapping_json"),
    rowCount: Number(r.row_count),
    total: String(r.total),
    positive: { count: Number(r.positive_count), total: String(r.positive_total) },
    zero: { count: Number(r.zero_count) },
    negative: { count: Number(r.negative_count), total: String(r.negative_total) },
    controlTotal,
    controlCount,
    difference:
      controlTotal === null || controlCount === null
        ? null
        : {
            total: centsToDecimal(decimalToCents(controlTotal) - decimalToCents(String(r.total))),
            count: controlCount - Number(r.row_count),
          },
    reconciliationExplanation: (r.reconciliation_explanation as string | null) ?? null,
    reconciledAt: r.reconciled_at ? new Date(r.reconciled_at as string).toISOString() : null,
    reconciledByName: (r.reconciled_by_name as string | null) ?? null,
    status: r.status as PopulationStatus,
    supersedesId: r.supersedes_id === null ? null : Number(r.supersedes_id),
    archivedAt: r.archived_at ? new Date(r.archived_at as string).toISOString() : null,
    createdAt: new Date(r.created_at as string).toISOString(),
    createdByName: String(r.created_by_name ?? ""),
  };
}

function basePopulationQuery(db: Knex) {
  return db("populations as p")
    .join("users as c", "c.id", "p.created_by")
    .leftJoin("users as r", "r.id", "p.reconciled_by")
    .whereNot("p.status", "loading")
    .select("p.*", "c.name as created_by_name", "r.name as reconciled_by_name");
}

export async function listPopulationsByEngagementId(db: Knex, { engagementId }: { engagementId: number }) {
  return (await basePopulationQuery(db).where("p.engagement_id", engagementId).orderBy("p.id", "desc")).map(
    toPopulation,
  );
}

/** The names of the populations of a sample's engagement (the audit trail names a population, not its id). */
export async function listPopulationNamesBySampleId(db: Knex, { sampleId }: { sampleId: number }) {
  const rows = await db("populations as p")
    .join("samples as s", "s.engagement_id", "p.engagement_id")
    .where("s.id", sampleId)
    .select("p.id", "p.name");
  return rows.map((r) => ({ id: Number(r.id), name: String(r.name) }));
}

export async function getPopulationById(
  db: Knex,
  { engagementId, populationId }: { engagementId: number; populationId: number },
) {
  const row = await basePopulationQuery(db).where({ "p.id": populationId, "p.engagement_id": engagementId }).first();
  if (!row) throw notFound("No such population");
  return toPopulation(row);
}

/**
 * Records the ledger's control total and count. The population is reconciled when both agree, or
 * when the auditor explains the difference (kept in the audit log); otherwise it stays unreconciled.
 */
export async function reconcilePopulation(
  db: Knex,
  {
    engagementId,
    populationId,
    actorId,
    input,
  }: { engagementId: number; populationId: number; actorId: number; input: Reconcile },
) {
  return db.transaction(async (trx) => {
    const before = await trx("populations")
      .where({ id: populationId, engagement_id: engagementId })
      .whereNot("status", "loading")
      .forUpdate()
      .first();
    if (!before) throw notFound("No such population");
    if (before.status === "superseded")
      throw conflict("This population has been superseded by a corrected file; reconcile the new one.");
    const agrees =
      decimalToCents(input.controlTotal) === decimalToCents(String(before.total)) &&
      input.controlCount === Number(before.row_count);
    const status: PopulationStatus = agrees || input.explanation ? "reconciled" : "unreconciled";
    const patch = {
      control_total: input.controlTotal,
      control_count: input.controlCount,
      reconciliation_explanation: agrees ? null : (input.explanation ?? null),
      status,
      reconciled_by: status === "reconciled" ? actorId : null,
      reconciled_at: status === "reconciled" ? trx.fn.now(3) : null,
    };
    await trx("populations").where({ id: populationId }).update(patch);
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "population",
      entityId: populationId,
      action: "reconcile",
      before: {
        controlTotal: before.control_total,
        controlCount: before.control_count,
        explanation: before.reconciliation_explanation,
        status: before.status,
      },
      after: {
        controlTotal: input.controlTotal,
        controlCount: input.controlCount,
        explanation: patch.reconciliation_explanation,
        status,
      },
    });
    return getPopulationById(trx, { engagementId, populationId });
  });
}

/** The population that replaced this one (loaded with `supersedesId` = it), or null. */
export async function getSupersedingPopulation(
  db: Knex,
  { engagementId, populationId }: { engagementId: number; populationId: number },
) {
  const row = await basePopulationQuery(db)
    .where({ "p.supersedes_id": populationId, "p.engagement_id": engagementId })
    .orderBy("p.id", "desc")
    .first();
  return row ? toPopulation(row) : null;
}

type PopulationPatch = Knex.ResolveTableType<Knex.TableType<"populations">, "update">;

/** A population being loaded (status "loading" until its items are in and its totals written). */
export async function insertPopulation(
  trx: Knex.Transaction,
  a: {
    engagementId: number;
    uploadId: number;
    name: string;
    sourceFileName: string;
    sourceSizeBytes: number;
    sourceSha256: string;
    sourceObjectKey: string;
    mapping: PopulationMapping;
    createdBy: number;
    supersedesId: number | null;
  },
): Promise<number> {
  const [id] = await trx("populations").insert({
    engagement_id: a.engagementId,
    upload_id: a.uploadId,
    name: a.name,
    source_file_name: a.sourceFileName,
    source_size_bytes: a.sourceSizeBytes,
    source_sha256: a.sourceSha256,
    source_object_key: a.sourceObjectKey,
    mapping_json: JSON.stringify(a.mapping),
    created_by: a.createdBy,
    supersedes_id: a.supersedesId,
  });
  return id;
}

export async function updatePopulationById(
  trx: Knex.Transaction,
  { populationId, patch }: { populationId: number; patch: PopulationPatch },
) {
  await trx("populations").where({ id: populationId }).update(patch);
}

/** Marks a loaded population of the engagement superseded; false when there is none such still live. */
export async function supersedePopulationById(
  trx: Knex.Transaction,
  { engagementId, populationId }: { engagementId: number; populationId: number },
): Promise<boolean> {
  const updated = await trx("populations")
    .where({ id: populationId, engagement_id: engagementId })
    .whereIn("status", ["unreconciled", "reconciled"])
    .update({ status: "superseded" });
  return updated > 0;
}

/** A loaded population of the engagement, locked to the end of the transaction; undefined when none such. */
export async function lockLoadedPopulationById(
  trx: Knex.Transaction,
  { engagementId, populationId }: { engagementId: number; populationId: number },
) {
  return trx("populations")
    .where({ id: populationId, engagement_id: engagementId })
    .whereNot("status", "loading")
    .forUpdate()
    .first("name", "row_count", "total", "source_file_name", "source_sha256", "archived_at");
}

/** How many populations were loaded as corrected files of this one. */
export async function countReplacementsByPopulationId(
  trx: Knex.Transaction,
  { populationId }: { populationId: number },
): Promise<number> {
  const row = await trx("populations").where({ supersedes_id: populationId }).count({ n: "*" }).first();
  return Number(row?.n ?? 0);
}

export async function deletePopulationById(trx: Knex.Transaction, { populationId }: { populationId: number }) {
  await trx("populations").where({ id: populationId }).delete();
}
