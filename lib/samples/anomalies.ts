import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { getCurrentDraw, type SampleRecord } from "@/lib/data/samples";
import { getSampleItemRowById, updateSampleItemById } from "@/lib/data/sample-items";
import { conflict, notFound } from "@/lib/errors";
import { beginSampleWrite } from "./guard";
import { methodologyOfSample } from "./methodology";

async function itemOf(trx: Knex.Transaction, sample: SampleRecord, itemId: number) {
  const draw = await getCurrentDraw(trx, { sampleId: sample.id });
  const item = draw ? await getSampleItemRowById(trx, { drawId: draw.id, itemId, lock: true }) : undefined;
  if (!item) throw notFound("No such item in this sample");
  return item;
}

/**
 * Marks an item's misstatement anomalous (ISA 530 ¶13, AU-C 530.13): only with a written justification
 * of the extremely rare circumstances, only where the firm's methodology allows anomalies, and it
 * counts only once a manager or partner accepts it.
 */
export async function markAnomaly(
  db: Knex,
  {
    sample,
    actorId,
    itemId,
    justification,
  }: { sample: SampleRecord; actorId: number; itemId: number; justification: string },
) {
  if (!methodologyOfSample(sample).anomaliesAllowed)
    throw conflict(
      "The firm's methodology does not allow anomalous misstatements on this plan (e.g. PCAOB engagements: AS 2315 has no anomaly provision).",
    );
  if (sample.method === "attribute")
    throw conflict("Anomalies apply to misstatements in tests of details, not to control deviations.");
  return db.transaction(async (trx) => {
    const item = await itemOf(trx, sample, itemId);
    if (item.key_item)
      throw conflict(
        "A key item is examined in full and taken at its actual misstatement already; it is not projected.",
      );
    const misstated =
      item.status === "not-auditable" ||
      (item.status === "done" && item.audited_value !== null && Number(item.audited_value) !== Number(item.book_value));
    if (!misstated) throw conflict("Only an item with a recorded misstatement can be marked anomalous.");
    await beginSampleWrite(trx, { sampleId: sample.id, actorId, what: "an anomaly mark" });
    await updateSampleItemById(trx, {
      itemId,
      patch: {
        anomaly_justification: justification,
        anomaly_marked_by: actorId,
        anomaly_marked_at: trx.fn.now(3),
        anomaly_accepted_by: null,
        anomaly_accepted_at: null,
        version: item.version + 1,
      },
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample_item",
      entityId: itemId,
      action: "anomaly-mark",
      before: item.anomaly_justification ? { justification: item.anomaly_justification } : undefined,
      after: { justification },
    });
  });
}

/** A manager or partner accepts the mark; the evaluation then excludes it from the projection and adds it at its actual amount. */
export async function acceptAnomaly(
  db: Knex,
  { sample, actorId, itemId }: { sample: SampleRecord; actorId: number; itemId: number },
) {
  if (!methodologyOfSample(sample).anomaliesAllowed)
    throw conflict("The firm's methodology does not allow anomalous misstatements on this plan.");
  return db.transaction(async (trx) => {
    const item = await itemOf(trx, sample, itemId);
    if (!item.anomaly_justification) throw conflict("The item is not marked anomalous.");
    if (item.anomaly_accepted_at) throw conflict("The anomaly is already accepted.");
    await beginSampleWrite(trx, { sampleId: sample.id, actorId, what: "an anomaly acceptance" });
    await updateSampleItemById(trx, {
      itemId,
      patch: { anomaly_accepted_by: actorId, anomaly_accepted_at: trx.fn.now(3), version: item.version + 1 },
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample_item",
      entityId: itemId,
      action: "anomaly-accept",
      after: { justification: item.anomaly_justification },
    });
  });
}

/** Withdraws a mark (and any acceptance). */
export async function clearAnomaly(
  db: Knex,
  { sample, actorId, itemId }: { sample: SampleRecord; actorId: number; itemId: number },
) {
  return db.transaction(async (trx) => {
    const item = await itemOf(trx, sample, itemId);
    if (!item.anomaly_justification) throw conflict("The item is not marked anomalous.");
    await beginSampleWrite(trx, { sampleId: sample.id, actorId, what: "an anomaly withdrawn" });
    await updateSampleItemById(trx, { itemId, patch: { ...ANOMALY_CLEARED, version: item.version + 1 } });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample_item",
      entityId: itemId,
      action: "anomaly-withdraw",
      before: { justification: item.anomaly_justification, accepted: Boolean(item.anomaly_accepted_at) },
    });
  });
}

export const ANOMALY_CLEARED = {
  anomaly_justification: null,
  anomaly_marked_by: null,
  anomaly_marked_at: null,
  anomaly_accepted_by: null,
  anomaly_accepted_at: null,
} as const;
