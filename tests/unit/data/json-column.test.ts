import { describe, expect, it } from "vitest";
import { z } from "zod";
import { parseJsonColumn } from "@/lib/data/json-column";
import { SampleParamsSchema } from "@/lib/validation/sample";
import { StoredSelectionInputsSchema } from "@/lib/samples/stored-plan";

describe("parseJsonColumn", () => {
  it("parses stored text with the column's schema", () => {
    const stored = JSON.stringify({ method: "mus", frameSize: 120, interval: 5000.5, topStratumThreshold: 5000.5 });
    expect(parseJsonColumn(StoredSelectionInputsSchema, stored, "sample_draws.inputs_json", 7)).toEqual({
      method: "mus",
      frameSize: 120,
      interval: 5000.5,
      topStratumThreshold: 5000.5,
    });
  });

  it("reads plan params stored by the form's schema back through the same schema unchanged", () => {
    const params = SampleParamsSchema.parse({
      method: "random",
      estimator: "difference",
      confidence: "0.9",
      tolerableMisstatement: "25000",
      expectedMisstatement: "1000",
    });
    expect(parseJsonColumn(SampleParamsSchema, JSON.stringify(params), "samples.params_json", 3)).toEqual(params);
  });

  it("names the table, column and row of a value that does not fit, and the field at fault", () => {
    const stored = JSON.stringify({ method: "mus", frameSize: "many" });
    expect(() => parseJsonColumn(StoredSelectionInputsSchema, stored, "sample_draws.inputs_json", 42)).toThrow(
      /^sample_draws\.inputs_json of row 42: the stored JSON does not fit its schema \(frameSize: /,
    );
  });

  it("names the table, column and row of text that is not JSON", () => {
    expect(() => parseJsonColumn(z.array(z.number()), "[1, 2", "sample_items.hit_points", 9)).toThrow(
      /^sample_items\.hit_points of row 9: the stored text is not JSON/,
    );
  });

  it("takes a value the driver already decoded, and null where the schema allows it", () => {
    expect(parseJsonColumn(z.array(z.number()).nullable(), [1.5, 2], "sample_items.hit_points", 1)).toEqual([1.5, 2]);
    expect(parseJsonColumn(z.array(z.number()).nullable(), null, "sample_items.hit_points", 1)).toBeNull();
  });
});
