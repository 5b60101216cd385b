import "server-only";
import type { Knex } from "knex";
import { z } from "zod";
import { StoredAuditorResponseSchema, type AuditorResponse } from "@/lib/validation/conclusion";
import { parseJsonColumn } from "./json-column";

/** The auditor's conclusion and response on one sample, as written by the preparer. */
export interface AuditorConclusionRecord {
  sampleId: number;
  conclusion: string;
  responses: AuditorResponse[];
  writtenBy: { id: number; name: string; role: string };
  writtenAt: string;
}

/** One sample's response, for the engagement's summary of misstatements. */
export interface SampleResponseRecord extends AuditorConclusionRecord {
  sampleName: string;
  method: string;
  /** Set when a reviewer has signed off on the conclusion and response. */
  reviewerSignedAt: string | null;
}

const iso = (v: unknown) => new Date(v as string).toISOString();
/** samples.auditor_responses_json read back (null when no conclusion is recorded). */
export const parseAuditorResponses = (v: unknown, sampleId: number): AuditorResponse[] | null =>
  v === null || v === undefined
    ? null
    : parseJsonColumn(z.array(StoredAuditorResponseSchema), v, "samples.auditor_responses_json", sampleId);

function toRecord(r: Record<string, unknown>): AuditorConclusionRecord {
  return {
    sampleId: Number(r.id),
    conclusion: String(r.auditor_conclusion),
    responses: parseAuditorResponses(r.auditor_responses_json, Number(r.id)) ?? [],
    writtenBy: {
      id: Number(r.auditor_conclusion_by),
      name: String(r.writer_name),
      role: String(r.auditor_conclusion_role),
    },
    writtenAt: iso(r.auditor_conclusion_at),
  };
}

const base = (db: Knex) =>
  db("samples as s").leftJoin("users as w", "w.id", "s.auditor_conclusion_by").whereNotNull("s.auditor_conclusion_at");

export async function getAuditorConclusionBySampleId(
  db: Knex,
  { sampleId }: { sampleId: number },
): Promise<AuditorConclusionRecord | null> {
  const r = await base(db)
    .where("s.id", sampleId)
    .first(
      "s.id",
      "s.auditor_conclusion",
      "s.auditor_responses_json",
      "s.auditor_conclusion_by",
      "s.auditor_conclusion_role",
      "s.auditor_conclusion_at",
      "w.name as writer_name",
    );
  return r ? toRecord(r as Record<string, unknown>) : null;
}

/** Every sample of the engagement with a recorded conclusion, with its responses (amounts as decimal strings). */
export async function listResponsesByEngagementId(
  db: Knex,
  { engagementId }: { engagementId: number },
): Promise<SampleResponseRecord[]> {
  const rows = await base(db)
    .where("s.engagement_id", engagementId)
    .orderBy("s.id")
    .select<Record<string, unknown>[]>(
      "s.id",
      "s.name",
      "s.method",
      "s.reviewer_signed_at",
      "s.auditor_conclusion",
      "s.auditor_responses_json",
      "s.auditor_conclusion_by",
      "s.auditor_conclusion_role",
      "s.auditor_conclusion_at",
      "w.name as writer_name",
    );
  return rows.map((r) => ({
    ...toRecord(r),
    sampleName: String(r.name),
    method: String(r.method),
    reviewerSignedAt: r.reviewer_signed_at ? iso(r.reviewer_signed_at) : null,
  }));
}

/** Writes the conclusion (inside the caller's transaction, after beginSampleWrite). */
export async function saveAuditorConclusion(
  trx: Knex.Transaction,
  o: { sampleId: number; actorId: number; role: string; conclusion: string; responses: AuditorResponse[] },
) {
  await trx("samples")
    .where({ id: o.sampleId })
    .update({
      auditor_conclusion: o.conclusion,
      auditor_responses_json: JSON.stringify(o.responses),
      auditor_conclusion_by: o.actorId,
      auditor_conclusion_role: o.role,
      auditor_conclusion_at: trx.fn.now(3),
    });
}

export const CLEARED_CONCLUSION = {
  auditor_conclusion: null,
  auditor_responses_json: null,
  auditor_conclusion_by: null,
  auditor_conclusion_role: null,
  auditor_conclusion_at: null,
};
