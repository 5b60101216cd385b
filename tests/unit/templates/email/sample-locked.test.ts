import { describe, expect, it } from "vitest";
import { sampleLocked } from "@/templates/email/sample-locked";
import { sampleEvent } from "./fixtures";

describe("sample locked", () => {
  it("has a subject naming the locked sample", () => {
    expect(sampleLocked(sampleEvent()).subject).toBe("Locked: Receivables MUS (Tessaly Outdoor)");
  });

  it("says who locked it and that it is final", () => {
    const m = sampleLocked(sampleEvent());
    expect(m.text).toContain("Locked by:  Tomás Reyes, 2 Dec 2026, 09:05 UTC");
    expect(m.html).toContain("its workpaper is final");
  });
});
