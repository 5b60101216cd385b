import "server-only";
import { createHash } from "node:crypto";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { updateSummaryByEngagementId } from "@/lib/data/misstatement-summaries";
import type { EngagementRole } from "@/lib/auth/roles";
import { AppError, conflict, forbidden } from "@/lib/errors";
import { putObjectBytes } from "@/lib/storage/objects";
import { assertSummaryUnlocked, lockSummaryRow, SUMMARY_LOCKED_MESSAGE } from "./guard";
import { summaryReviewerSignOffBlocker } from "./sign-off-blockers";
import { buildLiveSummary } from "./summary-view";
import type { SummaryView } from "./types";

/** Preparer sign-off (staff or senior): records the fingerprint of the rows signed, so a later change in a sample shows the sign-off as cleared. */
export async function signSummaryAsPreparer(
  db: Knex,
  { engagementId, actorId, role }: { engagementId: number; actorId: number; role: EngagementRole },
) {
  if (role !== "staff" && role !== "senior")
    throw forbidden("The preparer signs off as staff or senior; managers and partners sign off as reviewers.");
  const view = await buildLiveSummary(db, { engagementId });
  await db.transaction(async (trx) => {
    await assertSummaryUnlocked(trx, engagementId);
    await updateSummaryByEngagementId(trx, {
      engagementId,
      patch: {
        preparer_signed_by: actorId,
        preparer_signed_role: role,
        preparer_signed_at: trx.fn.now(3),
        signed_rows_sha256: view.rowsSha256,
        reviewer_signed_by: null,
        reviewer_signed_role: null,
        reviewer_signed_at: null,
      },
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "misstatement_summary",
      entityId: engagementId,
      action: "preparer-sign-off",
      after: { role, rowsSha256: view.rowsSha256 },
    });
  });
}

/** Reviewer sign-off (manager+): after the preparer, on the same rows, with every note cleared. */
export async function signSummaryAsReviewer(
  db: Knex,
  { engagementId, actorId, role }: { engagementId: number; actorId: number; role: EngagementRole },
) {
  const view = await buildLiveSummary(db, { engagementId });
  await db.transaction(async (trx) => {
    const row = await assertSummaryUnlocked(trx, engagementId);
    const blocker = summaryReviewerSignOffBlocker({
      preparerSigned: Boolean(row.preparer_signed_at),
      rowsChanged: row.signed_rows_sha256 !== view.rowsSha256,
      openNotes: view.review.openNotes,
    });
    if (blocker) throw new AppError(409, blocker.code, blocker.message);
    await updateSummaryByEngagementId(trx, {
      engagementId,
      patch: { reviewer_signed_by: actorId, reviewer_signed_role: role, reviewer_signed_at: trx.fn.now(3) },
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "misstatement_summary",
      entityId: engagementId,
      action: "reviewer-sign-off",
      after: { role, rowsSha256: view.rowsSha256 },
    });
  });
}

export type RenderSummaryPdf = (view: SummaryView) => Promise<Buffer>;

/**
 * Locks the summary (manager+) once every sample feeding it is locked, the reviewer has signed and
 * no note is open: the final PDF is rendered once and stored with its SHA-256, and the view itself
 * is stored, so the page, API and exports print exactly what was locked.
 */
export async function lockSummary(
  db: Knex,
  {
    engagementId,
    actor,
    role,
    render,
  }: { engagementId: number; actor: { id: number; name: string }; role: EngagementRole; render: RenderSummaryPdf },
) {
  const live = await buildLiveSummary(db, { engagementId });
  if (live.review.lock) throw new AppError(409, "locked", SUMMARY_LOCKED_MESSAGE);
  if (!live.review.lockable.ok) throw new AppError(409, "not_lockable", live.review.lockable.reasons.join(" "));
  const lockedAt = new Date();
  const reference = live.workpaperReference;
  const draft: SummaryView = {
    ...live,
    generatedAt: lockedAt.toISOString(),
    review: {
      ...live.review,
      lock: { name: actor.name, at: lockedAt.toISOString(), workpaperSha256: "", workpaperBytes: 0, reference },
      lockable: { ok: false, reasons: ["The summary is locked."] },
    },
  };
  const pdf = await render(draft);
  const sha256 = createHash("sha256").update(pdf).digest("hex");
  const key = `engagements/${engagementId}/misstatements/workpaper-${lockedAt.getTime()}-${sha256.slice(0, 12)}.pdf`;
  await putObjectBytes({ key, bytes: pdf, contentType: "application/pdf" });
  await db.transaction(async (trx) => {
    const row = await lockSummaryRow(trx, engagementId);
    if (row.locked_at) throw new AppError(409, "locked", SUMMARY_LOCKED_MESSAGE);
    if (!row.reviewer_signed_at || row.signed_rows_sha256 !== live.rowsSha256)
      throw conflict("The summary changed while the workpaper was being rendered; sign off again.");
    await updateSummaryByEngagementId(trx, {
      engagementId,
      patch: {
        locked_by: actor.id,
        locked_at: lockedAt,
        locked_view_json: JSON.stringify(draft),
        workpaper_object_key: key,
        workpaper_sha256: sha256,
        workpaper_size_bytes: pdf.length,
        workpaper_reference: reference,
      },
    });
    await recordAudit(trx, {
      actorUserId: actor.id,
      engagementId,
      entity: "misstatement_summary",
      entityId: engagementId,
      action: "lock",
      after: { role, workpaperSha256: sha256, bytes: pdf.length, reference },
    });
  });
  return { sha256, bytes: pdf.length, reference };
}

/** Partner only, with a reason: the summary is live again and the reviewer must sign off again. */
export async function unlockSummary(
  db: Knex,
  {
    engagementId,
    actorId,
    role,
    reason,
  }: { engagementId: number; actorId: number; role: EngagementRole; reason: string },
) {
  if (role !== "partner") throw forbidden("Only a partner can unlock the summary of misstatements.");
  await db.transaction(async (trx) => {
    const row = await lockSummaryRow(trx, engagementId);
    if (!row.locked_at) throw conflict("The summary is not locked.");
    await updateSummaryByEngagementId(trx, {
      engagementId,
      patch: {
        locked_by: null,
        locked_at: null,
        locked_view_json: null,
        workpaper_object_key: null,
        workpaper_sha256: null,
        workpaper_size_bytes: null,
        reviewer_signed_by: null,
        reviewer_signed_role: null,
        reviewer_signed_at: null,
      },
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "misstatement_summary",
      entityId: engagementId,
      action: "unlock",
      before: {
        lockedAt: row.locked_at,
        workpaperSha256: row.workpaper_sha256,
        workpaperObjectKey: row.workpaper_object_key,
      },
      after: { reason, reviewerSignOff: "cleared" },
    });
  });
}
