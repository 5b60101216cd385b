import "server-only";
import type { Knex } from "knex";
import type { SummaryTrailEntry } from "./types";

export const SUMMARY_ENTITIES = [
  "misstatement_summary",
  "misstatement_entry",
  "misstatement_evidence",
  "misstatement_correction",
  "misstatement_note",
];

const text = (v: unknown) => (v === null || v === undefined ? null : typeof v === "string" ? v : JSON.stringify(v));

/** Every recorded change to the summary (who, when, what, before → after), oldest first. */
export async function listSummaryTrail(
  db: Knex,
  { engagementId }: { engagementId: number },
): Promise<SummaryTrailEntry[]> {
  const rows = await db("audit_log as a")
    .leftJoin("users as u", "u.id", "a.actor_user_id")
    .where("a.engagement_id", engagementId)
    .whereIn("a.entity", SUMMARY_ENTITIES)
    .orderBy("a.id")
    .limit(2000)
    .select("a.at", "u.name", "a.entity", "a.entity_id", "a.action", "a.before_json", "a.after_json");
  return rows.map((r) => ({
    at: new Date(r.at).toISOString(),
    who: r.name ?? "system",
    action: r.action,
    subject: `${String(r.entity).replace("misstatement_", "")} ${r.entity_id}`,
    before: text(r.before_json),
    after: text(r.after_json),
  }));
}
