import { describe, expect, it } from "vitest";
import { axisTicks } from "@/components/samples/bound-chart";

// Round axis steps of 1, 2, 2.5 or 5 × 10^k (common practice for chart axes), never a tick like 8,988.43.
describe("axisTicks", () => {
  it("steps in round amounts up to the axis end", () => {
    expect(axisTicks(35953.72)).toEqual([0, 10000, 20000, 30000]);
    expect(axisTicks(1_120_000)).toEqual([0, 500000, 1000000]);
    expect(axisTicks(900_000)).toEqual([0, 250000, 500000, 750000]);
  });

  it("steps in round rates for a deviation-rate axis", () => {
    expect(axisTicks(0.112)).toEqual([0, 0.05, 0.1]);
    expect(axisTicks(1)).toEqual([0, 0.25, 0.5, 0.75, 1]);
  });

  it("has a single tick for an empty axis", () => {
    expect(axisTicks(0)).toEqual([0]);
  });
});
