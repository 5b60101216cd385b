import { describe, expect, it } from "vitest";
import { countOf, formatCount } from "@/lib/format/numbers";

// common practice: English count nouns take the singular for exactly one; thousands grouped by commas (en-US).
describe("counts in messages", () => {
  it("uses the singular for one and the plural otherwise", () => {
    expect(countOf(1, "item")).toBe("1 item");
    expect(countOf(0, "item")).toBe("0 items");
    expect(countOf(2, "sample")).toBe("2 samples");
    expect(countOf(1, "entry", "entries")).toBe("1 entry");
    expect(countOf(3, "entry", "entries")).toBe("3 entries");
  });

  it("groups thousands", () => {
    expect(formatCount(1204)).toBe("1,204");
    expect(countOf(1_000_000, "row")).toBe("1,000,000 rows");
  });
});
