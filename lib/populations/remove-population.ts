import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { AppError, conflict, notFound } from "@/lib/errors";
import {
  countReplacementsByPopulationId,
  deletePopulationById,
  lockLoadedPopulationById,
  updatePopulationById,
} from "@/lib/data/populations";
import { deleteItemsByPopulationId } from "@/lib/data/population-items";
import { listSampleNamesByPopulationId } from "@/lib/data/samples";

async function usesOf(trx: Knex.Transaction, populationId: number) {
  const [samples, replacements] = await Promise.all([
    listSampleNamesByPopulationId(trx, { populationId }),
    countReplacementsByPopulationId(trx, { populationId }),
  ]);
  return { samples, replaced: replacements > 0 };
}

async function lockPopulation(trx: Knex.Transaction, engagementId: number, populationId: number) {
  const row = await lockLoadedPopulationById(trx, { engagementId, populationId });
  if (!row) throw notFound("No such population");
  return row;
}

/**
 * Deletes a population nobody used (no sample planned on it, no corrected file replacing it): its
 * items go, the stored source file stays in storage, and the audit row keeps its name, size and
 * SHA-256. A population in use is refused (409) naming the samples: archive it instead.
 */
export async function deleteUnusedPopulation(
  db: Knex,
  { engagementId, populationId, actorId }: { engagementId: number; populationId: number; actorId: number },
) {
  await db.transaction(async (trx) => {
    const row = await lockPopulation(trx, engagementId, populationId);
    const uses = await usesOf(trx, populationId);
    if (uses.samples.length) {
      throw new AppError(
        409,
        "population_in_use",
        `"${row.name}" is used by ${uses.samples.length === 1 ? "the sample" : `${uses.samples.length} samples`} ${uses.samples.map((n) => `"${n}"`).join(", ")}, so it cannot be deleted: archive it instead.`,
      );
    }
    if (uses.replaced)
      throw conflict(`"${row.name}" was replaced by a corrected file and stays on record: archive it instead.`);
    await deleteItemsByPopulationId(trx, { populationId });
    await deletePopulationById(trx, { populationId });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "population",
      entityId: populationId,
      action: "delete",
      before: {
        name: row.name,
        rowCount: Number(row.row_count),
        total: String(row.total),
        sourceFileName: row.source_file_name,
        sourceSha256: row.source_sha256,
      },
    });
  });
}

/** Archives (or brings back) a population: kept whole, with its samples, but out of the lists and pickers. */
export async function setPopulationArchived(
  db: Knex,
  {
    engagementId,
    populationId,
    actorId,
    archived,
  }: { engagementId: number; populationId: number; actorId: number; archived: boolean },
) {
  await db.transaction(async (trx) => {
    const row = await lockPopulation(trx, engagementId, populationId);
    if (Boolean(row.archived_at) === archived) return;
    await updatePopulationById(trx, {
      populationId,
      patch: archived ? { archived_at: trx.fn.now(3), archived_by: actorId } : { archived_at: null, archived_by: null },
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "population",
      entityId: populationId,
      action: archived ? "archive" : "restore",
      before: { archived: !archived },
      after: { archived },
    });
  });
}
