import "server-only";
import type { Knex } from "knex";
import type { EngagementRole } from "@/lib/auth/roles";
import type { CreateEngagement, UpdateEngagement } from "@/lib/validation/engagement";
import { recordAudit } from "./audit-log";
import { notFound } from "@/lib/errors";

export interface EngagementRecord {
  id: number;
  firmId: number;
  clientName: string;
  name: string;
  periodEnd: string;
  currency: string;
  overallMateriality: string;
  performanceMateriality: string;
  status: "planning" | "fieldwork" | "completion" | "archived";
  createdAt: string;
  updatedAt: string;
}

export interface EngagementForUser extends EngagementRecord {
  myRole: EngagementRole;
  teamSize: number;
}

const columns = {
  id: "e.id",
  firmId: "e.firm_id",
  clientName: "e.client_name",
  name: "e.name",
  periodEnd: "e.period_end",
  currency: "e.currency",
  overallMateriality: "e.overall_materiality",
  performanceMateriality: "e.performance_materiality",
  status: "e.status",
  createdAt: "e.created_at",
  updatedAt: "e.updated_at",
};

function toEngagement<T extends Record<string, unknown>>(r: T): EngagementRecord & Omit<T, keyof EngagementRecord> {
  return {
    ...r,
    id: Number(r.id),
    firmId: Number(r.firmId),
    createdAt: new Date(r.createdAt as string).toISOString(),
    updatedAt: new Date(r.updatedAt as string).toISOString(),
  } as unknown as EngagementRecord & Omit<T, keyof EngagementRecord>;
}

/** The engagements the user is on the audit team of, with their role on each (never a client contact's). */
export async function listEngagementsByUserId(db: Knex, { userId }: { userId: number }): Promise<EngagementForUser[]> {
  const rows = await db("engagements as e")
    .join("engagement_members as m", "m.engagement_id", "e.id")
    .where("m.user_id", userId)
    .whereNot("m.role", "client")
    .orderBy("e.period_end", "desc")
    .select({ ...columns, myRole: "m.role" })
    .select(
      db.raw(
        "(select count(*) from engagement_members t where t.engagement_id = e.id and t.role <> 'client') as teamSize",
      ),
    );
  return rows.map((r) => ({ ...toEngagement(r), myRole: r.myRole, teamSize: Number(r.teamSize) }));
}

export async function getEngagementById(
  db: Knex,
  { engagementId }: { engagementId: number },
): Promise<EngagementRecord | null> {
  const row = await db("engagements as e").where("e.id", engagementId).first(columns);
  return row ? toEngagement(row) : null;
}

/** Client and engagement names of the given engagements (what a client contact's lists are labelled with). */
export async function listEngagementNamesByIds(
  db: Knex | Knex.Transaction,
  { engagementIds }: { engagementIds: number[] },
) {
  if (engagementIds.length === 0) return [];
  const rows = await db("engagements").whereIn("id", engagementIds).select("id", "client_name", "name");
  return rows.map((r) => ({ id: Number(r.id), clientName: r.client_name, name: r.name }));
}

export async function createEngagement(
  db: Knex,
  { firmId, actorId, input }: { firmId: number; actorId: number; input: CreateEngagement },
) {
  return db.transaction(async (trx) => {
    const creator = await trx("users").where({ id: actorId }).first("grade");
    const [id] = await trx("engagements").insert({
      firm_id: firmId,
      client_name: input.clientName,
      name: input.name,
      period_end: input.periodEnd,
      currency: input.currency,
      overall_materiality: input.overallMateriality,
      performance_materiality: input.performanceMateriality,
      created_by: actorId,
    });
    const role: EngagementRole = creator?.grade === "partner" ? "partner" : "manager";
    await trx("engagement_members").insert({ engagement_id: id, user_id: actorId, role });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: id,
      entity: "engagement",
      entityId: id,
      action: "create",
      after: input,
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: id,
      entity: "engagement_member",
      entityId: `${id}:${actorId}`,
      action: "add",
      after: { userId: actorId, role },
    });
    return (await getEngagementById(trx, { engagementId: id }))!;
  });
}

const fieldToColumn: Record<keyof UpdateEngagement, string> = {
  clientName: "client_name",
  name: "name",
  periodEnd: "period_end",
  currency: "currency",
  overallMateriality: "overall_materiality",
  performanceMateriality: "performance_materiality",
  status: "status",
};

export async function updateEngagement(
  db: Knex,
  { engagementId, actorId, input }: { engagementId: number; actorId: number; input: UpdateEngagement },
) {
  return db.transaction(async (trx) => {
    const before = await trx("engagements as e").where("e.id", engagementId).forUpdate().first(columns);
    if (!before) throw notFound("No such engagement");
    const patch: Record<string, unknown> = { updated_at: trx.fn.now(3) };
    for (const [field, value] of Object.entries(input)) patch[fieldToColumn[field as keyof UpdateEngagement]] = value;
    await trx("engagements").where({ id: engagementId }).update(patch);
    const after = (await getEngagementById(trx, { engagementId }))!;
    const changedBefore = Object.fromEntries(
      Object.keys(input).map((k) => [k, (before as Record<string, unknown>)[k]]),
    );
    const changedAfter = Object.fromEntries(
      Object.keys(input).map((k) => [k, (after as unknown as Record<string, unknown>)[k]]),
    );
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      entity: "engagement",
      entityId: engagementId,
      action: "update",
      before: changedBefore,
      after: changedAfter,
    });
    return after;
  });
}
