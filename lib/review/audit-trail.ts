import "server-only";
import type { Knex } from "knex";
import type { AuditQuery } from "@/lib/validation/review";
import { listAuditBySampleId, type SampleAuditRow } from "@/lib/data/audit-log";
import { listPopulationNamesBySampleId } from "@/lib/data/populations";
import { listEvidenceNamesBySampleId, listItemRefsBySampleId } from "@/lib/data/sample-items";
import type { ChangeContext } from "./describe-change";

/** One recorded change to a sample, as the trail shows it. */
export type AuditTrailEntry = SampleAuditRow;

const KINDS: Record<Exclude<AuditQuery["kind"], "all">, { entities?: string[]; actions?: string[] }> = {
  plan: { actions: ["plan", "replan"] },
  selection: { actions: ["draw", "redraw", "reperform", "extend", "void-and-replace"] },
  results: { entities: ["sample_item"], actions: ["record-result", "import-results"] },
  evidence: { entities: ["item_evidence", "request_list", "request_item", "request_file"] }, // client requests are part of gathering evidence
  review: { actions: ["preparer-sign-off", "reviewer-sign-off", "sign-offs-cleared", "raise", "answer", "clear"] },
  lock: { actions: ["lock", "unlock"] },
};

/** Every recorded change to a sample (who, when, what, before → after), newest first, filterable. */
export async function listSampleAuditTrail(
  db: Knex,
  { sampleId, query }: { sampleId: number; query: AuditQuery },
): Promise<AuditTrailEntry[]> {
  const kind = query.kind === "all" ? {} : KINDS[query.kind];
  return listAuditBySampleId(db, { sampleId, actorUserId: query.userId, ...kind });
}

/** What the readable trail needs to name things: every item of the sample (any draw), its evidence files and the engagement's populations. */
export async function loadChangeContext(db: Knex, { sampleId }: { sampleId: number }): Promise<ChangeContext> {
  const [items, files, populations] = await Promise.all([
    listItemRefsBySampleId(db, { sampleId }),
    listEvidenceNamesBySampleId(db, { sampleId }),
    listPopulationNamesBySampleId(db, { sampleId }),
  ]);
  return {
    itemRefs: new Map(items.map((r) => [String(r.id), String(r.item_ref)])),
    evidenceNames: new Map(files.map((r) => [String(r.id), `${r.file_name} (item ${r.item_ref})`])),
    populationNames: new Map(populations.map((p) => [String(p.id), p.name])),
  };
}
