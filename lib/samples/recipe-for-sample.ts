import "server-only";
import type { Knex } from "knex";
import { getPopulationById } from "@/lib/data/populations";
import { getCurrentDraw, type SampleRecord } from "@/lib/data/samples";
import { conflict } from "@/lib/errors";
import { reproductionRecipe } from "./recipe";

export async function recipeForSample(db: Knex, { sample }: { sample: SampleRecord }): Promise<string> {
  const draw = await getCurrentDraw(db, { sampleId: sample.id });
  if (!draw) throw conflict("The sample has not been drawn yet.");
  const population = await getPopulationById(db, {
    engagementId: sample.engagementId,
    populationId: sample.populationId,
  });
  return reproductionRecipe(
    {
      sampleName: `${sample.name} (draw ${draw.version})`,
      seed: draw.seed,
      populationFile: population.sourceFileName,
      populationSha256: population.sourceSha256,
      itemRefColumn: population.mapping.itemRefColumn,
      bookValueColumn: population.mapping.bookValueColumn,
      rowCount: population.rowCount,
    },
    draw.inputs,
  );
}
