import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { getCurrentDraw, type SampleRecord } from "@/lib/data/samples";
import {
  countPickedItemsByDrawId,
  deleteSampleItemById,
  getMaxSelectionOrderByDrawId,
  getSampleItemByRowNumber,
  getSampleItemRowById,
  hasSampleItemById,
  isSampleItemReferencedById,
} from "@/lib/data/sample-items";
import { AppError, conflict, notFound } from "@/lib/errors";
import { insertSelectedItems, isHaphazard } from "./draw";
import { beginSampleWrite } from "./guard";
import { loadFrame } from "./population-frame";
import { mustExist } from "@/lib/data/must-exist";
import { formatCount } from "@/lib/format/number";

async function haphazardDraw(db: Knex, sample: SampleRecord) {
  if (sample.method !== "nonstatistical")
    throw conflict("Only nonstatistical samples with haphazard selection take picked items.");
  const draw = await getCurrentDraw(db, { sampleId: sample.id });
  if (!draw) throw conflict("Draw the sample first: the draw sets the key items, then you pick the rest.");
  if (!isHaphazard(draw.inputs)) throw conflict("This sample's items are selected by a seed, not picked.");
  return draw;
}

/**
 * Adds an item the auditor picked haphazardly on the population grid (ISA 530, Appendix 4(d)): recorded
 * with who and when, up to the planned size; key items and items already picked are refused.
 */
export async function addHaphazardPick(
  db: Knex,
  { sample, actorId, rowNumber }: { sample: SampleRecord; actorId: number; rowNumber: number },
) {
  const draw = await haphazardDraw(db, sample);
  const frame = await loadFrame(db, { populationId: sample.populationId });
  const position = frame.rowNumbers.indexOf(rowNumber);
  if (position < 0)
    throw new AppError(400, "invalid_input", `rowNumber: no item on row ${rowNumber} of this population`, {
      rowNumber: [`No item on row ${rowNumber}`],
    });
  return db.transaction(async (trx) => {
    await beginSampleWrite(trx, { sampleId: sample.id, actorId, what: "a haphazard pick" });
    const existing = await getSampleItemByRowNumber(trx, { drawId: draw.id, rowNumber });
    if (existing)
      throw conflict(
        existing.key_item ? "That item is a key item: it is examined in full already." : "That item is already picked.",
      );
    const picked = await countPickedItemsByDrawId(trx, { drawId: draw.id });
    if (picked >= sample.plan.chosenSize)
      throw conflict(
        `${sample.plan.chosenSize === 1 ? "The plan's 1 item is picked." : `The plan's ${formatCount(sample.plan.chosenSize)} items are all picked.`} Change the plan before drawing to pick more, or remove a pick without a result.`,
      );
    const maxOrder = await getMaxSelectionOrderByDrawId(trx, { drawId: draw.id });
    await insertSelectedItems(trx, {
      sampleId: sample.id,
      drawId: draw.id,
      populationId: sample.populationId,
      frame,
      items: [{ position, order: maxOrder + 1, hitPoints: null, topStratum: false, stratum: null }],
      origin: "haphazard",
      pickedBy: actorId,
    });
    const row = mustExist(
      await getSampleItemByRowNumber(trx, { drawId: draw.id, rowNumber }),
      `picked row ${rowNumber}`,
    );
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample_item",
      entityId: row.id,
      action: "haphazard-pick",
      after: {
        rowNumber,
        itemRef: frame.itemRefs[position],
        bookValue: frame.bookValues[position].toFixed(2),
        order: maxOrder + 1,
      },
    });
    return { itemId: Number(row.id), picked: picked + 1, planned: sample.plan.chosenSize };
  });
}

/** Takes back a haphazard pick that has no result yet (the removal stays in the audit trail). */
export async function removeHaphazardPick(
  db: Knex,
  { sample, actorId, itemId }: { sample: SampleRecord; actorId: number; itemId: number },
) {
  if (!(await hasSampleItemById(db, { sampleId: sample.id, itemId }))) throw notFound("No such item in this sample");
  const draw = await haphazardDraw(db, sample);
  await db.transaction(async (trx) => {
    await beginSampleWrite(trx, { sampleId: sample.id, actorId, what: "a removed pick" });
    const item = await getSampleItemRowById(trx, { drawId: draw.id, itemId, lock: true });
    if (!item) throw notFound("No such item in this sample");
    if (item.origin !== "haphazard") throw conflict("Only haphazard picks can be removed.");
    if (item.status !== "not-started") throw conflict("The item has a result: clear it before removing the pick.");
    if (await isSampleItemReferencedById(trx, { itemId }))
      throw conflict("The item has evidence or a client request: it stays in the sample.");
    await deleteSampleItemById(trx, { itemId });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample_item",
      entityId: itemId,
      action: "haphazard-unpick",
      before: { rowNumber: item.population_row_number, itemRef: item.item_ref },
    });
  });
}
