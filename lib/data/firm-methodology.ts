import "server-only";
import type { Knex } from "knex";
import { DEFAULT_METHODOLOGY, withMethodologyDefaults, type MethodologySettings } from "@/lib/validation/methodology";
import { recordAudit } from "./audit-log";

export interface MethodologyVersion {
  /** 0 when the firm has never saved its own settings (the shipped defaults apply). */
  version: number;
  settings: MethodologySettings;
  updatedBy: string | null;
  updatedAt: string | null;
}

/** The firm's current methodology settings: its latest saved version, or the defaults as version 0. */
export async function getMethodologyByFirmId(db: Knex | Knex.Transaction, { firmId }: { firmId: number }): Promise<MethodologyVersion> {
  const row = await db("firm_methodology as m")
    .leftJoin("users as u", "u.id", "m.created_by")
    .where("m.firm_id", firmId)
    .orderBy("m.version", "desc")
    .first("m.version", "m.settings_json", "m.created_at", "u.name as created_by_name");
  if (!row) return { version: 0, settings: DEFAULT_METHODOLOGY, updatedBy: null, updatedAt: null };
  const stored: unknown = typeof row.settings_json === "string" ? JSON.parse(row.settings_json) : row.settings_json;
  return {
    version: Number(row.version),
    settings: withMethodologyDefaults(stored),
    updatedBy: (row.created_by_name as string | null) ?? null,
    updatedAt: new Date(row.created_at as string).toISOString(),
  };
}

/** Saves the settings as the firm's next version, with an audit row; earlier versions (stamped on plans) stay. */
export async function saveMethodologyForFirm(
  db: Knex,
  { firmId, actorId, settings }: { firmId: number; actorId: number; settings: MethodologySettings },
): Promise<MethodologyVersion> {
  return db.transaction(async (trx) => {
    const before = await getMethodologyByFirmId(trx, { firmId });
    await trx("firms").where({ id: firmId }).forUpdate().first("id"); // one writer of the next version at a time
    const latest = await trx("firm_methodology").where({ firm_id: firmId }).max({ v: "version" }).first();
    const version = Number(latest?.v ?? 0) + 1;
    await trx("firm_methodology").insert({ firm_id: firmId, version, settings_json: JSON.stringify(settings), created_by: actorId });
    await recordAudit(trx, {
      actorUserId: actorId,
      entity: "firm_methodology",
      entityId: firmId,
      action: "update",
      before: { version: before.version, settings: before.settings },
      after: { version, settings },
    });
    return getMethodologyByFirmId(trx, { firmId });
  });
}
