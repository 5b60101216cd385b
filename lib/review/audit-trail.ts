import "server-only";
import type { Knex } from "knex";
import type { AuditQuery } from "@/lib/validation/review";
import type { ChangeContext } from "./describe-change";

export interface AuditTrailEntry {
  id: number;
  at: string;
  actorId: number | null;
  actorName: string | null;
  entity: string;
  entityId: string;
  action: string;
  before: unknown;
  after: unknown;
}

const KINDS: Record<Exclude<AuditQuery["kind"], "all">, { entities?: string[]; actions?: string[] }> = {
  plan: { actions: ["plan", "replan"] },
  selection: { actions: ["draw", "redraw", "reperform", "extend", "void-and-replace"] },
  results: { entities: ["sample_item"], actions: ["record-result", "import-results"] },
  evidence: { entities: ["item_evidence", "request_list", "request_item", "request_file"] }, // client requests are part of gathering evidence
  review: { actions: ["preparer-sign-off", "reviewer-sign-off", "sign-offs-cleared", "raise", "answer", "clear"] },
  lock: { actions: ["lock", "unlock"] },
};

const parse = (v: unknown) => (v === null || v === undefined ? null : typeof v === "string" ? JSON.parse(v) : v);

/** Every recorded change to a sample (who, when, what, before → after), newest first, filterable. */
export async function listSampleAuditTrail(
  db: Knex,
  { sampleId, query }: { sampleId: number; query: AuditQuery },
): Promise<AuditTrailEntry[]> {
  const q = db("audit_log as a")
    .leftJoin("users as u", "u.id", "a.actor_user_id")
    .where("a.sample_id", sampleId)
    .orderBy("a.id", "desc")
    .limit(2000)
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
  if (query.userId) q.andWhere("a.actor_user_id", query.userId);
  if (query.kind !== "all") {
    const k = KINDS[query.kind];
    q.andWhere((w) => {
      if (k.entities) w.orWhereIn("a.entity", k.entities);
      if (k.actions) w.orWhereIn("a.action", k.actions);
    });
  }
  return (await q).map((r) => ({
    id: Number(r.id),
    at: new Date(r.at).toISOString(),
    actorId: r.actor_user_id,
    actorName: r.name ?? null,
    entity: r.entity,
    entityId: r.entity_id,
    action: r.action,
    before: parse(r.before_json),
    after: parse(r.after_json),
  }));
}

/** What the readable trail needs to name things: every item of the sample (any draw) and its evidence files. */
export async function loadChangeContext(db: Knex, { sampleId }: { sampleId: number }): Promise<ChangeContext> {
  const [items, files] = await Promise.all([
    db("sample_items").where({ sample_id: sampleId }).select("id", "item_ref"),
    db("item_evidence as e")
      .join("sample_items as i", "i.id", "e.sample_item_id")
      .where("i.sample_id", sampleId)
      .select("e.id", "e.file_name", "i.item_ref"),
  ]);
  return {
    itemRefs: new Map(items.map((r: { id: number; item_ref: string }) => [String(r.id), String(r.item_ref)])),
    evidenceNames: new Map(
      files.map((r: { id: number; file_name: string; item_ref: string }) => [
        String(r.id),
        `${r.file_name} (item ${r.item_ref})`,
      ]),
    ),
  };
}
