import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import {
  getEntryById,
  insertEntry,
  lockCorrectionBySampleId,
  lockLiveEntryById,
  markEntryDeletedById,
  replaceCorrectionBySampleId,
  updateEntryById,
} from "@/lib/data/misstatements";
import { getSummarySettingsByEngagementId, updateSummaryByEngagementId } from "@/lib/data/misstatement-summaries";
import { hasSampleById } from "@/lib/data/samples";
import { AppError, fieldError, notFound } from "@/lib/errors";
import type { Entry } from "@/lib/validation/misstatements";
import type { z } from "zod";
import type { SampleCorrectionSchema, SummarySettingsSchema } from "@/lib/validation/misstatements";
import { beginSummaryWrite } from "./guard";

export async function createEntry(
  db: Knex,
  { engagementId, actorId, input }: { engagementId: number; actorId: number; input: Entry },
) {
  return db.transaction(async (trx) => {
    const signOffsCleared = await beginSummaryWrite(trx, { engagementId, actorId, what: "a misstatement entered" });
    const id = await insertEntry(trx, { engagementId, input, actorId });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "misstatement_entry",
      entityId: id,
      action: "create",
      after: input,
    });
    return { entry: await getEntryById(trx, { engagementId, entryId: id }), signOffsCleared };
  });
}

/** Optimistic: the caller sends the version it edited; a stale version answers 409 and changes nothing. */
export async function updateEntry(
  db: Knex,
  {
    engagementId,
    entryId,
    actorId,
    input,
  }: { engagementId: number; entryId: number; actorId: number; input: Entry & { version: number } },
) {
  return db.transaction(async (trx) => {
    const signOffsCleared = await beginSummaryWrite(trx, { engagementId, actorId, what: `entry ${entryId} changed` });
    const before = await lockLiveEntryById(trx, { engagementId, entryId });
    if (!before) throw notFound("No such misstatement entry");
    if (before.version !== input.version)
      throw new AppError(
        409,
        "stale",
        "Someone changed this entry after you opened it; reload it and apply your change again.",
      );
    const { version: _v, ...fields } = input;
    await updateEntryById(trx, { entryId, input: fields, version: before.version + 1, actorId });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "misstatement_entry",
      entityId: entryId,
      action: "update",
      before: {
        kind: before.kind,
        account: before.account,
        assertion: before.assertion,
        description: before.description,
        amount: before.amount,
        incomeEffect: before.income_effect,
        balanceEffect: before.balance_effect,
        corrected: Boolean(before.corrected),
        correctedOn: before.corrected_on,
        correctionReference: before.correction_reference,
      },
      after: fields,
    });
    return { entry: await getEntryById(trx, { engagementId, entryId }), signOffsCleared };
  });
}

/** Soft delete: the row stays for the audit trail. */
export async function deleteEntry(
  db: Knex,
  { engagementId, entryId, actorId }: { engagementId: number; entryId: number; actorId: number },
) {
  await db.transaction(async (trx) => {
    await beginSummaryWrite(trx, { engagementId, actorId, what: `entry ${entryId} removed` });
    const before = await lockLiveEntryById(trx, { engagementId, entryId });
    if (!before) throw notFound("No such misstatement entry");
    await markEntryDeletedById(trx, { entryId, actorId });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "misstatement_entry",
      entityId: entryId,
      action: "delete",
      before: { account: before.account, amount: before.amount, kind: before.kind },
      after: { deleted: true },
    });
  });
}

export async function saveSummarySettings(
  db: Knex,
  {
    engagementId,
    actorId,
    input,
  }: { engagementId: number; actorId: number; input: z.output<typeof SummarySettingsSchema> },
) {
  await db.transaction(async (trx) => {
    await beginSummaryWrite(trx, {
      engagementId,
      actorId,
      what: "the clearly trivial threshold or the approaching share",
    });
    const before = await getSummarySettingsByEngagementId(trx, { engagementId });
    await updateSummaryByEngagementId(trx, {
      engagementId,
      patch: {
        clearly_trivial: input.clearlyTrivial,
        approaching_share: input.approachingShare,
        updated_at: trx.fn.now(3),
      },
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "misstatement_summary",
      entityId: engagementId,
      action: "settings",
      before: { clearlyTrivial: String(before.clearly_trivial), approachingShare: Number(before.approaching_share) },
      after: input,
    });
  });
}

/** Marks (or unmarks, with `corrected: null`) one part of a sample's row as corrected by the client. */
export async function saveSampleCorrection(
  db: Knex,
  {
    engagementId,
    actorId,
    input,
  }: { engagementId: number; actorId: number; input: z.output<typeof SampleCorrectionSchema> },
) {
  await db.transaction(async (trx) => {
    if (!(await hasSampleById(trx, { engagementId, sampleId: input.sampleId })))
      throw fieldError("sampleId", "no such sample on this engagement");
    await beginSummaryWrite(trx, { engagementId, actorId, what: `correction of sample ${input.sampleId}` });
    const before = await lockCorrectionBySampleId(trx, { sampleId: input.sampleId, part: input.part });
    await replaceCorrectionBySampleId(trx, {
      engagementId,
      sampleId: input.sampleId,
      part: input.part,
      corrected: input.corrected,
      actorId,
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "misstatement_correction",
      entityId: `${input.sampleId}:${input.part}`,
      action: input.corrected ? "mark-corrected" : "unmark-corrected",
      before: before ? { on: before.corrected_on, reference: before.reference } : null,
      after: input.corrected,
    });
  });
}
