import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { getCurrentDraw, type SampleRecord } from "@/lib/data/samples";
import { AppError, conflict, forbidden } from "@/lib/errors";
import type { EngagementRole } from "@/lib/auth/roles";
import { assertSampleUnlocked } from "@/lib/samples/guard";
import { getAuditorConclusionBySampleId } from "@/lib/data/auditor-conclusions";
import { evaluationFor } from "@/lib/samples/context";
import { conclusionGap } from "./auditor-conclusion";
import { countOpenNotesBySampleId } from "@/lib/data/review-notes";
import { countItemsByDrawId } from "@/lib/data/sample-items";
import {
  getSampleReviewColumnsById,
  setPreparerSignOffBySampleId,
  setReviewerSignOffBySampleId,
} from "@/lib/data/sample-review";

/** Preparer sign-off: a staff member or senior, once every item of the current draw has a result and the auditor's conclusion (and response, where called for) is recorded. */
export async function signOffAsPreparer(
  db: Knex,
  { sample, actorId, role }: { sample: SampleRecord; actorId: number; role: EngagementRole },
) {
  if (role !== "staff" && role !== "senior")
    throw forbidden("The preparer signs off as staff or senior; managers and partners sign off as reviewers.");
  const draw = await getCurrentDraw(db, { sampleId: sample.id });
  if (!draw) throw conflict("Draw the sample and record its results before signing off.");
  const open = await countItemsByDrawId(db, { drawId: draw.id, status: "not-started" });
  if (open > 0)
    throw new AppError(
      409,
      "incomplete",
      `${open} item${open === 1 ? " has" : "s have"} no result yet; every item needs a result before the preparer signs off.`,
    );
  const [evaluation, concluded] = await Promise.all([
    evaluationFor(db, { engagementId: sample.engagementId, sampleId: sample.id }),
    getAuditorConclusionBySampleId(db, { sampleId: sample.id }),
  ]);
  const gap = conclusionGap(evaluation, concluded);
  if (gap) throw new AppError(409, "no_conclusion", gap);
  await db.transaction(async (trx) => {
    await assertSampleUnlocked(trx, sample.id);
    await setPreparerSignOffBySampleId(trx, { sampleId: sample.id, actorId, role });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample",
      entityId: sample.id,
      action: "preparer-sign-off",
      after: { role },
    });
  });
}

/** Reviewer sign-off: a manager or partner, after the preparer, with no review note left open; it covers the auditor's conclusion and response. */
export async function signOffAsReviewer(
  db: Knex,
  { sample, actorId, role }: { sample: SampleRecord; actorId: number; role: EngagementRole },
) {
  await db.transaction(async (trx) => {
    await assertSampleUnlocked(trx, sample.id);
    const row = await getSampleReviewColumnsById(trx, { sampleId: sample.id });
    if (!row.preparer_signed_at) throw conflict("The preparer has not signed off yet.");
    if (!row.auditor_conclusion_at)
      throw new AppError(
        409,
        "no_conclusion",
        "No auditor's conclusion is recorded: the preparer records it before either sign-off.",
      );
    const open = await countOpenNotesBySampleId(trx, { sampleId: sample.id });
    if (open > 0)
      throw new AppError(
        409,
        "open_notes",
        `${open} review note${open === 1 ? " is" : "s are"} not cleared; clear them before signing off.`,
      );
    await setReviewerSignOffBySampleId(trx, { sampleId: sample.id, actorId, role });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample",
      entityId: sample.id,
      action: "reviewer-sign-off",
      after: { role },
    });
  });
}
