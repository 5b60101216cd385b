import { z } from "zod";

/** What one sample carries to the summary of misstatements: plain data, stored as it is when the sample is locked. */
export interface SampleContribution {
  sampleId: number;
  name: string;
  account: string;
  assertion: string;
  direction: string;
  method: string;
  /** "contributes": it has monetary results; "no-results": nothing recorded yet; "not-monetary": a test of controls. */
  state: "contributes" | "no-results" | "not-monetary";
  reason: string | null;
  /** Known misstatement in the items examined (Σ book − audited, exact). */
  factual: string;
  /** The sample's projected misstatement (what its evaluation says to carry), including the factual part. */
  projectedTotal: string;
  /** Upper misstatement limit − projected, on the tested side; null when the method gives no allowance. */
  allowance: string | null;
  allowanceNote: string | null;
  upperLimit: string | null;
  confidence: number | null;
  /** "monetary-unit" etc.: the group a pooled bound would need; the summary only sums allowances. */
  basis: string;
  complete: boolean;
  lockedAt: string | null;
  /** The auditor's response "conclude the amount is misstated" (issue 13), when recorded; absent on rows frozen before it existed. */
  concluded?: { amount: string; by: string; at: string } | null;
}

/** samples' frozen contributions as stored (misstatement_sample_snapshots.contribution_json), checked when read back. */
export const StoredContributionSchema = z.looseObject({
  sampleId: z.number(),
  name: z.string(),
  account: z.string(),
  assertion: z.string(),
  direction: z.string(),
  method: z.string(),
  state: z.enum(["contributes", "no-results", "not-monetary"]),
  reason: z.string().nullable(),
  factual: z.string(),
  projectedTotal: z.string(),
  allowance: z.string().nullable(),
  allowanceNote: z.string().nullable(),
  upperLimit: z.string().nullable(),
  confidence: z.number().nullable(),
  basis: z.string(),
  complete: z.boolean(),
  lockedAt: z.string().nullable(),
  concluded: z.object({ amount: z.string(), by: z.string(), at: z.string() }).nullable().optional(),
}) satisfies z.ZodType<SampleContribution>;
