import "server-only";
import type { Knex } from "knex";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import { listNotesBySampleId } from "@/lib/data/review-notes";
import { listSampleAuditTrail } from "@/lib/review/audit-trail";
import { getAdoptedAdvisorRun } from "@/lib/data/advisor-runs";
import { methodRationaleBlock } from "@/lib/advisor/describe";
import { loadSampleWithEvaluation, type SampleView } from "@/lib/samples/context";
import { recipeForSample } from "@/lib/samples/recipe-for-sample";
import { factorModeOfSample } from "@/lib/samples/methodology";
import { workpaperReferenceFor } from "@/lib/review/lock";
import { money } from "@/lib/samples/evaluation-blocks";
import type { SampleEvaluation } from "@/lib/samples/evaluate";
import type { PlanBlock, WorkpaperData, WorkpaperItem } from "@/templates/workpaper/workpaper-data";
import { AppError } from "@/lib/errors";
import { getAuditorConclusionBySampleId } from "@/lib/data/auditor-conclusions";
import { RESPONSE_LABELS } from "@/lib/validation/conclusion";
import { anomalyRows, keyItemsBlock } from "./nonstatistical-blocks";
import { CAUSE_LABELS } from "@/lib/validation/sample";
import { describeChange } from "@/lib/review/describe-change";
import { loadChangeContext } from "@/lib/review/audit-trail";
import { randomStartOf } from "@/lib/samples/random-start";
import { listEvidenceIndexByDrawId } from "@/lib/data/item-evidence";
import { getFirmNameById } from "@/lib/data/firms";
import { countOf } from "@/lib/format/number";

const moneyOrNull = (v: number | null) => (v === null ? null : money(v));
const causeLabel = (cause: string) => CAUSE_LABELS[cause as keyof typeof CAUSE_LABELS] ?? cause;

/** Rates go to the renderer as fractions ("0.95"); it formats them. */
const pct = (v: number) => String(v);

const SYMBOLS: Record<string, { meaning: string; kind: "money" | "rate" | "count" | "factor" }> = {
  BV: { meaning: "Book value of the sampling frame", kind: "money" },
  TM: { meaning: "Tolerable misstatement", kind: "money" },
  EM: { meaning: "Expected misstatement", kind: "money" },
  confidence: { meaning: "Confidence (1 − risk of incorrect acceptance)", kind: "rate" },
  RF: { meaning: "Reliability factor for no misstatement", kind: "factor" },
  EF: { meaning: "Expansion factor for expected misstatement", kind: "factor" },
  N: { meaning: "Items in the population", kind: "count" },
  S: { meaning: "Estimated standard deviation of book values", kind: "money" },
  A: { meaning: "Planned allowance for sampling risk", kind: "money" },
  "n′": { meaning: "Size before the finite population correction", kind: "factor" },
  "risk of incorrect acceptance": { meaning: "β, one-sided", kind: "rate" },
  "risk of incorrect rejection": { meaning: "α, two-sided", kind: "rate" },
  TDR: { meaning: "Tolerable deviation rate", kind: "rate" },
  EDR: { meaning: "Expected deviation rate", kind: "rate" },
  "allowed deviations": { meaning: "Deviations the size allows", kind: "count" },
  strata: { meaning: "Number of strata", kind: "count" },
  "key items' BV": { meaning: "Book value of the key items, examined 100 %", kind: "money" },
  "assurance factor": {
    meaning: "Assurance factor for the two assessed risks (firm table), or −ln(1 − typed confidence)",
    kind: "factor",
  },
  "n (exact)": { meaning: "Size before rounding up", kind: "factor" },
  R: { meaning: "Confidence factor for EM/TM (gamma root)", kind: "factor" },
  "EM/TM": { meaning: "Expected over tolerable misstatement", kind: "factor" },
  M: { meaning: "Deviations assumed in the population, ⌈TDR × N⌉", kind: "count" },
  s_d: { meaning: "Planning standard deviation of the differences", kind: "money" },
  s_e: { meaning: "Planning standard deviation of the residuals", kind: "money" },
  "minimum sample size": { meaning: "Firm control-frequency table", kind: "count" },
  "occurrences in the population": { meaning: "Items in the population", kind: "count" },
};
const SIZE_METHODS = {
  "confidence-factor": "Confidence factors (AICPA Guide, 2008 and later)",
  "expansion-factor": "Expansion factors (older Guide presentation, firm methodology)",
} as const;

/** Everything the workpaper prints, from the database, with the evaluation computed by the engine. */
export async function assembleWorkpaper(
  db: Knex,
  {
    engagementId,
    sampleId,
    draft,
    lock,
  }: {
    engagementId: number;
    sampleId: number;
    draft: boolean;
    lock?: { lockedByName: string; role: string; lockedAt: Date; reference: string };
  },
): Promise<WorkpaperData> {
  const { view, items, evaluation } = await loadSampleWithEvaluation(db, { engagementId, sampleId });
  const { sample, population, engagement, currentDraw, review } = view;
  const [firm, notes, trail, recipe, adoptedRun, concluded, changeContext, evidence] = await Promise.all([
    getFirmNameById(db, { firmId: engagement.firmId }),
    listNotesBySampleId(db, { sampleId }),
    listSampleAuditTrail(db, { sampleId, query: { kind: "all" } }),
    currentDraw ? recipeForSample(db, { sample }) : Promise.resolve(""),
    getAdoptedAdvisorRun(db, { sampleId }),
    getAuditorConclusionBySampleId(db, { sampleId }),
    loadChangeContext(db, { sampleId }),
    currentDraw ? listEvidenceIndexByDrawId(db, { drawId: currentDraw.id }) : Promise.resolve([]),
  ]);
  const tolerable = money(Number(sample.params.tolerableMisstatement ?? engagement.performanceMateriality));
  const active = items.filter((i) => i.status !== "void");
  const plan = sample.plan;
  return {
    draft,
    workpaperReference: lock?.reference ?? workpaperReferenceFor(sample),
    firmName: firm ?? "",
    clientName: engagement.clientName,
    engagementName: engagement.name,
    periodEnd: engagement.periodEnd,
    currency: engagement.currency,
    generatedAt: new Date().toISOString(),
    sampleName: sample.name,
    objective: {
      objective: sample.objective,
      assertion: sample.assertion,
      direction: sample.direction,
      misstatementDefinition:
        "Misstatement = book value − audited value (overstatement positive); an item that could not be audited counts as fully misstated.",
    },
    population: {
      name: population.name,
      sourceFile: population.sourceFileName,
      sha256: population.sourceSha256,
      uploadedBy: population.createdByName,
      uploadedAt: population.createdAt,
      itemCount: population.rowCount,
      total: population.total,
      reconciliation: {
        controlTotal: population.controlTotal,
        controlSource:
          population.controlCount === null
            ? null
            : `ledger / trial balance: ${countOf(population.controlCount, "item")}`,
        difference: population.difference?.total ?? null,
        status:
          population.controlTotal === null
            ? "no-control-total"
            : population.difference && population.difference.total === "0.00" && population.difference.count === 0
              ? "agreed"
              : population.status === "reconciled"
                ? "explained"
                : "unreconciled",
        explanation: population.reconciliationExplanation,
      },
      excluded: plan.excluded
        ? {
            ...plan.excluded,
            treatment: "Not selectable by monetary-unit sampling; tested separately as their own populations.",
          }
        : null,
      frameCount: plan.frameSize,
      frameTotal: plan.frameTotal,
    },
    plan: planBlock(sample, tolerable),
    methodRationale: adoptedRun?.result ? methodRationaleBlock(adoptedRun, sample.planVersion) : null,
    selection: {
      seed: currentDraw?.seed ?? 0,
      seedSource: currentDraw?.seedSource ?? "generated",
      algorithm: currentDraw?.algorithm ?? "not drawn",
      algorithmVersion: currentDraw?.algorithmVersion ?? "",
      drawVersion: currentDraw?.version ?? 0,
      drawnBy: currentDraw?.drawnByName ?? "",
      drawnAt: currentDraw?.drawnAt ?? new Date(0).toISOString(),
      populationSha256: currentDraw?.populationSha256 ?? population.sourceSha256,
      selectionSha256: currentDraw?.selectionSha256 ?? "",
      randomStart: currentDraw ? moneyOrNull(randomStartOf(currentDraw)) : null,
      reperform: {
        result:
          currentDraw?.reperformMatches === null || !currentDraw
            ? "not-checked"
            : currentDraw.reperformMatches
              ? "matches"
              : "differs",
        checkedAt: currentDraw?.reperformedAt ?? null,
        checkedBy: null,
        detail: null,
      },
      recipe: recipe.split("\n"),
    },
    sizing: plan.risk ?? null,
    keyItems: keyItemsBlock(plan, active),
    picks:
      currentDraw?.seedSource === "haphazard"
        ? active
            .filter((i) => i.origin === "haphazard")
            .map((i) => ({
              reference: i.itemRef,
              rowNumber: i.populationRowNumber,
              bookValue: i.bookValue,
              pickedBy: i.pickedByName,
              pickedAt: i.pickedAt,
            }))
        : null,
    anomalies: anomalyRows(sample, active),
    items: items.map(toWorkpaperItem),
    evaluation: evaluationOrExplain(evaluation, draft),
    conclusion: {
      computed: evaluation.computed,
      notes: evaluation.notes,
      auditor: concluded
        ? {
            conclusion: concluded.conclusion,
            responses: concluded.responses.map((r) => ({
              kind: r.kind,
              label: RESPONSE_LABELS[r.kind],
              amount: r.amount,
              note: r.note,
            })),
            writtenBy: concluded.writtenBy.name,
            role: concluded.writtenBy.role,
            writtenAt: concluded.writtenAt,
          }
        : null,
    },
    reviewNotes: notes.map((n, i) => ({
      number: i + 1,
      text: n.itemRef ? `[${n.itemRef}] ${n.text}` : n.text,
      raisedBy: n.raisedBy,
      raisedAt: n.raisedAt,
      answers: n.answer ? [{ text: n.answer, by: n.answeredBy ?? "", at: n.answeredAt ?? "" }] : [],
      clearedBy: n.clearedBy,
      clearedAt: n.clearedAt,
    })),
    signOffs: { preparer: review.preparer, reviewer: review.reviewer },
    lock: lock ? { lockedBy: lock.lockedByName, role: lock.role, lockedAt: lock.lockedAt.toISOString() } : null,
    evidence,
    auditTrail: trail
      .slice()
      .reverse()
      .map((e) => {
        const r = describeChange(e, changeContext);
        const side = (k: "before" | "after") =>
          r.changes.length ? r.changes.map((c) => `${c.field}: ${c[k]}`).join("\n") : null;
        return {
          at: e.at,
          who: e.actorName ?? "system",
          action: r.what,
          subject: r.subject,
          before: side("before"),
          after: side("after"),
        };
      }),
  };
}

/** The view model's block, printed as it is; a draft may go out before the first result, a locked workpaper may not. */
function evaluationOrExplain(evaluation: SampleEvaluation, draft: boolean) {
  if (evaluation.block) return evaluation.block;
  if (draft) return null;
  throw new AppError(
    409,
    "not_evaluable",
    `The workpaper cannot be locked yet: ${evaluation.computed.statement} Record more results first.`,
  );
}

function toWorkpaperItem(i: SampleItemRecord): WorkpaperItem {
  return {
    selectionOrder: i.selectionOrder,
    reference: i.itemRef,
    description: i.description,
    rowNumber: i.populationRowNumber,
    stratum: i.stratum,
    topStratum: i.topStratum,
    hitPoints: (i.hitPoints ?? []).map((p) => money(p)),
    origin: i.origin,
    bookValue: i.bookValue,
    auditedValue: i.auditedValue,
    misstatement: i.misstatement,
    status: i.status,
    cause: i.cause ? (i.causeNote ? `${causeLabel(i.cause)}: ${i.causeNote}` : causeLabel(i.cause)) : null,
    comment: i.voidReason ? `Void: ${i.voidReason}${i.comment ? ` — ${i.comment}` : ""}` : i.comment,
    deviation: i.deviation,
    deviationNature: i.deviationNature,
  };
}

function planBlock(sample: SampleView["sample"], tolerable: string): PlanBlock {
  const p = sample.params,
    plan = sample.plan;
  const parameters: PlanBlock["parameters"] = [{ label: "Confidence", kind: "rate", value: pct(p.confidence) }];
  if (sample.method === "attribute" && plan.controlFrequencyRow) {
    parameters.splice(0, parameters.length, {
      label: "Size set by",
      kind: "text",
      value: `Firm control-frequency table: ${plan.inputs.frequency} → ${plan.controlFrequencyRow.minimumSampleSize} items`,
    });
  } else if (sample.method === "attribute") {
    parameters.push(
      { label: "Tolerable deviation rate", kind: "rate", value: pct(p.tolerableRate ?? 0) },
      { label: "Expected deviation rate", kind: "rate", value: pct(p.expectedRate) },
    );
    if (plan.model)
      parameters.push({
        label: "Distribution",
        kind: "text",
        value: plan.model === "hypergeometric" ? `Hypergeometric (population of ${plan.frameSize} items)` : "Binomial",
      });
  } else {
    parameters.push(
      { label: "Tolerable misstatement", kind: "money", value: tolerable },
      { label: "Expected misstatement", kind: "money", value: p.expectedMisstatement },
    );
    if (sample.method !== "mus")
      parameters.push({ label: "Risk of incorrect rejection", kind: "rate", value: pct(p.riskOfIncorrectRejection) });
    else
      parameters.push({
        label: "Factors",
        kind: "text",
        value: factorModeOfSample(sample) === "table" ? "table (rounded up to 2 decimals)" : "exact (gamma quantile)",
      });
    if (plan.sizeMethod) parameters.push({ label: "Size method", kind: "text", value: SIZE_METHODS[plan.sizeMethod] });
    if (plan.spread) parameters.push({ label: "Expected standard deviation", kind: "text", value: plan.spread.detail });
  }
  for (const note of plan.notes ?? []) parameters.push({ label: "Note", kind: "text", value: note });
  return {
    method: sample.method,
    estimator: p.estimator ?? null,
    parameters,
    computedSize: plan.computedSize,
    chosenSize: plan.chosenSize,
    sizeReason: sample.sizeReason,
    formula: {
      text: plan.formula,
      inputs: Object.entries(plan.inputs).map(([symbol, value]) => ({
        symbol,
        meaning: SYMBOLS[symbol]?.meaning ?? symbol,
        kind: SYMBOLS[symbol]?.kind ?? "text",
        value: String(value),
      })),
      substituted: null,
      source: plan.formula.match(/\(([^()]*)\)\s*$/)?.[1] ?? "",
    },
    interval: plan.interval !== undefined ? money(plan.interval) : null,
    topStratumThreshold: plan.topStratumThreshold !== undefined ? money(plan.topStratumThreshold) : null,
    topStratum: plan.topStratum ?? null,
    strata:
      plan.strata?.map((s) => ({
        number: s.number,
        label: s.label,
        populationSize: s.populationSize,
        bookValue: s.bookValue,
        sampleSize: s.allocation,
      })) ?? null,
    allowedDeviations: plan.allowedDeviations ?? null,
    warnings: plan.warnings,
  };
}
