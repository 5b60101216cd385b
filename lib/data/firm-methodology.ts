import "server-only";
import type { Knex } from "knex";
import {
  DEFAULT_METHODOLOGY,
  MethodologySettingsSchema,
  withMethodologyDefaults,
  type MethodologySettings,
} from "@/lib/validation/methodology";
import { recordAudit } from "./audit-log";
import { parseJsonColumn } from "./json-column";

export interface MethodologyVersion {
  /** 0 when the firm has never saved its own settings (the shipped defaults apply). */
  version: number;
  settings: MethodologySettings;
  updatedBy: string | null;
  updatedAt: string | null;
}

/** firm_methodology.settings_json as saved: today's fields, each optional (versions saved before a field existed lack it). */
const StoredSettingsSchema = MethodologySettingsSchema.partial().extend({
  nonstatistical: MethodologySettingsSchema.shape.nonstatistical.partial().optional(),
});

interface SavedVersionRow {
  version: number;
  settings_json: string;
  created_at: Date;
  created_by_name: string | null;
}

/** A saved version's settings, with fields added since it was saved filled from today's defaults. */
const storedSettings = (value: string) =>
  withMethodologyDefaults(parseJsonColumn(StoredSettingsSchema, value, "firm_methodology.settings_json"));

/** The firm's current methodology settings: its latest saved version, or the defaults as version 0. */
export async function getMethodologyByFirmId(
  db: Knex | Knex.Transaction,
  { firmId }: { firmId: number },
): Promise<MethodologyVersion> {
  const row = await db("firm_methodology as m")
    .leftJoin("users as u", "u.id", "m.created_by")
    .where("m.firm_id", firmId)
    .orderBy("m.version", "desc")
    .first<SavedVersionRow | undefined>("m.version", "m.settings_json", "m.created_at", "u.name as created_by_name");
  if (!row) return { version: 0, settings: DEFAULT_METHODOLOGY, updatedBy: null, updatedAt: null };
  return {
    version: Number(row.version),
    settings: storedSettings(row.settings_json),
    updatedBy: row.created_by_name ?? null,
    updatedAt: new Date(row.created_at).toISOString(),
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
    await trx("firm_methodology").insert({
      firm_id: firmId,
      version,
      settings_json: JSON.stringify(settings),
      created_by: actorId,
    });
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

export interface MethodologyChange {
  version: number;
  changedBy: string | null;
  changedAt: string;
  changes: { field: string; from: string; to: string }[];
}

/** Flattens settings to "path → value" so two versions can be compared field by field. */
function flatten(value: unknown, path = ""): Map<string, string> {
  const out = new Map<string, string>();
  if (value !== null && typeof value === "object") {
    for (const [k, v] of Object.entries(value as Record<string, unknown>))
      for (const [p, x] of flatten(v, path ? `${path}.${k}` : k)) out.set(p, x);
  } else out.set(path, JSON.stringify(value));
  return out;
}

/** Every saved version of the firm's settings, newest first, with who saved it, when, and what changed from the one before. */
export async function listMethodologyChangesByFirmId(
  db: Knex,
  { firmId }: { firmId: number },
): Promise<MethodologyChange[]> {
  const rows = await db("firm_methodology as m")
    .leftJoin("users as u", "u.id", "m.created_by")
    .where("m.firm_id", firmId)
    .orderBy("m.version", "asc")
    .select<SavedVersionRow[]>("m.version", "m.settings_json", "m.created_at", "u.name as created_by_name");
  let previous = flatten(DEFAULT_METHODOLOGY);
  const changes: MethodologyChange[] = [];
  for (const r of rows) {
    const current = flatten(storedSettings(r.settings_json));
    const diff = [...current]
      .filter(([k, v]) => previous.get(k) !== v)
      .map(([field, to]) => ({ field, from: previous.get(field) ?? "—", to }));
    changes.push({
      version: Number(r.version),
      changedBy: r.created_by_name ?? null,
      changedAt: new Date(r.created_at).toISOString(),
      changes: diff,
    });
    previous = current;
  }
  return changes.reverse();
}
