import "server-only";
import type { Knex } from "knex";
import { ImportError, MAX_DATA_ROWS, inspectUpload, type UploadInspection } from "@/lib/imports";
import { countDataRowsWithinLimit } from "@/lib/imports/count-data-rows";
import { hasWorkbookPart, readWorkbookInfo } from "@/lib/imports/xlsx-sheets";
import {
  assertNoLoadRunning,
  createUpload,
  failDeadLoads,
  getUploadById,
  updateUploadInspection,
} from "@/lib/data/population-uploads";
import {
  fetchUploadToTempFile,
  receiveToTempFile,
  removeTempFile,
  removeUploadObject,
  storeUploadObject,
  uploadObjectKey,
} from "./upload-files";
import { randomUUID } from "node:crypto";
import type { UploadRecord } from "@/lib/data/population-uploads";

export interface UploadView {
  id: number;
  fileName: string;
  sizeBytes: number;
  sha256: string;
  inspection: UploadInspection;
  failureMessage?: string | null;
}

/**
 * Receives a ledger file to a private temporary file, inspects its head, stores the bytes in object
 * storage (so another app server can load them) and records the upload; the temporary file goes.
 */
export async function receiveUpload(
  db: Knex,
  a: {
    engagementId: number;
    actorId: number;
    fileName: string;
    body: ReadableStream<Uint8Array> | null;
    declaredLength: number | null;
  },
): Promise<UploadView> {
  await assertNoLoadRunning(db, { userId: a.actorId });
  const file = await receiveToTempFile(a.body, a.declaredLength);
  let inspection: UploadInspection;
  const objectKey = uploadObjectKey(a.engagementId, `${randomUUID()}.${file.sha256.slice(0, 12)}`);
  try {
    const inspected = await inspectFirstUsableSheet(file.tempPath);
    // The bytes go to object storage while the rows are counted; a file the count refuses is removed again.
    const [counted, stored] = await Promise.allSettled([
      withRowCount(file.tempPath, inspected),
      storeUploadObject({ key: objectKey, tempPath: file.tempPath, size: file.size }),
    ]);
    if (counted.status === "rejected") {
      if (stored.status === "fulfilled") await removeUploadObject(objectKey).catch(() => undefined);
      throw counted.reason;
    }
    if (stored.status === "rejected") throw stored.reason;
    inspection = counted.value;
  } finally {
    await removeTempFile(file.tempPath);
  }
  const id = await createUpload(db, {
    engagementId: a.engagementId,
    actorId: a.actorId,
    fileName: a.fileName,
    sizeBytes: file.size,
    sha256: file.sha256,
    tempPath: file.tempPath,
    objectKey,
    inspection,
  });
  return { id, fileName: a.fileName, sizeBytes: file.size, sha256: file.sha256, inspection };
}

/** The inspection with its data rows counted; a file over the row limit is refused here (413), before anything is stored. */
async function withRowCount(path: string, inspection: UploadInspection): Promise<UploadInspection> {
  return { ...inspection, dataRows: await countDataRowsWithinLimit(path, inspection, MAX_DATA_ROWS) };
}

/**
 * Inspects the file; for a workbook whose first sheet is not a ledger (a cover or notes sheet),
 * the first sheet that is one, so the auditor can still pick the sheet on the mapping screen.
 */
async function inspectFirstUsableSheet(path: string): Promise<UploadInspection> {
  try {
    return await inspectUpload(path);
  } catch (err) {
    if (!(err instanceof ImportError) || !(await hasWorkbookPart(path))) throw err;
    const { sheets } = await readWorkbookInfo(path);
    for (const sheet of sheets.slice(1)) {
      try {
        return await inspectUpload(path, { sheet });
      } catch (next) {
        if (!(next instanceof ImportError)) throw next;
      }
    }
    throw err;
  }
}

/** Inspects another sheet of an uploaded workbook (the mapping must be made on the sheet that loads). */
export async function reinspectUpload(
  db: Knex,
  { engagementId, uploadId, sheet }: { engagementId: number; uploadId: number; sheet?: string },
): Promise<UploadView> {
  await failDeadLoads(db);
  const upload = await getUploadById(db, { engagementId, uploadId });
  let inspection = upload.inspection;
  if (sheet && sheet !== upload.inspection.sheet && (upload.status === "inspected" || upload.status === "failed")) {
    inspection = await withUploadFile(upload, async (path) => withRowCount(path, await inspectUpload(path, { sheet })));
    await updateUploadInspection(db, { uploadId, inspection });
  }
  return {
    id: upload.id,
    fileName: upload.fileName,
    sizeBytes: upload.sizeBytes,
    sha256: upload.sha256,
    inspection,
    failureMessage: upload.failureMessage,
  };
}

/** Runs `work` on a local copy of the upload's bytes, fetched from object storage, and removes the copy after. */
export async function withUploadFile<T>(
  upload: Pick<UploadRecord, "objectKey" | "sha256" | "tempPath">,
  work: (path: string) => Promise<T>,
): Promise<T> {
  if (!upload.objectKey) return work(upload.tempPath); // received before uploads went to object storage
  const path = await fetchUploadToTempFile({ objectKey: upload.objectKey, sha256: upload.sha256 });
  try {
    return await work(path);
  } finally {
    await removeTempFile(path);
  }
}
