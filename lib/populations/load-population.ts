import "server-only";
import type { Knex } from "knex";
import { getBulkLoadDb } from "@/db/knex-bulk-load";
import { insertPopulation, supersedePopulationById, updatePopulationById } from "@/lib/data/populations";
import { listLoadWarnings, loadItemsByPopulationId } from "@/lib/data/population-items";
import { recordAudit } from "@/lib/data/audit-log";
import {
  completeLeasedLoad,
  finishUpload,
  LEASE_RENEW_MS,
  renewLoadLease,
  type UploadRecord,
} from "@/lib/data/population-uploads";
import { ImportError, PopulationImport, formatCents, type PopulationSummary } from "@/lib/imports";
import { putObjectFromFile } from "@/lib/storage/objects";
import { AppError, conflict } from "@/lib/errors";
import type { LoadPopulation } from "@/lib/validation/population";
import { withUploadFile } from "./receive-upload";

export type LoadProgress =
  | { phase: "checking"; rowsRead: number; bytesRead: number; totalBytes: number }
  | { phase: "storing-file" }
  | { phase: "committing" };

export type LoadOutcome =
  | { ok: true; populationId: number; rowCount: number; total: string }
  | { ok: false; problemCount: number; problems: PopulationSummary["problems"]; problemsTruncated: boolean };

class RejectedRows extends Error {
  constructor(readonly summary: PopulationSummary) {
    super("rows with problems");
  }
}

const CONTENT_TYPES = {
  csv: "text/csv",
  xlsx: "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet",
} as const;

/**
 * Parses, validates and loads an inspected upload in ONE transaction: the population row and
 * every item go in through LOAD DATA LOCAL fed by the validating stream, and the transaction
 * commits only when no row had a problem, the server raised no warning, the row count agrees and
 * the original file is safely in object storage. Anything else rolls back: nothing partial is ever
 * visible, and an abandoned load is rolled back by the server when the connection drops.
 * The caller has claimed the upload for this server (claimUploadForLoading, lease `holder`); the
 * lease is renewed while the load runs, and the upload turns loaded in the load's own commit.
 * The bytes come back from object storage, so the load may run on another server than the upload.
 */
export async function loadPopulation(
  db: Knex,
  args: {
    upload: UploadRecord;
    actorId: number;
    input: LoadPopulation;
    holder: string;
    onProgress: (p: LoadProgress) => void;
  },
): Promise<LoadOutcome> {
  const { upload, holder } = args;
  // A lost lease (another server took the upload over) is caught at commit by completeLeasedLoad.
  const renew = setInterval(
    () => void renewLoadLease(db, { uploadId: upload.id, holder }).catch(() => undefined),
    LEASE_RENEW_MS,
  );
  try {
    return await withUploadFile(upload, (path) => loadFromFile(db, { ...args, path }));
  } finally {
    clearInterval(renew);
  }
}

async function loadFromFile(
  db: Knex,
  args: {
    upload: UploadRecord;
    actorId: number;
    input: LoadPopulation;
    holder: string;
    path: string;
    onProgress: (p: LoadProgress) => void;
  },
): Promise<LoadOutcome> {
  const { upload, actorId, input, onProgress, holder, path } = args;
  const run = new PopulationImport(path, upload.inspection, input.mapping, {
    onProgress: (rowsRead, bytesRead, totalBytes) => onProgress({ phase: "checking", rowsRead, bytesRead, totalBytes }),
  });
  try {
    const populationId = await getBulkLoadDb().transaction((trx) =>
      loadInTransaction(trx, { upload, actorId, input, run, path, holder, onProgress }),
    );
    const t = run.summary().totals;
    return { ok: true, populationId, rowCount: t.rowCount, total: formatCents(t.totalCents) };
  } catch (err) {
    if (err instanceof RejectedRows) {
      const s = err.summary;
      await finishUpload(db, {
        uploadId: upload.id,
        holder,
        status: "rejected",
        problems: s.problems,
        problemCount: s.problemCount,
      });
      return { ok: false, problemCount: s.problemCount, problems: s.problems, problemsTruncated: s.problemsTruncated };
    }
    // The load's own error is what the person is told; an upload that could not be marked is released by its lease.
    await finishUpload(db, { uploadId: upload.id, holder, status: "rejected" }).catch((e: unknown) =>
      console.error(
        `[sondage] upload ${upload.id}: not marked failed after its load failed (${e instanceof Error ? e.message : String(e)}); its lease releases it`,
      ),
    );
    throw err;
  }
}

async function loadInTransaction(
  trx: Knex.Transaction,
  a: {
    upload: UploadRecord;
    actorId: number;
    input: LoadPopulation;
    run: PopulationImport;
    path: string;
    holder: string;
    onProgress: (p: LoadProgress) => void;
  },
) {
  const { upload, actorId, input, run } = a;
  const objectKey = `engagements/${upload.engagementId}/populations/${upload.sha256}-${upload.id}.${upload.inspection.kind}`;
  const populationId = await insertPopulation(trx, {
    engagementId: upload.engagementId,
    uploadId: upload.id,
    name: input.name,
    sourceFileName: upload.fileName,
    sourceSizeBytes: upload.sizeBytes,
    sourceSha256: upload.sha256,
    sourceObjectKey: objectKey,
    mapping: input.mapping,
    createdBy: actorId,
    supersedesId: input.supersedesId ?? null,
  });

  const stream: { error?: Error } = {}; // the stream's own error says what was wrong with the file
  const openStream = () => {
    const s = run.toLoadDataStream();
    s.on("error", (e) => (stream.error = e));
    return s;
  };
  let loaded: { affectedRows: number; warningStatus: number };
  try {
    loaded = await loadItemsByPopulationId(trx, { populationId, openStream });
  } catch (err) {
    if (stream.error) throw stream.error;
    throw err;
  }
  if (stream.error) throw stream.error;
  const summary = run.summary();
  if (summary.problemCount > 0) throw new RejectedRows(summary);
  if (loaded.warningStatus > 0) {
    console.error("[sondage] LOAD DATA warnings", await listLoadWarnings(trx));
    throw new AppError(
      422,
      "load_warnings",
      "The database reported problems storing some rows; nothing was stored. The error has been logged.",
    );
  }
  const t = summary.totals;
  if (loaded.affectedRows !== t.rowCount)
    throw new AppError(
      500,
      "load_mismatch",
      `Loaded ${loaded.affectedRows} rows but validated ${t.rowCount}; nothing was stored.`,
    );

  await updatePopulationById(trx, {
    populationId,
    patch: {
      row_count: t.rowCount,
      total: formatCents(t.totalCents),
      positive_count: t.positive.count,
      positive_total: formatCents(t.positive.totalCents),
      zero_count: t.zero.count,
      negative_count: t.negative.count,
      negative_total: formatCents(t.negative.totalCents),
      status: "unreconciled",
    },
  });
  if (input.supersedesId)
    await supersede(trx, {
      engagementId: upload.engagementId,
      oldId: input.supersedesId,
      newId: populationId,
      actorId,
    });
  await recordAudit(trx, {
    actorUserId: actorId,
    engagementId: upload.engagementId,
    entity: "population",
    entityId: populationId,
    action: "load",
    after: {
      name: input.name,
      fileName: upload.fileName,
      sha256: upload.sha256,
      rowCount: t.rowCount,
      total: formatCents(t.totalCents),
      mapping: input.mapping,
    },
  });
  a.onProgress({ phase: "storing-file" });
  await putObjectFromFile({
    key: objectKey,
    path: a.path,
    contentType: CONTENT_TYPES[upload.inspection.kind],
    size: upload.sizeBytes,
  });
  await completeLeasedLoad(trx, { uploadId: upload.id, holder: a.holder });
  a.onProgress({ phase: "committing" });
  return populationId;
}

async function supersede(
  trx: Knex.Transaction,
  { engagementId, oldId, newId, actorId }: { engagementId: number; oldId: number; newId: number; actorId: number },
) {
  if (!(await supersedePopulationById(trx, { engagementId, populationId: oldId })))
    throw conflict("The population to replace does not exist on this engagement or is already superseded.");
  await recordAudit(trx, {
    actorUserId: actorId,
    engagementId,
    entity: "population",
    entityId: oldId,
    action: "supersede",
    after: { supersededBy: newId },
  });
}

export { ImportError };
