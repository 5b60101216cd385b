/**
 * Assumed misstatement scenarios: audited values for a population whose true audited values are
 * not known yet, so that estimators can be compared on it before a sample is drawn.
 */
import { toCentsFast } from "./money";
import { createRng } from "./rng";
import { requireArray, requireObject, requireOneOf, requireSeed } from "./validate";
import { EngineInputError } from "./errors";

/** Shapes of tainting (misstatement as a share of book value) for the misstated items. */
export const TAINTING_PATTERNS = ["mostly-small", "spread", "whole-amount"] as const;
export type TaintingPattern = (typeof TAINTING_PATTERNS)[number];

export type MisstatementScenario =
  | {
      kind: "pattern";
      /** Share of items that are misstated, 0..1. */
      misstatedShare: number;
      tainting: TaintingPattern;
      /** Share of the misstated items that are overstated (the rest understated), 0..1. */
      overstatementShare: number;
    }
  | {
      kind: "observed";
      misstatedShare: number;
      /** Signed taintings seen in an earlier sample: (book − audited)/book, positive = overstatement. */
      taintings: number[];
    };

function requireShare(field: string, value: unknown): number {
  if (typeof value !== "number" || !Number.isFinite(value)) throw new TypeError(`${field} must be a finite number`);
  if (value < 0 || value > 1) throw new EngineInputError(field, `${field} must be between 0 and 1 (got ${value})`);
  return value;
}

/**
 * Draws one tainting for a misstated item. "mostly-small": 90% uniform on [0.01, 0.10], 10%
 * uniform on [0.5, 1]; "spread": uniform on (0, 1]; "whole-amount": 1 (the item does not exist or
 * is wholly wrong). The shapes are Sondage's own, chosen to span what audits commonly meet.
 */
function patternTainting(pattern: TaintingPattern, u: () => number): number {
  if (pattern === "whole-amount") return 1;
  if (pattern === "spread") return 1 - u();
  return u() < 0.9 ? 0.01 + 0.09 * u() : 0.5 + 0.5 * u();
}

/**
 * Audited values under a scenario, in currency units with 2 decimals, exactly in cents.
 *
 * One `createRng(seed)` stream in population order: for each item, u₁ < misstatedShare marks it
 * misstated; the tainting t comes from the pattern (or uniformly from the observed taintings);
 * with a pattern, a further u < overstatementShare makes it an overstatement (audited = book·(1 − t))
 * and otherwise an understatement (audited = book·(1 + t)); observed taintings keep their sign.
 * Audited cents are round(book cents · (1 − t)); items with a zero book value stay as they are.
 *
 * @throws {TypeError} when a field has the wrong type.
 * @throws {RangeError} naming the field: a share outside 0..1, an unknown pattern, an observed
 *   scenario with misstated items but no taintings, a tainting that is not finite.
 * @example
 * assumeAuditedValues({ bookValues: [100, 250], seed: 1,
 *   scenario: { kind: "pattern", misstatedShare: 1, tainting: "whole-amount", overstatementShare: 1 } })
 * // → [0, 0]
 */
export function assumeAuditedValues(o: {
  bookValues: number[];
  scenario: MisstatementScenario;
  seed: number;
}): number[] {
  requireObject("options", o);
  const bookValues = requireArray<number>("bookValues", o.bookValues);
  const scenario = requireObject("scenario", o.scenario) as MisstatementScenario;
  const kind = requireOneOf("scenario.kind", scenario.kind, ["pattern", "observed"] as const);
  const share = requireShare("scenario.misstatedShare", scenario.misstatedShare);
  const rng = createRng(requireSeed("seed", o.seed));
  const u = () => rng.nextDouble();

  let draw: () => number;
  if (kind === "pattern") {
    const s = scenario as Extract<MisstatementScenario, { kind: "pattern" }>;
    const pattern = requireOneOf("scenario.tainting", s.tainting, TAINTING_PATTERNS);
    const over = requireShare("scenario.overstatementShare", s.overstatementShare);
    draw = () => {
      const t = patternTainting(pattern, u);
      return u() < over ? t : -t;
    };
  } else {
    const taintings = requireArray<number>(
      "scenario.taintings",
      (scenario as Extract<MisstatementScenario, { kind: "observed" }>).taintings,
    );
    taintings.forEach((t, i) => {
      if (typeof t !== "number" || !Number.isFinite(t))
        throw new EngineInputError(`scenario.taintings[${i}]`, `scenario.taintings[${i}] must be a finite number`);
    });
    if (share > 0 && taintings.length === 0)
      throw new EngineInputError(
        "scenario.taintings",
        "scenario.taintings must hold at least one tainting when misstatedShare is above 0",
      );
    draw = () => taintings[Math.floor(u() * taintings.length)]!;
  }

  const audited = new Array<number>(bookValues.length);
  for (let i = 0; i < bookValues.length; i++) {
    const book = toCentsFast(bookValues[i], (j) => `bookValues[${j}]`, i);
    if (book !== 0 && u() < share) audited[i] = Math.round(book * (1 - draw())) / 100;
    else audited[i] = book / 100;
  }
  return audited;
}

/** Signed taintings (book − audited)/book of the misstated items among recorded results. */
export function observedTaintings(items: { bookValue: number; auditedValue: number }[]): {
  taintings: number[];
  misstatedShare: number;
} {
  const withBook = items.filter((it) => it.bookValue !== 0);
  const taintings = withBook
    .filter((it) => it.auditedValue !== it.bookValue)
    .map((it) => (it.bookValue - it.auditedValue) / it.bookValue);
  return { taintings, misstatedShare: withBook.length === 0 ? 0 : taintings.length / withBook.length };
}
