import "server-only";
import type { Knex } from "knex";
import { z } from "zod";
import { parseJsonColumn } from "./json-column";

export interface AuditEntry {
  actorUserId: number | null;
  engagementId?: number | null;
  /** Set for every change to a sample, its items, evidence or notes: the sample's audit trail. */
  sampleId?: number | null;
  entity: string;
  entityId: string | number;
  action: string;
  before?: unknown;
  after?: unknown;
}

/** Records one change in audit_log; call it with the transaction that makes the change. */
export async function recordAudit(trx: Knex | Knex.Transaction, entry: AuditEntry): Promise<void> {
  await trx("audit_log").insert({
    actor_user_id: entry.actorUserId,
    engagement_id: entry.engagementId ?? null,
    sample_id: entry.sampleId ?? null,
    entity: entry.entity,
    entity_id: String(entry.entityId),
    action: entry.action,
    before_json: entry.before === undefined ? null : JSON.stringify(entry.before),
    after_json: entry.after === undefined ? null : JSON.stringify(entry.after),
  });
}

/** The engagement's recorded changes to the given entities, oldest first (at most `limit`), before/after as stored text. */
export async function listAuditTextByEntities(
  db: Knex,
  { engagementId, entities, limit = 2000 }: { engagementId: number; entities: string[]; limit?: number },
) {
  return db("audit_log as a")
    .leftJoin("users as u", "u.id", "a.actor_user_id")
    .where("a.engagement_id", engagementId)
    .whereIn("a.entity", entities)
    .orderBy("a.id")
    .limit(limit)
    .select<
      {
        at: Date;
        name: string | null;
        entity: string;
        entity_id: string;
        action: string;
        before_json: string | null;
        after_json: string | null;
      }[]
    >("a.at", "u.name", "a.entity", "a.entity_id", "a.action", "a.before_json", "a.after_json");
}

export interface AuditRow {
  id: number;
  at: string;
  actorName: string | null;
  entity: string;
  entityId: string;
  action: string;
  before: AuditValues;
  after: AuditValues;
}

/** What recordAudit stores as before/after: an object of JSON values, or null (a side that did not exist). */
const AuditValuesSchema = z.record(z.string(), z.json()).nullable();
export type AuditValues = z.output<typeof AuditValuesSchema>;

const auditValues = (value: string | null, column: "before_json" | "after_json") =>
  value === null ? null : parseJsonColumn(AuditValuesSchema, value, `audit_log.${column}`);

export async function listAuditByEngagementId(
  db: Knex,
  { engagementId, limit = 200 }: { engagementId: number; limit?: number },
): Promise<AuditRow[]> {
  const rows = await db("audit_log as a")
    .leftJoin("users as u", "u.id", "a.actor_user_id")
    .where("a.engagement_id", engagementId)
    .orderBy("a.id", "desc")
    .limit(limit)
    .select(
      "a.id",
      "a.at",
      "u.name as actorName",
      "a.entity",
      "a.entity_id as entityId",
      "a.action",
      "a.before_json",
      "a.after_json",
    );
  return rows.map((r) => ({
    id: Number(r.id),
    at: new Date(r.at).toISOString(),
    actorName: r.actorName,
    entity: r.entity,
    entityId: r.entityId,
    action: r.action,
    before: auditValues(r.before_json, "before_json"),
    after: auditValues(r.after_json, "after_json"),
  }));
}

export interface SampleAuditRow extends AuditRow {
  actorId: number | null;
}

/**
 * Every recorded change to a sample, newest first (at most `limit`): by one person when
 * `actorUserId` is given, and of the given entities or actions when either is given.
 */
export async function listAuditBySampleId(
  db: Knex | Knex.Transaction,
  {
    sampleId,
    actorUserId,
    entities,
    actions,
    limit = 2000,
  }: { sampleId: number; actorUserId?: number; entities?: string[]; actions?: string[]; limit?: number },
): Promise<SampleAuditRow[]> {
  const q = db("audit_log as a")
    .leftJoin("users as u", "u.id", "a.actor_user_id")
    .where("a.sample_id", sampleId)
    .orderBy("a.id", "desc")
    .limit(limit)
    .select(
      "a.id",
      "a.at",
      "a.actor_user_id",
      "u.name",
      "a.entity",
      "a.entity_id",
      "a.action",
      "a.before_json",
      "a.after_json",
    );
  if (actorUserId) q.andWhere("a.actor_user_id", actorUserId);
  if (entities || actions)
    q.andWhere((w) => {
      if (entities) w.orWhereIn("a.entity", entities);
      if (actions) w.orWhereIn("a.action", actions);
    });
  return (await q).map((r) => ({
    id: Number(r.id),
    at: new Date(r.at).toISOString(),
    actorId: r.actor_user_id,
    actorName: r.name ?? null,
    entity: r.entity,
    entityId: r.entity_id,
    action: r.action,
    before: auditValues(r.before_json, "before_json"),
    after: auditValues(r.after_json, "after_json"),
  }));
}
