/**
 * Reference datasets used by several test files. Each carries its source.
 */
import type { SampledItem } from "@/lib/sampling";

const pair = (book: number[], audit: number[]): SampledItem[] =>
  book.map((b, i) => ({ bookValue: b, auditedValue: audit[i] }));

/**
 * Synthetic audit sample fed to R 4.2.2 survey 4.1.1 (svydesign(ids=~1, fpc=~fpc)):
 * N = 500, population book total X = 1,180,000, SRSWOR n = 30.
 */
export const UNSTRATIFIED = {
  populationSize: 500,
  populationBookValue: 1180000,
  sample: pair(
    [
      1250, 3400, 870, 2150, 4600, 1980, 560, 3120, 2750, 1430, 5200, 990, 2600, 1875, 3300, 720, 4100, 2280, 1560,
      2950, 3780, 640, 2410, 1720, 4480, 1150, 2890, 3650, 2020, 1340,
    ],
    [
      1250, 3400, 870, 2000, 4600, 1980, 560, 3120, 2500, 1430, 5200, 990, 2600, 1875, 3000, 720, 4100, 2280, 1600,
      2950, 3780, 0, 2410, 1720, 4300, 1150, 2890, 3650, 1900, 1340,
    ],
  ),
};

/** The stratified sample fed to R survey (svydesign(ids=~1, strata=~stratum, fpc=~fpc)). */
export const STRATUM_A = {
  populationSize: 60,
  populationBookValue: 540000,
  sample: pair([8200, 9500, 7800, 10400, 9100, 8800, 11000, 7600], [8200, 9100, 7800, 10400, 8600, 8800, 11000, 7600]),
};
export const STRATUM_B = {
  populationSize: 440,
  populationBookValue: 640000,
  sample: pair(
    [1200, 1500, 1800, 950, 1400, 1650, 2100, 1300, 1100, 1750, 1550, 1000],
    [1200, 1500, 1650, 950, 1400, 1650, 2100, 1250, 1100, 1750, 1550, 0],
  ),
};

/** R boot 1.3-28.1 `bigcity` (Cochran 1977 ch. 6): u = 1920 population, x = 1930 population, thousands. */
export const BIGCITY_U = [
  138, 93, 61, 179, 48, 37, 29, 23, 30, 2, 38, 46, 71, 25, 298, 74, 50, 76, 381, 387, 78, 60, 507, 50, 77, 64, 40, 136,
  243, 256, 94, 36, 45, 67, 120, 172, 66, 46, 121, 44, 64, 56, 40, 116, 87, 43, 43, 161, 36,
];
export const BIGCITY_X = [
  143, 104, 69, 260, 75, 63, 50, 48, 111, 50, 52, 53, 79, 57, 317, 93, 58, 80, 464, 459, 106, 57, 634, 64, 89, 77, 60,
  139, 291, 288, 85, 46, 53, 67, 115, 183, 86, 65, 113, 58, 63, 142, 64, 130, 105, 61, 50, 232, 54,
];
export const BIGCITY = pair(BIGCITY_U, BIGCITY_X);

/** R boot `city`: the first 10 rows of bigcity. */
export const CITY = BIGCITY.slice(0, 10);

/** Monetary-unit sample results of the Stringer worked example (interval 21,920; one top-stratum item). */
export const MUS_EXAMPLE_SAMPLE = pair([1000, 5480, 12000, 800, 2000], [0, 4384, 11400, 600, 2300]);
export const MUS_EXAMPLE_TOP = pair([40000], [38500]);
