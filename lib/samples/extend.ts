import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { getCurrentDraw, type SampleRecord } from "@/lib/data/samples";
import { updateDrawInputsById } from "@/lib/data/sample-draws";
import {
  getMaxSelectionOrderByDrawId,
  getSampleItemRowById,
  listItemStatesByDrawId,
  listRowNumbersByDrawId,
  updateSampleItemById,
} from "@/lib/data/sample-items";
import { conflict, notFound } from "@/lib/errors";
import { loadFrame } from "./population-frame";
import { computeSelection, type SelectionInputs } from "./select";
import { insertSelectedItems } from "./draw";
import { beginSampleWrite } from "./guard";
import { countOf, formatCount } from "@/lib/format/number";

const NOT_EXTENDABLE =
  "Monetary-unit and systematic selections are not extended or replaced item by item in Sondage: plan a further sample, or record the item as could not be audited (treated as fully misstated).";

export const UNPLANNED_ATTRIBUTE_EXTENSION =
  "An attribute sample of fixed size is not extended once results exist: extending after a deviation and then evaluating the total as one fixed sample is unplanned sequential sampling, whose real risk of overreliance exceeds the planned one (59 items at 5% tolerable, one deviation, extended to 93: about 7.5%, not 5%). Evaluate the sample as planned, or plan a two-stage attribute sample.";

/** Whether an attribute sample may grow now: a fixed plan only before any result; a two-stage plan only into its stage 2 after exactly one stage-1 deviation. */
async function assertAttributeExtension(db: Knex, sample: SampleRecord, drawId: number, additional: number) {
  const items = await listItemStatesByDrawId(db, { drawId });
  const twoStage = sample.plan.twoStage;
  if (!twoStage) {
    if (items.some((i) => i.status !== "not-started")) throw conflict(UNPLANNED_ATTRIBUTE_EXTENSION);
    return;
  }
  if (items.some((i) => i.origin === "extension"))
    throw conflict("Stage 2 of this two-stage plan has been drawn already; the plan has no further stage.");
  if (items.some((i) => i.status === "not-started"))
    throw conflict(
      "Finish stage 1 first: stage 2 is drawn only when every stage-1 item has a result and exactly one deviates.",
    );
  const deviations = items.filter((i) => Boolean(i.deviation) || i.status === "not-auditable").length;
  if (deviations !== 1)
    throw conflict(
      `Stage 1 found ${countOf(deviations, "deviation")}: the plan ${deviations === 0 ? "accepts" : "rejects"} at stage 1, with no stage 2.`,
    );
  if (additional !== twoStage.secondStageSize)
    throw conflict(
      `Stage 2 of this plan is exactly ${countOf(twoStage.secondStageSize, "item")} (asked: ${formatCount(additional)}).`,
    );
}

/** Adds items to a drawn random or attribute sample by continuing down the same random-number ranking. */
export async function extendSample(
  db: Knex,
  {
    sample,
    actorId,
    additional,
    reason,
  }: { sample: SampleRecord; actorId: number; additional: number; reason: string },
) {
  if (sample.method !== "random" && sample.method !== "attribute") throw conflict(NOT_EXTENDABLE);
  const draw = await getCurrentDraw(db, { sampleId: sample.id });
  if (!draw) throw conflict("Draw the sample before extending it.");
  if (sample.method === "attribute") await assertAttributeExtension(db, sample, draw.id, additional);
  const frame = await loadFrame(db, { populationId: sample.populationId });
  const from = draw.inputs.ranks!;
  if (from + additional > frame.bookValues.length)
    throw conflict(`Only ${countOf(frame.bookValues.length - from, "item is", "items are")} left to add.`);
  const inputs: SelectionInputs = { ...draw.inputs, ranks: from + additional };
  const added = computeSelection(frame, inputs, draw.seed)
    .filter((it) => !it.keyItem)
    .slice(from);
  await db.transaction(async (trx) => {
    await beginSampleWrite(trx, { sampleId: sample.id, actorId, what: "an extension" });
    if (sample.method === "attribute") await assertAttributeExtension(trx, sample, draw.id, additional); // again, under the sample lock
    await updateDrawInputsById(trx, { drawId: draw.id, inputs });
    await insertSelectedItems(trx, {
      sampleId: sample.id,
      drawId: draw.id,
      populationId: sample.populationId,
      frame,
      items: added,
      origin: "extension",
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample",
      entityId: sample.id,
      action: "extend",
      before: { ranks: from },
      after: { ranks: from + additional, reason, streamPosition: from },
    });
  });
  return { added: added.length, streamPosition: from };
}

/** Voids an unusable item (with the reason) and selects its replacement from the same random stream. */
export async function replaceItem(
  db: Knex,
  { sample, actorId, itemId, reason }: { sample: SampleRecord; actorId: number; itemId: number; reason: string },
) {
  if (sample.method !== "random" && sample.method !== "attribute" && sample.method !== "stratified")
    throw conflict(NOT_EXTENDABLE);
  const draw = await getCurrentDraw(db, { sampleId: sample.id });
  if (!draw) throw conflict("Draw the sample first.");
  const item = await getSampleItemRowById(db, { drawId: draw.id, itemId, sampleId: sample.id });
  if (!item) throw notFound("No such item in the current draw");
  if (item.status === "void") throw conflict("That item is already void.");
  if (item.status === "done") throw conflict("That item has a result; clear it before replacing the item.");
  const frame = await loadFrame(db, { populationId: sample.populationId });
  const inputs: SelectionInputs = { ...draw.inputs };
  if (sample.method === "stratified") {
    const h = Number(item.stratum) - 1;
    inputs.stratumRanks = draw.inputs.stratumRanks!.map((n, i) => (i === h ? n + 1 : n));
  } else inputs.ranks = draw.inputs.ranks! + 1;
  const before = new Set(await listRowNumbersByDrawId(db, { drawId: draw.id }));
  const replacement = computeSelection(frame, inputs, draw.seed).find(
    (it) => !before.has(frame.rowNumbers[it.position]),
  );
  if (!replacement) throw conflict("No item is left to replace it with.");
  const maxOrder = await getMaxSelectionOrderByDrawId(db, { drawId: draw.id });
  const order = sample.method === "stratified" ? maxOrder + 1 : replacement.order;
  await db.transaction(async (trx) => {
    await beginSampleWrite(trx, { sampleId: sample.id, actorId, what: "a replaced item" });
    await updateSampleItemById(trx, {
      itemId,
      patch: {
        status: "void",
        void_reason: reason,
        version: item.version + 1,
        updated_by: actorId,
        updated_at: trx.fn.now(3),
      },
    });
    await updateDrawInputsById(trx, { drawId: draw.id, inputs });
    await insertSelectedItems(trx, {
      sampleId: sample.id,
      drawId: draw.id,
      populationId: sample.populationId,
      frame,
      items: [{ ...replacement, order }],
      origin: "replacement",
      replacesItemId: itemId,
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample_item",
      entityId: itemId,
      action: "void-and-replace",
      before: { status: item.status },
      after: { status: "void", reason, replacementRow: frame.rowNumbers[replacement.position] },
    });
  });
  return { replacementRow: frame.rowNumbers[replacement.position] };
}
