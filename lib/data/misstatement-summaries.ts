import "server-only";
import type { Knex } from "knex";
import { mustExist } from "./must-exist";
import type { MisstatementSummariesRow } from "./tables";

type SummaryPatch = Knex.ResolveTableType<Knex.TableType<"misstatement_summaries">, "update">;

/** The engagement's summary row, created on first use, held FOR UPDATE for the rest of the transaction. */
export async function lockSummaryByEngagementId(
  trx: Knex.Transaction,
  { engagementId }: { engagementId: number },
): Promise<MisstatementSummariesRow> {
  await trx.raw("INSERT IGNORE INTO misstatement_summaries (engagement_id) VALUES (?)", [engagementId]);
  return mustExist(
    await trx("misstatement_summaries").where({ engagement_id: engagementId }).forUpdate().first(),
    `summary of engagement ${engagementId}`,
  );
}

/** Writes sign-offs, lock or settings of the summary (after lockSummaryByEngagementId in the same transaction). */
export async function updateSummaryByEngagementId(
  trx: Knex.Transaction,
  { engagementId, patch }: { engagementId: number; patch: SummaryPatch },
) {
  await trx("misstatement_summaries").where({ engagement_id: engagementId }).update(patch);
}

/** Both sign-offs and the fingerprint of the rows signed, cleared. */
export const SUMMARY_SIGN_OFFS_CLEARED = {
  preparer_signed_by: null,
  preparer_signed_role: null,
  preparer_signed_at: null,
  reviewer_signed_by: null,
  reviewer_signed_role: null,
  reviewer_signed_at: null,
  signed_rows_sha256: null,
} as const;

/** The clearly trivial threshold and the approaching share as stored (after the summary row exists). */
export async function getSummarySettingsByEngagementId(
  db: Knex | Knex.Transaction,
  { engagementId }: { engagementId: number },
) {
  return mustExist(
    await db("misstatement_summaries")
      .where({ engagement_id: engagementId })
      .first("clearly_trivial", "approaching_share"),
    `summary of engagement ${engagementId}`,
  );
}
