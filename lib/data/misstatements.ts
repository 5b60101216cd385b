import "server-only";
import type { Knex } from "knex";
import type { EntryInput, CorrectionInput } from "@/lib/misstatements/rows";
import { StoredContributionSchema, type SampleContribution } from "@/lib/misstatements/contribution";
import { LockedSummaryViewSchema, toSummaryView } from "@/lib/misstatements/stored-view";
import type { SummaryView } from "@/lib/misstatements/types";
import { parseJsonColumn } from "./json-column";
import { notFound } from "@/lib/errors";
import type { Entry } from "@/lib/validation/misstatements";
import type { MisstatementCorrectionsRow, MisstatementEntriesRow } from "./tables";

export interface SummarySettingsRecord {
  clearlyTrivial: string;
  approachingShare: number;
  preparer: { id: number; name: string; role: string; at: string } | null;
  reviewer: { id: number; name: string; role: string; at: string } | null;
  signedRowsSha256: string | null;
  lock: {
    name: string;
    at: string;
    workpaperSha256: string;
    workpaperBytes: number;
    reference: string;
    objectKey: string;
  } | null;
  lockedView: SummaryView | null;
}

export interface EntryRecord extends EntryInput {
  version: number;
  createdByName: string;
  createdAt: string;
  updatedAt: string | null;
}

const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null);
const ymd = (v: unknown) =>
  v instanceof Date
    ? `${v.getFullYear()}-${String(v.getMonth() + 1).padStart(2, "0")}-${String(v.getDate()).padStart(2, "0")}`
    : String(v).slice(0, 10);

/** The summary's settings, sign-offs and lock; defaults (nothing signed, 0 clearly trivial, 75 %) before its first write. */
export async function getSummaryByEngagementId(
  db: Knex,
  { engagementId }: { engagementId: number },
): Promise<SummarySettingsRecord> {
  const r = await db("misstatement_summaries as m")
    .leftJoin("users as p", "p.id", "m.preparer_signed_by")
    .leftJoin("users as v", "v.id", "m.reviewer_signed_by")
    .leftJoin("users as l", "l.id", "m.locked_by")
    .where("m.engagement_id", engagementId)
    .first("m.*", "p.name as p_name", "v.name as v_name", "l.name as l_name");
  if (!r)
    return {
      clearlyTrivial: "0.00",
      approachingShare: 0.75,
      preparer: null,
      reviewer: null,
      signedRowsSha256: null,
      lock: null,
      lockedView: null,
    };
  return {
    clearlyTrivial: String(r.clearly_trivial),
    approachingShare: Number(r.approaching_share),
    preparer: r.preparer_signed_at
      ? { id: r.preparer_signed_by, name: r.p_name, role: r.preparer_signed_role, at: iso(r.preparer_signed_at)! }
      : null,
    reviewer: r.reviewer_signed_at
      ? { id: r.reviewer_signed_by, name: r.v_name, role: r.reviewer_signed_role, at: iso(r.reviewer_signed_at)! }
      : null,
    signedRowsSha256: r.signed_rows_sha256 ?? null,
    lock: r.locked_at
      ? {
          name: r.l_name,
          at: iso(r.locked_at)!,
          workpaperSha256: r.workpaper_sha256,
          workpaperBytes: Number(r.workpaper_size_bytes),
          reference: r.workpaper_reference,
          objectKey: r.workpaper_object_key,
        }
      : null,
    lockedView: r.locked_view_json
      ? toSummaryView(
          parseJsonColumn(
            LockedSummaryViewSchema,
            r.locked_view_json,
            "misstatement_summaries.locked_view_json",
            r.engagement_id,
          ),
        )
      : null,
  };
}

function toEntry(r: Record<string, unknown>): EntryRecord {
  return {
    id: Number(r.id),
    kind: r.kind as EntryRecord["kind"],
    account: String(r.account),
    assertion: String(r.assertion),
    description: String(r.description),
    amount: String(r.amount),
    incomeEffect: String(r.income_effect),
    balanceEffect: String(r.balance_effect),
    corrected: r.corrected ? { on: ymd(r.corrected_on), reference: String(r.correction_reference ?? "") } : null,
    evidenceCount: Number(r.evidence_count ?? 0),
    version: Number(r.version),
    createdByName: String(r.created_by_name ?? ""),
    createdAt: iso(r.created_at)!,
    updatedAt: iso(r.updated_at),
  };
}

const entryQuery = (db: Knex) =>
  db("misstatement_entries as e")
    .join("users as u", "u.id", "e.created_by")
    .whereNull("e.deleted_at")
    .select(
      "e.*",
      "u.name as created_by_name",
      db.raw(
        "(select count(*) from misstatement_entry_evidence v where v.entry_id = e.id and v.deleted_at is null) as evidence_count",
      ),
    );

export async function listEntriesByEngagementId(
  db: Knex,
  { engagementId }: { engagementId: number },
): Promise<EntryRecord[]> {
  return (await entryQuery(db).where("e.engagement_id", engagementId).orderBy("e.id")).map(toEntry);
}

export async function getEntryById(
  db: Knex,
  { engagementId, entryId }: { engagementId: number; entryId: number },
): Promise<EntryRecord> {
  const row = await entryQuery(db).where({ "e.engagement_id": engagementId, "e.id": entryId }).first();
  if (!row) throw notFound("No such misstatement entry");
  return toEntry(row);
}

export async function listCorrectionsByEngagementId(
  db: Knex,
  { engagementId }: { engagementId: number },
): Promise<CorrectionInput[]> {
  const rows = await db("misstatement_corrections").where({ engagement_id: engagementId }).orderBy("id");
  return rows.map((r) => ({
    sampleId: Number(r.sample_id),
    part: r.part,
    on: ymd(r.corrected_on),
    reference: String(r.reference),
  }));
}

/** Samples of the engagement with their lock time and, when locked, the contribution frozen at lock. */
export async function listSampleLocksByEngagementId(db: Knex, { engagementId }: { engagementId: number }) {
  const rows = await db("samples as s")
    .leftJoin("misstatement_sample_snapshots as z", "z.sample_id", "s.id")
    .where("s.engagement_id", engagementId)
    .orderBy("s.id")
    .select("s.id", "s.locked_at", "z.contribution_json");
  return rows.map((r) => ({
    sampleId: Number(r.id),
    lockedAt: iso(r.locked_at),
    frozen: r.contribution_json
      ? parseJsonColumn(
          StoredContributionSchema,
          r.contribution_json,
          "misstatement_sample_snapshots.contribution_json",
          Number(r.id),
        )
      : null,
  }));
}

/** Stores what a sample contributes as it stands at its lock (inside the lock's transaction). */
export async function freezeSampleContribution(
  trx: Knex.Transaction,
  { engagementId, contribution }: { engagementId: number; contribution: SampleContribution },
) {
  await trx("misstatement_sample_snapshots").where({ sample_id: contribution.sampleId }).delete();
  await trx("misstatement_sample_snapshots").insert({
    sample_id: contribution.sampleId,
    engagement_id: engagementId,
    contribution_json: JSON.stringify(contribution),
  });
}

/** On unlock the sample's row is live again. */
export async function thawSampleContribution(trx: Knex.Transaction, { sampleId }: { sampleId: number }) {
  await trx("misstatement_sample_snapshots").where({ sample_id: sampleId }).delete();
}

const entryColumns = (e: Entry) => ({
  kind: e.kind,
  account: e.account,
  assertion: e.assertion,
  description: e.description,
  amount: e.amount,
  income_effect: e.incomeEffect,
  balance_effect: e.balanceEffect,
  corrected: e.corrected !== null,
  corrected_on: e.corrected?.on ?? null,
  correction_reference: e.corrected?.reference ?? null,
});

export async function insertEntry(
  trx: Knex.Transaction,
  { engagementId, input, actorId }: { engagementId: number; input: Entry; actorId: number },
): Promise<number> {
  const [id] = await trx("misstatement_entries").insert({
    engagement_id: engagementId,
    ...entryColumns(input),
    created_by: actorId,
  });
  return id;
}

/** The entry, not removed, locked to the end of the transaction; undefined when the engagement has none such. */
export async function lockLiveEntryById(
  trx: Knex.Transaction,
  { engagementId, entryId }: { engagementId: number; entryId: number },
): Promise<MisstatementEntriesRow | undefined> {
  return trx("misstatement_entries")
    .where({ id: entryId, engagement_id: engagementId })
    .whereNull("deleted_at")
    .forUpdate()
    .first();
}

/** Writes the entry's fields as version `version` (the caller checked the version it replaces). */
export async function updateEntryById(
  trx: Knex.Transaction,
  { entryId, input, version, actorId }: { entryId: number; input: Entry; version: number; actorId: number },
) {
  await trx("misstatement_entries")
    .where({ id: entryId })
    .update({ ...entryColumns(input), version, updated_by: actorId, updated_at: trx.fn.now(3) });
}

/** Soft removal: the row stays for the audit trail. */
export async function markEntryDeletedById(
  trx: Knex.Transaction,
  { entryId, actorId }: { entryId: number; actorId: number },
) {
  await trx("misstatement_entries")
    .where({ id: entryId })
    .update({ deleted_at: trx.fn.now(3), deleted_by: actorId });
}

/** The client's correction of one part of a sample's row, locked to the end of the transaction. */
export async function lockCorrectionBySampleId(
  trx: Knex.Transaction,
  { sampleId, part }: { sampleId: number; part: MisstatementCorrectionsRow["part"] },
): Promise<MisstatementCorrectionsRow | undefined> {
  return trx("misstatement_corrections").where({ sample_id: sampleId, part }).forUpdate().first();
}

/** Replaces the correction of one part of a sample's row (`corrected: null` removes it). */
export async function replaceCorrectionBySampleId(
  trx: Knex.Transaction,
  {
    engagementId,
    sampleId,
    part,
    corrected,
    actorId,
  }: {
    engagementId: number;
    sampleId: number;
    part: MisstatementCorrectionsRow["part"];
    corrected: { on: string; reference: string } | null;
    actorId: number;
  },
) {
  await trx("misstatement_corrections").where({ sample_id: sampleId, part }).delete();
  if (!corrected) return;
  await trx("misstatement_corrections").insert({
    engagement_id: engagementId,
    sample_id: sampleId,
    part,
    corrected_on: corrected.on,
    reference: corrected.reference,
    created_by: actorId,
  });
}
