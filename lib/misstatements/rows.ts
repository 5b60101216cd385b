/** The summary's rows from what feeds it: sample contributions (with their corrections) and the team's entries. Pure. */
import type { RowInput } from "./aggregate";
import type { SampleContribution } from "./contribution";
import { cents, dec } from "./money-cents";

export interface EntryInput {
  id: number;
  kind: "factual" | "judgemental" | "prior-period";
  account: string;
  assertion: string;
  description: string;
  amount: string;
  incomeEffect: string;
  balanceEffect: string;
  corrected: { on: string; reference: string } | null;
  evidenceCount: number;
}

export interface CorrectionInput {
  sampleId: number;
  part: "factual" | "projected";
  on: string;
  reference: string;
}

export const sampleReference = (id: number) => `S${String(id).padStart(3, "0")}`;
export const entryReference = (id: number) => `M${String(id).padStart(3, "0")}`;

export function sampleRows(
  c: SampleContribution,
  corrections: CorrectionInput[],
  engagementId: number,
  frozen: boolean,
): RowInput[] {
  if (c.state !== "contributes") return [];
  const corrected = (part: "factual" | "projected") => {
    const k = corrections.find((x) => x.sampleId === c.sampleId && x.part === part);
    return k ? { on: k.on, reference: k.reference } : null;
  };
  const common = {
    source: "sample" as const,
    sampleId: c.sampleId,
    entryId: null,
    link: `/engagements/${engagementId}/samples/${c.sampleId}`,
    reference: sampleReference(c.sampleId),
    account: c.account,
    assertion: c.assertion,
    direction: c.direction,
    incomeEffect: null,
    balanceEffect: null,
    frozen,
    evidenceCount: 0,
  };
  const provisional = c.complete ? "" : " Provisional: some items have no result yet.";
  return [
    {
      ...common,
      key: `s${c.sampleId}-factual`,
      kind: "factual",
      description: `Known misstatement in the items examined — ${c.name}.${provisional}`,
      amount: c.factual,
      allowance: null,
      allowanceNote: null,
      corrected: corrected("factual"),
    },
    {
      ...common,
      key: `s${c.sampleId}-projected`,
      kind: "projected",
      description: `Projected misstatement beyond the items examined (${c.basis}) — ${c.name}.${provisional}`,
      amount: dec(cents(c.projectedTotal) - cents(c.factual)),
      allowance: c.allowance,
      allowanceNote:
        c.allowance === null
          ? (c.allowanceNote ?? "No allowance for sampling risk: the method does not measure one.")
          : c.allowanceNote,
      corrected: corrected("projected"),
    },
    ...concludedRow(c, common, corrected("projected")),
  ];
}

/**
 * The auditor's response "conclude the amount is misstated": what the auditor concluded beyond the
 * sample's own projection is carried as a judgemental misstatement, so the sample's rows add up to
 * the concluded amount. A client adjustment of the projection covers it too (same correction).
 */
function concludedRow(
  c: SampleContribution,
  common: Omit<RowInput, "key" | "kind" | "description" | "amount" | "allowance" | "allowanceNote" | "corrected">,
  corrected: RowInput["corrected"],
): RowInput[] {
  if (!c.concluded) return [];
  const beyond = cents(c.concluded.amount) - cents(c.projectedTotal);
  if (beyond === 0n) return [];
  return [
    {
      ...common,
      key: `s${c.sampleId}-concluded`,
      kind: "judgemental",
      description: `The auditor concluded the amount is misstated by ${c.concluded.amount} (${c.concluded.by}); the sample projects ${c.projectedTotal}: the difference is carried here — ${c.name}.`,
      amount: dec(beyond),
      allowance: null,
      allowanceNote: "The auditor's conclusion: no allowance is computed for it.",
      corrected,
    },
  ];
}

export function entryRow(e: EntryInput, engagementId: number): RowInput {
  return {
    key: `e${e.id}`,
    source: "entry",
    kind: e.kind,
    sampleId: null,
    entryId: e.id,
    link: `/engagements/${engagementId}/misstatements#entry-${e.id}`,
    reference: entryReference(e.id),
    account: e.account,
    assertion: e.assertion,
    direction: null,
    description: e.description,
    amount: e.amount,
    incomeEffect: e.incomeEffect,
    balanceEffect: e.balanceEffect,
    allowance: null,
    allowanceNote: null,
    corrected: e.corrected,
    frozen: false,
    evidenceCount: e.evidenceCount,
  };
}
