import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { saveAuditorConclusion } from "@/lib/data/auditor-conclusions";
import type { SampleRecord } from "@/lib/data/samples";
import type { EngagementRole } from "@/lib/auth/roles";
import { AppError, conflict, forbidden } from "@/lib/errors";
import { evaluationFor } from "@/lib/samples/context";
import { beginSampleWrite } from "@/lib/samples/guard";
import type { SampleEvaluation } from "@/lib/samples/evaluate";
import type { AuditorConclusion } from "@/lib/validation/conclusion";
import { countOf, formatCount } from "@/lib/format/number";

const fieldError = (field: string, message: string) =>
  new AppError(400, "invalid_input", `${field}: ${message}`, { [field]: [message] });

/** Why the preparer cannot sign off yet with this conclusion (null when they can). */
export function conclusionGap(evaluation: SampleEvaluation, concluded: { responses: unknown[] } | null): string | null {
  if (!concluded)
    return "Record the auditor's conclusion (and, where the computed result calls for one, the response) before signing off.";
  if (evaluation.computed.responseNeeded && concluded.responses.length === 0)
    return "The computed result calls for a response (extend, alternative procedures, ask the client to adjust, or conclude misstated); record it before signing off.";
  return null;
}

/**
 * The preparer (staff or senior) records the auditor's conclusion and response, once every item has
 * a result. A response is required when the computed result does not support the amount or the
 * limit is close to tolerable. Writing it clears any sign-off (what was signed has changed).
 */
export async function recordAuditorConclusion(
  db: Knex,
  {
    sample,
    actorId,
    role,
    input,
  }: { sample: SampleRecord; actorId: number; role: EngagementRole; input: AuditorConclusion },
) {
  if (role !== "staff" && role !== "senior")
    throw forbidden(
      "The preparer (staff or senior) writes the auditor's conclusion; managers and partners review it and sign off on it.",
    );
  const evaluation = await evaluationFor(db, { engagementId: sample.engagementId, sampleId: sample.id });
  if (!evaluation.complete)
    throw new AppError(
      409,
      "incomplete",
      `${formatCount(evaluation.progress.notStarted)} of ${countOf(evaluation.progress.total, "item")} ${evaluation.progress.notStarted === 1 ? "has" : "have"} no result yet; conclude once every item has one.`,
    );
  if (evaluation.computed.status === "not-evaluable")
    throw conflict(`The sample cannot be evaluated yet: ${evaluation.computed.statement}`);
  if (evaluation.computed.responseNeeded && input.responses.length === 0) {
    throw fieldError(
      "responses",
      evaluation.computed.supported
        ? "The limit is close to tolerable: record the response"
        : "The computed result does not support the amount: record the response",
    );
  }
  await db.transaction(async (trx) => {
    await beginSampleWrite(trx, { sampleId: sample.id, actorId, what: "the auditor's conclusion" });
    await saveAuditorConclusion(trx, {
      sampleId: sample.id,
      actorId,
      role,
      conclusion: input.conclusion,
      responses: input.responses,
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "sample",
      entityId: sample.id,
      action: "auditor-conclusion",
      after: { ...input, computed: evaluation.computed.statement },
    });
  });
}
