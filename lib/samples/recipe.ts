import "server-only";
import type { SelectionInputs } from "./select";

interface RecipeContext {
  sampleName: string;
  seed: number;
  populationFile: string;
  populationSha256: string;
  itemRefColumn: string;
  bookValueColumn: string;
  rowCount: number;
}

/**
 * A plain-text recipe to redo the selection outside Sondage with numpy's legacy RandomState, which
 * implements MT19937 with init_genrand and genrand_res53 — the generator the selection used.
 */
export function reproductionRecipe(ctx: RecipeContext, inputs: SelectionInputs): string {
  const head = [
    `Reproduction recipe — ${ctx.sampleName}`,
    "",
    `1. Take the population file "${ctx.populationFile}" (SHA-256 ${ctx.populationSha256}).`,
    `   Check it: sha256sum "${ctx.populationFile}" must print the hash above.`,
    `2. Read its ${ctx.rowCount} data rows in file order; column "${ctx.itemRefColumn}" is the item reference and`,
    `   column "${ctx.bookValueColumn}" the book value (in whole cents: round(value * 100)).`,
    "3. In Python 3 with numpy:",
    "",
    "   import numpy as np",
    "   # refs, cents: the item references and book values in cents, in file order",
    ...(inputs.method === "nonstatistical" && inputs.selection === "haphazard"
      ? []
      : [`   rs = np.random.RandomState(${ctx.seed})   # MT19937, init_genrand(${ctx.seed})`]),
  ];
  return [
    ...head,
    ...keyItemSteps(inputs),
    ...methodSteps(inputs, ctx.seed),
    "",
    "Selection order is 1-based; row numbers are those of the file (header = row 1).",
    "",
  ].join("\n");
}

/** Key items come first and are removed from the frame; the method then runs on what remains, in file order. */
function keyItemSteps(inputs: SelectionInputs): string[] {
  const lines: string[] = [];
  if (inputs.keyRows?.length) {
    lines.push(
      `   key_rows = ${JSON.stringify(inputs.keyRows)}   # key items (file row numbers), examined 100 %, selection orders 1..${inputs.keyRows.length}`,
      "   keep = [i for i, row in enumerate(rows) if row not in key_rows]   # rows: each item's file row number; the remainder, in file order",
      "   refs, cents = [refs[i] for i in keep], cents[keep]               # positions below are within the remainder",
    );
  }
  if (inputs.method === "nonstatistical" && inputs.selection === "haphazard") {
    lines.push(
      "   # HAPHAZARD SELECTION: the other items were picked by the auditor on the population grid.",
      "   # No seed re-performs them; the workpaper lists each pick with who made it and when.",
    );
  }
  return lines;
}

function methodSteps(inputs: SelectionInputs, seed: number): string[] {
  if (inputs.method === "nonstatistical") {
    if (inputs.selection === "haphazard") return [];
    return methodSteps(
      {
        ...inputs,
        method: inputs.selection === "systematic" ? "systematic" : "random",
        frameSize: inputs.frameSize - (inputs.keyRows?.length ?? 0),
      },
      seed,
    );
  }
  switch (inputs.method) {
    case "mus": {
      const J = Math.round(inputs.interval! * 100);
      return [
        `   J = ${J}                                  # sampling interval ${inputs.interval} in cents`,
        "   frame = np.flatnonzero(cents > 0)           # zero and negative items are excluded",
        "   cum = np.cumsum(cents[frame])",
        "   r = 1 + int(np.floor(rs.random_sample() * J))",
        "   points = np.arange(r, cum[-1] + 1, J)",
        "   hit = frame[np.searchsorted(cum, points)]  # item i is hit when cum[i-1] < p <= cum[i]",
        "   selected = np.unique(hit)                 # in file order; an item may hold several points",
        `   # items with book value >= ${inputs.topStratumThreshold ?? inputs.interval} form the top stratum and are all examined`,
      ];
    }
    case "systematic":
      return [
        `   N, n = ${inputs.frameSize}, ${inputs.sampleSize}`,
        "   k = N / n",
        "   s = rs.random_sample() * k",
        "   selected = [int(np.floor(s + j * k)) for j in range(n)]   # 0-based positions",
      ];
    case "stratified":
      return [
        `   bounds = ${JSON.stringify(inputs.strataBounds)}   # stratum h holds values in (bounds[h-1], bounds[h]]; the last is open`,
        `   sizes = ${JSON.stringify(inputs.stratumRanks)}`,
        "   for h, n_h in enumerate(sizes, start=1):",
        "       members = positions of stratum h in file order",
        `       u = np.random.RandomState((${seed} + h) % 2**32).random_sample(len(members))`,
        "       picked = [members[i] for i in np.argsort(u, kind='stable')[:n_h]]",
      ];
    default:
      return [
        `   N, n = ${inputs.frameSize}, ${inputs.ranks}`,
        "   u = rs.random_sample(N)                    # u[i] belongs to item i",
        "   selected = np.argsort(u, kind='stable')[:n]   # the n smallest, in ascending u = selection order",
        "   # extensions and replacements continue down the same ranking",
      ];
  }
}
