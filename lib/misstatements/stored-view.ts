import "server-only";
import { z } from "zod";
import type { SummaryView } from "./types";

// The summary of misstatements as frozen at lock (misstatement_summaries.locked_view_json), checked when
// read back (lib/data/misstatements.ts). Defaults stand in for what later issues added: a view locked
// before the summary's audit trail has none, and one locked before the reviewer's blocker has none
// (loadSummaryView sets both lock fields of a locked view itself).

const money = z.string();
const nullableMoney = z.string().nullable();

const SummaryRowSchema = z.looseObject({
  key: z.string(),
  source: z.enum(["sample", "entry"]),
  kind: z.enum(["factual", "judgemental", "projected", "prior-period"]),
  sampleId: z.number().nullable(),
  entryId: z.number().nullable(),
  link: z.string(),
  reference: z.string(),
  account: z.string(),
  assertion: z.string(),
  direction: z.string().nullable(),
  description: z.string(),
  amount: money,
  incomeEffect: nullableMoney,
  balanceEffect: nullableMoney,
  allowance: nullableMoney,
  allowanceNote: z.string().nullable(),
  corrected: z.looseObject({ on: z.string(), reference: z.string() }).nullable(),
  clearlyTrivial: z.boolean(),
  accumulated: z.boolean(),
  frozen: z.boolean(),
  evidenceCount: z.number(),
});

const ApproachTotalSchema = z.looseObject({
  total: money,
  priorPeriod: money,
  marginToPerformance: money,
  marginToOverall: money,
});

const countedTotal = z.looseObject({ total: money, count: z.number() });

const SummaryTotalsSchema = z.looseObject({
  uncorrected: z.looseObject({
    factual: money,
    judgemental: money,
    projected: money,
    currentYear: money,
    gross: money,
    count: z.number(),
  }),
  corrected: countedTotal,
  clearlyTrivial: countedTotal,
  entryEffects: z.looseObject({ income: money, balance: money }),
  incomeStatementApproach: ApproachTotalSchema,
  balanceSheetApproach: ApproachTotalSchema,
  allowance: z.looseObject({ sum: money, samples: z.number(), note: z.string() }),
  upperEstimate: money,
});

const SummaryStatusSchema = z.looseObject({
  level: z.enum(["well-within", "approaching", "exceeds-performance", "exceeds-overall"]),
  label: z.string(),
  words: z.string(),
  measure: z.string(),
  threshold: z.string(),
  approachingShare: z.number(),
  approachingShareSource: z.string(),
  responses: z.array(z.string()),
  allowanceWarning: z.string().nullable(),
});

const SignOffSchema = z.looseObject({ name: z.string(), role: z.string(), at: z.string() }).nullable();

const SummaryReviewSchema = z.looseObject({
  preparer: SignOffSchema,
  reviewer: SignOffSchema,
  staleSignOffs: z.boolean(),
  lock: z
    .looseObject({
      name: z.string(),
      at: z.string(),
      workpaperSha256: z.string(),
      workpaperBytes: z.number(),
      reference: z.string(),
    })
    .nullable(),
  openNotes: z.number(),
  reviewerBlocker: z.string().nullable().default(null),
  lockable: z.looseObject({ ok: z.boolean(), reasons: z.array(z.string()) }),
});

export const LockedSummaryViewSchema = z.looseObject({
  engagement: z.looseObject({
    id: z.number(),
    clientName: z.string(),
    name: z.string(),
    periodEnd: z.string(),
    currency: z.string(),
  }),
  firmName: z.string(),
  workpaperReference: z.string(),
  generatedAt: z.string(),
  materiality: z.looseObject({
    overall: money,
    performance: money,
    clearlyTrivial: money,
    approachingShare: z.number(),
    currency: z.string(),
  }),
  rows: z.array(SummaryRowSchema),
  totals: SummaryTotalsSchema,
  status: SummaryStatusSchema,
  samples: z.array(
    z.looseObject({
      sampleId: z.number(),
      reference: z.string(),
      name: z.string(),
      link: z.string(),
      method: z.string(),
      state: z.enum(["contributes", "no-results", "not-monetary"]),
      reason: z.string().nullable(),
      locked: z.boolean(),
      frozen: z.boolean(),
    }),
  ),
  entries: z.array(
    z.looseObject({
      id: z.number(),
      version: z.number(),
      reference: z.string(),
      createdByName: z.string(),
      createdAt: z.string(),
      updatedAt: z.string().nullable(),
    }),
  ),
  review: SummaryReviewSchema,
  notes: z.array(
    z.looseObject({
      id: z.number(),
      text: z.string(),
      status: z.enum(["open", "answered", "cleared"]),
      raisedBy: z.string(),
      raisedAt: z.string(),
      answer: z.string().nullable(),
      answeredBy: z.string().nullable(),
      answeredAt: z.string().nullable(),
      clearedBy: z.string().nullable(),
      clearedAt: z.string().nullable(),
    }),
  ),
  trail: z
    .array(
      z.looseObject({
        at: z.string(),
        who: z.string(),
        action: z.string(),
        subject: z.string(),
        before: z.string().nullable(),
        after: z.string().nullable(),
      }),
    )
    .default([]),
  rowsSha256: z.string(),
  conventions: z.array(z.string()),
  caution: z.string(),
});

/** A stored view, read back as the view model it was (checked against SummaryView at compile time). */
export const toSummaryView = (parsed: z.output<typeof LockedSummaryViewSchema>): SummaryView => parsed;
