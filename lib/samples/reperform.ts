import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { getCurrentDraw, type SampleRecord } from "@/lib/data/samples";
import { updateDrawReperformById } from "@/lib/data/sample-draws";
import { listSeededItemsByDrawId } from "@/lib/data/sample-items";
import { conflict } from "@/lib/errors";
import { loadFrame } from "./population-frame";
import { computeSelection, selectionFingerprint } from "./select";
import { sha256 } from "./draw";
import { assertSampleUnlocked } from "./guard";

export interface ReperformResult {
  matches: boolean;
  checkedAt: string;
  storedItems: number;
  recomputedItems: number;
  recomputedSha256: string;
  differences: string[];
}

/** Recomputes the current draw from its stored seed and inputs and compares it item by item. */
export async function reperformDraw(
  db: Knex,
  { sample, actorId }: { sample: SampleRecord; actorId: number },
): Promise<ReperformResult> {
  const draw = await getCurrentDraw(db, { sampleId: sample.id });
  if (!draw) throw conflict("The sample has not been drawn yet.");
  const frame = await loadFrame(db, { populationId: sample.populationId });
  const recomputed = computeSelection(frame, draw.inputs, draw.seed);
  const stored = await listSeededItemsByDrawId(db, { drawId: draw.id });

  const key = (row: number, stratum: number | null, order: number, points: number[] | null) =>
    `${stratum ?? "-"}|${row}|${sample.method === "stratified" ? "" : order}|${(points ?? []).map((p) => p.toFixed(2)).join(";")}`;
  const want = new Set(recomputed.map((it) => key(frame.rowNumbers[it.position], it.stratum, it.order, it.hitPoints)));
  const have = new Set(stored.map((s) => key(s.populationRowNumber, s.stratum, s.selectionOrder, s.hitPoints)));
  const differences = [
    ...[...have].filter((k) => !want.has(k)).map((k) => `stored but not recomputed: ${describe(k)}`),
    ...[...want].filter((k) => !have.has(k)).map((k) => `recomputed but not stored: ${describe(k)}`),
  ];
  const result: ReperformResult = {
    matches: differences.length === 0,
    checkedAt: new Date().toISOString(),
    storedItems: stored.length,
    recomputedItems: recomputed.length,
    recomputedSha256: sha256(selectionFingerprint(frame, recomputed)),
    differences: differences.slice(0, 20),
  };
  await db.transaction(async (trx) => {
    await assertSampleUnlocked(trx, sample.id);
    await updateDrawReperformById(trx, {
      drawId: draw.id,
      checkedAt: new Date(result.checkedAt),
      matches: result.matches,
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample",
      entityId: sample.id,
      action: "reperform",
      after: { version: draw.version, matches: result.matches, differences: differences.length },
    });
  });
  return result;
}

function describe(k: string): string {
  const [stratum, row, order] = k.split("|");
  return `row ${row}${order ? ` (selection ${order})` : ""}${stratum !== "-" ? ` in stratum ${stratum}` : ""}`;
}
