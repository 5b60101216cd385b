import { describe, expect, it } from "vitest";
import { REQUEST_NEED_LABELS } from "@/lib/validation/requests";
import { describeChange } from "@/lib/review/describe-change";
import { DIRECTION_LABELS, METHOD_LABELS } from "@/lib/validation/sample";
import { RISK_LEVEL_LABELS } from "@/lib/validation/methodology";

// The audit trail as people read it (issue 19): the same words on the page and in the locked PDF.
const ctx = { itemRefs: new Map([["41", "INV-100218"]]) };

describe("describeChange", () => {
  it("names the item, the field by its label and the values as the grid shows them", () => {
    const r = describeChange(
      {
        entity: "sample_item",
        entityId: "41",
        action: "record-result",
        before: { status: "not-started", auditedValue: null, cause: null, deviation: null, comment: null },
        after: { status: "done", auditedValue: "1623.5", cause: "pricing", deviation: null, comment: "Price list" },
      },
      ctx,
    );
    expect(r.what).toBe("Recorded a result");
    expect(r.subject).toBe("Item INV-100218");
    expect(r.changes).toEqual([
      { field: "Status", before: "Not started", after: "Done" },
      { field: "Audited value", before: "—", after: "1,623.50" },
      { field: "Cause", before: "—", after: "Pricing or rate" },
      { field: "Comment", before: "—", after: "Price list" },
    ]);
  });

  it("names the population and the estimator instead of an id and a code", () => {
    const r = describeChange(
      {
        entity: "sample",
        entityId: "7",
        action: "replan",
        before: { populationId: 3, estimator: "mean-per-unit" },
        after: { populationId: 4, estimator: "difference" },
      },
      { ...ctx, populationNames: new Map([["4", "Trade receivables at 31 Dec"]]) },
    );
    expect(r.changes).toEqual([
      { field: "Population", before: "a population since removed", after: "Trade receivables at 31 Dec" },
      { field: "Estimator", before: "Mean-per-unit", after: "Difference" },
    ]);
  });

  it("prints nested plan figures as words, never JSON", () => {
    const r = describeChange(
      {
        entity: "sample",
        entityId: "7",
        action: "plan",
        before: null,
        after: {
          name: "Receivables",
          direction: "understatement",
          // As stored: the schema's defaults for other methods (risk of incorrect rejection, attribute plan) ride along.
          params: {
            method: "mus",
            confidence: 0.95,
            tolerableMisstatement: "15000.00",
            riskOfIncorrectRejection: 0.1,
            attributePlan: "fixed",
            sizingBasis: "risk-assessment",
            assessedRisk: "moderate",
          },
        },
      },
      ctx,
    );
    expect(r.what).toBe("Planned the sample");
    expect(r.changes).toContainEqual({
      field: "Plan",
      before: "—",
      after: `Method ${METHOD_LABELS.mus}; Confidence 95%; Tolerable misstatement 15,000.00; Sizing basis From the risk assessment; Assessed risk ${RISK_LEVEL_LABELS.moderate}`,
    });
    expect(r.changes.map((c) => c.after).join(" ")).not.toMatch(/incorrect rejection|Attribute plan/);
    expect(r.changes).toContainEqual({ field: "Direction", before: "—", after: DIRECTION_LABELS.understatement });
    // A seed is an identifier, not an amount: printed without grouping, as it was entered.
    expect(
      describeChange({ entity: "sample", entityId: "7", action: "draw", before: null, after: { seed: 4242 } }, ctx)
        .changes,
    ).toEqual([{ field: "Seed", before: "—", after: "4242" }]);
    expect(r.changes.filter((c) => /[{}"]/.test(c.after))).toEqual([]);
  });

  it("names the item of a note and falls back to words for an unknown action", () => {
    expect(
      describeChange(
        { entity: "review_note", entityId: "3", action: "raise", before: null, after: { text: "Explain", itemId: 41 } },
        ctx,
      ).changes,
    ).toEqual([
      { field: "Note", before: "—", after: "Explain" },
      { field: "Item", before: "—", after: "INV-100218" },
    ]);
    expect(
      describeChange({ entity: "sample", entityId: "1", action: "archive-thing", before: null, after: null }, ctx).what,
    ).toBe("Archive thing");
  });

  it("prints a request list's due date, needs and contact as people read them, not as stored", () => {
    const r = describeChange(
      {
        entity: "request_list",
        entityId: "5",
        action: "create",
        before: null,
        after: { title: "Invoices", contactUserId: 7, dueDate: "2026-12-13", needs: ["invoice", "delivery-note"] },
      },
      ctx,
    );
    expect(r.subject).toBe("Client request list");
    expect(r.changes).toEqual([
      { field: "Title", before: "—", after: "Invoices" },
      { field: "Due date", before: "—", after: "13 Dec 2026" },
      { field: "Needs", before: "—", after: `${REQUEST_NEED_LABELS.invoice}, ${REQUEST_NEED_LABELS["delivery-note"]}` },
    ]);
  });
});
