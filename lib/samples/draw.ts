import "server-only";
import { createHash, randomInt } from "node:crypto";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { getPopulationById } from "@/lib/data/populations";
import type { DrawRecord, SampleRecord } from "@/lib/data/samples";
import { conflict, engineInputError, fieldError } from "@/lib/errors";
import { EngineInputError } from "@/lib/sampling";
import { beginSampleWrite } from "./guard";
import { loadFrame, type Frame } from "./population-frame";
import {
  ALGORITHM_VERSION,
  algorithmName,
  computeSelection,
  selectionFingerprint,
  type SelectedItem,
  type SelectionInputs,
} from "./select";

export function selectionInputsFor(sample: SampleRecord): SelectionInputs {
  const { plan } = sample;
  const keyRows = plan.keyItems?.items.map((k) => k.rowNumber);
  const base = { method: sample.method, frameSize: plan.frameSize, ...(keyRows?.length ? { keyRows } : {}) };
  switch (sample.method) {
    case "mus":
      return { ...base, interval: plan.interval, topStratumThreshold: plan.topStratumThreshold };
    case "systematic":
      return { ...base, sampleSize: plan.chosenSize };
    case "stratified":
      return {
        ...base,
        strataBounds: (sample.params.strataBounds ?? []).map(Number),
        stratumRanks: plan.strata!.map((s) => s.allocation),
      };
    case "nonstatistical": {
      const selection = plan.nonstatistical!.selection;
      return {
        ...base,
        selection,
        ...(selection === "systematic"
          ? { sampleSize: plan.chosenSize }
          : selection === "random"
            ? { ranks: plan.chosenSize }
            : {}),
      };
    }
    default:
      return { ...base, ranks: plan.chosenSize };
  }
}

/** A haphazard draw has no seed: its key items are set by the plan and the rest is picked by the auditor. */
export const isHaphazard = (inputs: SelectionInputs) =>
  inputs.method === "nonstatistical" && inputs.selection === "haphazard";

export const sha256 = (text: string) => createHash("sha256").update(text).digest("hex");

async function assertSampleable(db: Knex, sample: SampleRecord) {
  const population = await getPopulationById(db, {
    engagementId: sample.engagementId,
    populationId: sample.populationId,
  });
  if (population.status !== "reconciled")
    throw conflict(
      "The population is not reconciled to the ledger: record the control total (and explain any difference) before drawing.",
    );
  return population;
}

/** Inserts selected items for a draw, copying reference, description and book value from the population. */
export async function insertSelectedItems(
  trx: Knex.Transaction,
  a: {
    sampleId: number;
    drawId: number;
    populationId: number;
    frame: Frame;
    items: SelectedItem[];
    origin?: "selection" | "extension" | "replacement" | "haphazard";
    replacesItemId?: number;
    keyReasons?: Map<number, string | null>;
    pickedBy?: number;
  },
) {
  const origin = a.origin ?? "selection";
  for (let start = 0; start < a.items.length; start += 1000) {
    const chunk = a.items.slice(start, start + 1000);
    const rowNumbers = chunk.map((it) => a.frame.rowNumbers[it.position]);
    const descriptions = new Map<number, string | null>(
      (
        await trx("population_items")
          .where({ population_id: a.populationId })
          .whereIn("row_number", rowNumbers)
          .select("row_number", "description")
      ).map((r: { row_number: number; description: string | null }) => [r.row_number, r.description]),
    );
    await trx("sample_items").insert(
      chunk.map((it) => ({
        sample_id: a.sampleId,
        draw_id: a.drawId,
        selection_order: it.order,
        population_row_number: a.frame.rowNumbers[it.position],
        item_ref: a.frame.itemRefs[it.position],
        description: descriptions.get(a.frame.rowNumbers[it.position]) ?? null,
        book_value: a.frame.bookValues[it.position].toFixed(2),
        hit_points: it.hitPoints ? JSON.stringify(it.hitPoints) : null,
        top_stratum: it.topStratum,
        stratum: it.stratum,
        origin: it.keyItem ? "key-item" : origin,
        replaces_item_id: a.replacesItemId ?? null,
        key_item: Boolean(it.keyItem),
        key_reason: it.keyItem ? (a.keyReasons?.get(a.frame.rowNumbers[it.position]) ?? null) : null,
        ...(a.pickedBy !== undefined ? { picked_by: a.pickedBy, picked_at: trx.fn.now(3) } : {}),
      })),
    );
  }
}

/**
 * Draws the sample on the server from a cryptographic seed (or one the auditor enters to re-perform
 * elsewhere). A draw is final: drawing again creates version n+1 and keeps the earlier ones.
 */
export async function drawSample(
  db: Knex,
  { sample, actorId, seed: enteredSeed }: { sample: SampleRecord; actorId: number; seed?: number },
): Promise<DrawRecord["id"]> {
  const population = await assertSampleable(db, sample);
  const frame = await loadFrame(db, { populationId: population.id });
  const inputs = selectionInputsFor(sample);
  const haphazard = isHaphazard(inputs);
  if (haphazard && enteredSeed !== undefined)
    throw fieldError(
      "seed",
      "a haphazard selection has no seed; pick the items on the population grid after the draw",
      "A haphazard selection has no seed",
    );
  const seed = haphazard ? 0 : (enteredSeed ?? randomInt(0, 2 ** 32));
  const seedSource = haphazard ? "haphazard" : enteredSeed === undefined ? "generated" : "entered";
  let items: SelectedItem[];
  try {
    items = computeSelection(frame, inputs, seed);
  } catch (err) {
    if (err instanceof EngineInputError) throw engineInputError(err, { lead: "The selection could not be drawn" });
    throw err;
  }
  return db.transaction(async (trx) => {
    await beginSampleWrite(trx, { sampleId: sample.id, actorId, what: "a new draw" });
    const locked = await trx("samples").where({ id: sample.id }).first("status");
    const previous = await trx("sample_draws").where({ sample_id: sample.id }).max({ v: "version" }).first();
    const version = Number(previous?.v ?? 0) + 1;
    await trx("sample_draws").where({ sample_id: sample.id }).update({ current: false });
    const [drawId] = await trx("sample_draws").insert({
      sample_id: sample.id,
      version,
      seed,
      seed_source: seedSource,
      algorithm: algorithmName(sample.method, inputs.selection),
      algorithm_version: ALGORITHM_VERSION,
      population_sha256: population.sourceSha256,
      inputs_json: JSON.stringify(inputs),
      selection_sha256: sha256(selectionFingerprint(frame, items)),
      drawn_by: actorId,
    });
    const keyReasons = new Map((sample.plan.keyItems?.items ?? []).map((k) => [k.rowNumber, k.reason] as const));
    await insertSelectedItems(trx, {
      sampleId: sample.id,
      drawId,
      populationId: population.id,
      frame,
      items,
      keyReasons,
    });
    await trx("samples")
      .where({ id: sample.id })
      .update({ status: "drawn", updated_at: trx.fn.now(3) });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample",
      entityId: sample.id,
      action: version === 1 ? "draw" : "redraw",
      before: locked?.status === "drawn" ? { version: version - 1 } : undefined,
      after: {
        version,
        seed: haphazard ? null : seed,
        seedSource,
        items: items.length,
        keyItems: items.filter((i) => i.keyItem).length,
        algorithm: algorithmName(sample.method, inputs.selection),
      },
    });
    return drawId;
  });
}
