import "server-only";
import type { Knex } from "knex";
import { applyItemResult, listItemRefsByIds, type SampleItemRecord } from "@/lib/data/sample-items";
import { beginResultWrite } from "@/lib/samples/guard";
import { AppError } from "@/lib/errors";
import { SaveResultSchema, type SaveResult } from "@/lib/validation/sample";
import type { BatchResults } from "@/lib/validation/batch-results";
import { FIELD_LABELS } from "@/lib/fieldwork/field-labels";

interface BatchWrite {
  engagementId: number;
  sampleId: number;
  drawId: number;
  actorId: number;
  batch: BatchResults;
}

function checkRows(batch: BatchResults, refs: Map<number, string>) {
  const problems: { row: number; itemId: number; itemRef: string | null; reason: string }[] = [];
  const parsed: { itemId: number; input: SaveResult }[] = [];
  const seen = new Set<number>();
  batch.rows.forEach(({ itemId, ...body }, i) => {
    const itemRef = refs.get(itemId) ?? null;
    const problem = (reason: string) => problems.push({ row: i + 1, itemId, itemRef, reason });
    if (!itemRef) return problem("no such item in the current draw");
    if (seen.has(itemId)) return problem("the item appears twice");
    seen.add(itemId);
    const r = SaveResultSchema.safeParse(body);
    if (!r.success)
      return problem(
        r.error.issues
          .map((iss) => `${FIELD_LABELS[String(iss.path[0])] ?? String(iss.path[0] ?? "result")}: ${iss.message}`)
          .join("; "),
      );
    parsed.push({ itemId, input: r.data });
  });
  return { problems, parsed };
}

/**
 * Saves several items' results in one transaction with an audit row each, or nothing: any row that
 * fails validation, was voided or was changed by someone else since it was read refuses the whole
 * batch with a 400/409 naming each such item.
 */
export async function saveItemResults(
  db: Knex,
  { engagementId, sampleId, drawId, actorId, batch }: BatchWrite,
): Promise<{ items: SampleItemRecord[]; signOffsCleared: boolean }> {
  const ids = batch.rows.map((r) => r.itemId);
  const refs = await listItemRefsByIds(db, { drawId, itemIds: ids });
  const { problems, parsed } = checkRows(batch, refs);
  if (problems.length) throw refusal(400, "invalid_rows", problems);
  return db.transaction(async (trx) => {
    const signOffsCleared = await beginResultWrite(trx, {
      sampleId,
      actorId,
      what: `${parsed.length === 1 ? "an item's result" : `${parsed.length} items' results`}`,
    });
    const items: SampleItemRecord[] = [];
    const late: typeof problems = [];
    for (const [i, row] of parsed.entries()) {
      try {
        items.push(
          await applyItemResult(trx, { engagementId, sampleId, drawId, actorId, itemId: row.itemId, input: row.input }),
        );
      } catch (err) {
        if (!(err instanceof AppError) || err.status !== 409) throw err;
        late.push({ row: i + 1, itemId: row.itemId, itemRef: refs.get(row.itemId) ?? null, reason: err.message });
      }
    }
    if (late.length) throw refusal(409, "rows_changed", late); // rolls the whole batch back
    return { items, signOffsCleared };
  });
}

function refusal(
  status: number,
  code: string,
  problems: { row: number; itemRef: string | null; itemId: number; reason: string }[],
) {
  const named = problems.map((p) => `${p.itemRef ?? `item ${p.itemId}`}: ${p.reason}`);
  const message = `Nothing was saved. ${problems.length === 1 ? "One row was refused" : `${problems.length} rows were refused`} — ${named.slice(0, 5).join("; ")}${named.length > 5 ? `; and ${named.length - 5} more` : ""}`;
  const fields: Record<string, string[]> = {};
  for (const p of problems) fields[`rows.${p.row - 1}`] = [`${p.itemRef ?? `item ${p.itemId}`}: ${p.reason}`];
  return new AppError(status, code, message.endsWith(".") ? message : `${message}.`, fields);
}
