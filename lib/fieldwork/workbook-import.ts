import "server-only";
import { createHash } from "node:crypto";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { getCurrentDraw, getSampleById } from "@/lib/data/samples";
import { listItemsByDrawId, lockItemsByDrawId, saveItemResult, type SampleItemRecord } from "@/lib/data/sample-items";
import { conflict } from "@/lib/errors";
import { assertSampleUnlocked } from "@/lib/samples/guard";
import { resultOfItem } from "./workbook-export";
import { workbookKindFor } from "./workbook-layout";
import { WorkbookProblemsError } from "./workbook-problems";
import { readItemsSheet } from "./workbook-read";
import { planWorkbookImport, type ItemFacts } from "./workbook-rows";

/** Largest fieldwork workbook accepted for import. */
export const MAX_WORKBOOK_BYTES = 20 * 1024 * 1024;

const factsOf = (i: SampleItemRecord): ItemFacts => ({
  id: i.id,
  itemRef: i.itemRef,
  bookValue: i.bookValue,
  status: i.status,
  version: i.version,
  updatedByName: i.updatedByName,
  updatedAt: i.updatedAt,
  result: resultOfItem(i),
});

export interface WorkbookImportResult {
  rows: number;
  changed: number;
  unchanged: number;
  items: SampleItemRecord[];
}

/**
 * Imports a filled fieldwork workbook: every row is checked against the items as they are now
 * (locked for the transaction), and either every change is saved — each with its own audit row
 * and version + 1, exactly as a result saved on screen — or nothing is and the problems are listed.
 */
export async function importFieldworkWorkbook(
  db: Knex,
  a: { engagementId: number; sampleId: number; actorId: number; bytes: Buffer },
): Promise<WorkbookImportResult> {
  const sample = await getSampleById(db, { engagementId: a.engagementId, sampleId: a.sampleId });
  const draw = await getCurrentDraw(db, { sampleId: sample.id });
  if (!draw) throw conflict("The sample has not been drawn yet; there is nothing to import into.");
  const kind = workbookKindFor(sample.method);
  const sheet = await readItemsSheet(a.bytes, kind);
  if (sheet.rows.length === 0)
    throw new WorkbookProblemsError([
      { row: null, column: null, reason: "The Items sheet has no rows below its header." },
    ]);
  return db.transaction(async (trx) => {
    await assertSampleUnlocked(trx, sample.id); // each saved row then clears any sign-off, as on screen
    await lockItemsByDrawId(trx, { drawId: draw.id });
    const items = (await listItemsByDrawId(trx, { drawId: draw.id })).items;
    const plan = planWorkbookImport(kind, sheet, items.map(factsOf));
    if (plan.problems.length) throw new WorkbookProblemsError(plan.problems);
    const saved: SampleItemRecord[] = [];
    for (const change of plan.changes) {
      const { item } = await saveItemResult(trx, {
        engagementId: a.engagementId,
        sampleId: sample.id,
        drawId: draw.id,
        itemId: change.itemId,
        actorId: a.actorId,
        input: change.input,
      });
      saved.push(item);
    }
    await recordAudit(trx, {
      actorUserId: a.actorId,
      engagementId: a.engagementId,
      sampleId: sample.id,
      entity: "sample",
      entityId: sample.id,
      action: "import-workbook",
      after: {
        sha256: createHash("sha256").update(a.bytes).digest("hex"),
        sizeBytes: a.bytes.length,
        rows: sheet.rows.length,
        changed: plan.changes.length,
        unchanged: plan.unchanged,
        drawVersion: draw.version,
      },
    });
    return { rows: sheet.rows.length, changed: plan.changes.length, unchanged: plan.unchanged, items: saved };
  });
}
