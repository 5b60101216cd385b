import "server-only";
import type { Knex } from "knex";
import { listAuditTextByEntities } from "@/lib/data/audit-log";
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
  const rows = await listAuditTextByEntities(db, { engagementId, entities: SUMMARY_ENTITIES });
  return rows.map((r) => ({
    at: new Date(r.at).toISOString(),
    who: r.name ?? "system",
    action: r.action,
    subject: `${r.entity.replace("misstatement_", "")} ${r.entity_id}`,
    before: text(r.before_json),
    after: text(r.after_json),
  }));
}
