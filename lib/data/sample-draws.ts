import "server-only";
import type { Knex } from "knex";
import type { SelectionInputs } from "@/lib/samples/select";
import type { SampleDrawsRow } from "./tables";

/** A new draw as written: the previous ones stay, no longer current. */
export interface NewSampleDraw {
  seed: number;
  seedSource: SampleDrawsRow["seed_source"];
  algorithm: string;
  algorithmVersion: string;
  populationSha256: string;
  inputs: SelectionInputs;
  selectionSha256: string;
  drawnBy: number;
}

/**
 * Inserts the sample's next draw (version n + 1) as its current one; earlier versions are kept,
 * marked not current. Inside the caller's transaction, after beginSampleWrite locked the sample.
 */
export async function insertSampleDraw(
  trx: Knex.Transaction,
  { sampleId, draw }: { sampleId: number; draw: NewSampleDraw },
): Promise<{ drawId: number; version: number }> {
  const previous = await trx("sample_draws").where({ sample_id: sampleId }).max({ v: "version" }).first();
  const version = Number(previous?.v ?? 0) + 1;
  await trx("sample_draws").where({ sample_id: sampleId }).update({ current: false });
  const [drawId] = await trx("sample_draws").insert({
    sample_id: sampleId,
    version,
    seed: draw.seed,
    seed_source: draw.seedSource,
    algorithm: draw.algorithm,
    algorithm_version: draw.algorithmVersion,
    population_sha256: draw.populationSha256,
    inputs_json: JSON.stringify(draw.inputs),
    selection_sha256: draw.selectionSha256,
    drawn_by: draw.drawnBy,
  });
  return { drawId, version };
}

/** Stores the draw's selection inputs after an extension or a replacement moved its random stream on. */
export async function updateDrawInputsById(
  trx: Knex.Transaction,
  { drawId, inputs }: { drawId: number; inputs: SelectionInputs },
) {
  await trx("sample_draws")
    .where({ id: drawId })
    .update({ inputs_json: JSON.stringify(inputs) });
}

/** Records when the draw was last re-performed and whether it matched. */
export async function updateDrawReperformById(
  trx: Knex.Transaction,
  { drawId, checkedAt, matches }: { drawId: number; checkedAt: Date; matches: boolean },
) {
  await trx("sample_draws").where({ id: drawId }).update({ reperformed_at: checkedAt, reperform_matches: matches });
}
