import "server-only";
import { createHash, randomInt } from "node:crypto";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { getPopulationById } from "@/lib/data/populations";
import { getSampleStatusById, markSampleDrawnById, type DrawRecord, type SampleRecord } from "@/lib/data/samples";
import { insertSampleDraw } from "@/lib/data/sample-draws";
import { insertSampleItems } from "@/lib/data/sample-items";
import { listDescriptionsByRowNumbers } from "@/lib/data/population-items";
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
    const descriptions = await listDescriptionsByRowNumbers(trx, {
      populationId: a.populationId,
      rowNumbers: chunk.map((it) => a.frame.rowNumbers[it.position]),
    });
    await insertSampleItems(trx, {
      sampleId: a.sampleId,
      drawId: a.drawId,
      items: chunk.map((it) => {
        const rowNumber = a.frame.rowNumbers[it.position];
        return {
          selectionOrder: it.order,
          populationRowNumber: rowNumber,
          itemRef: a.frame.itemRefs[it.position],
          description: descriptions.get(rowNumber) ?? null,
          bookValue: a.frame.bookValues[it.position].toFixed(2),
          hitPoints: it.hitPoints,
          topStratum: it.topStratum,
          stratum: it.stratum,
          origin: it.keyItem ? "key-item" : origin,
          replacesItemId: a.replacesItemId ?? null,
          keyItem: Boolean(it.keyItem),
          keyReason: it.keyItem ? (a.keyReasons?.get(rowNumber) ?? null) : null,
          pickedBy: a.pickedBy,
        };
      }),
    });
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
    const statusBefore = await getSampleStatusById(trx, { sampleId: sample.id });
    const { drawId, version } = await insertSampleDraw(trx, {
      sampleId: sample.id,
      draw: {
        seed,
        seedSource,
        algorithm: algorithmName(sample.method, inputs.selection),
        algorithmVersion: ALGORITHM_VERSION,
        populationSha256: population.sourceSha256,
        inputs,
        selectionSha256: sha256(selectionFingerprint(frame, items)),
        drawnBy: actorId,
      },
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
    await markSampleDrawnById(trx, { sampleId: sample.id });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample",
      entityId: sample.id,
      action: version === 1 ? "draw" : "redraw",
      before: statusBefore === "drawn" ? { version: version - 1 } : undefined,
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
