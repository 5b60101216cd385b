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
import { mustExist } from "@/lib/data/must-exist";

/** Preparer sign-off: a staff member or senior, once every item of the current draw has a result and the auditor's conclusion (and response, where called for) is recorded. */
export async function signOffAsPreparer(
  db: Knex,
  { sample, actorId, role }: { sample: SampleRecord; actorId: number; role: EngagementRole },
) {
  if (role !== "staff" && role !== "senior")
    throw forbidden("The preparer signs off as staff or senior; managers and partners sign off as reviewers.");
  const draw = await getCurrentDraw(db, { sampleId: sample.id });
  if (!draw) throw conflict("Draw the sample and record its results before signing off.");
  const open = await db("sample_items").where({ draw_id: draw.id, status: "not-started" }).count({ n: "*" }).first();
  if (Number(open?.n) > 0)
    throw new AppError(
      409,
      "incomplete",
      `${open?.n} item${Number(open?.n) === 1 ? " has" : "s have"} no result yet; every item needs a result before the preparer signs off.`,
    );
  const [evaluation, concluded] = await Promise.all([
    evaluationFor(db, { engagementId: sample.engagementId, sampleId: sample.id }),
    getAuditorConclusionBySampleId(db, { sampleId: sample.id }),
  ]);
  const gap = conclusionGap(evaluation, concluded);
  if (gap) throw new AppError(409, "no_conclusion", gap);
  await db.transaction(async (trx) => {
    await assertSampleUnlocked(trx, sample.id);
    await trx("samples")
      .where({ id: sample.id })
      .update({ preparer_signed_by: actorId, preparer_signed_role: role, preparer_signed_at: trx.fn.now(3) });
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
    const row = mustExist(
      await trx("samples").where({ id: sample.id }).first("preparer_signed_at", "auditor_conclusion_at"),
      `sample ${sample.id}`,
    );
    if (!row.preparer_signed_at) throw conflict("The preparer has not signed off yet.");
    if (!row.auditor_conclusion_at)
      throw new AppError(
        409,
        "no_conclusion",
        "No auditor's conclusion is recorded: the preparer records it before either sign-off.",
      );
    const open = await trx("review_notes")
      .where({ sample_id: sample.id })
      .whereNot("status", "cleared")
      .count({ n: "*" })
      .first();
    if (Number(open?.n) > 0)
      throw new AppError(
        409,
        "open_notes",
        `${open?.n} review note${Number(open?.n) === 1 ? " is" : "s are"} not cleared; clear them before signing off.`,
      );
    await trx("samples")
      .where({ id: sample.id })
      .update({ reviewer_signed_by: actorId, reviewer_signed_role: role, reviewer_signed_at: trx.fn.now(3) });
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
