import "server-only";
import { createHash } from "node:crypto";
import type { Knex } from "knex";
import { getEngagementById } from "@/lib/data/engagements";
import {
  getSummaryByEngagementId,
  listCorrectionsByEngagementId,
  listEntriesByEngagementId,
  listSampleLocksByEngagementId,
} from "@/lib/data/misstatements";
import { ROLE_LABELS, type EngagementRole } from "@/lib/auth/roles";
import { notFound } from "@/lib/errors";
import { getFirmNameById } from "@/lib/data/firms";
import { aggregate, type RowInput } from "./aggregate";
import type { SampleContribution } from "./contribution";
import { loadSampleContribution } from "./from-sample";
import { listSummaryNotes } from "./notes";
import { listSummaryTrail } from "./trail";
import { entryReference, entryRow, sampleReference, sampleRows } from "./rows";
import { summaryReviewerSignOffBlocker } from "./sign-off-blockers";
import type { SummaryReview, SummarySampleLine, SummaryView } from "./types";

export const SUMMARY_CAUTION =
  "These figures support, and do not replace, the auditor's professional judgement, the applicable standards (AU-C 450, ISA 450, AS 2810; AU-C 530, ISA 530, AS 2315) and the firm's methodology.";

export const CONVENTIONS = [
  "Amounts are exact to the cent. A positive amount overstates the recorded figure (book − audited); a negative amount understates it.",
  "Rows from samples are fed live from each sample's evaluation; a locked sample's row is the one frozen at its lock.",
  "Corrected misstatements are listed apart and not accumulated. The team's entries below the clearly trivial threshold are listed but not accumulated.",
  "Prior-period uncorrected misstatements enter two totals that are never mixed: the income-statement (rollover) approach adds their effect on this period's profit; the balance-sheet (iron curtain) approach adds their effect on the closing net assets.",
  "Misstatements of opposite sign offset in the totals; the gross figure shows them without offsetting. Whether offsetting is appropriate is the auditor's judgement (AU-C 450 / ISA 450 application material; from memory).",
  "Status compares the larger of the two totals with performance materiality and overall materiality.",
];

export const summaryReferenceFor = (engagementId: number) => `WP-${engagementId}-MIS`;

/** Each sample's contribution: the frozen one for a locked sample, else read live from its evaluation. */
async function contributions(db: Knex, engagementId: number) {
  const locks = await listSampleLocksByEngagementId(db, { engagementId });
  const out: { c: SampleContribution; frozen: boolean; locked: boolean }[] = [];
  for (const l of locks) {
    if (l.lockedAt && l.frozen) out.push({ c: l.frozen, frozen: true, locked: true });
    else
      out.push({
        c: await loadSampleContribution(db, { engagementId, sampleId: l.sampleId, lockedAt: l.lockedAt }),
        frozen: false,
        locked: l.lockedAt !== null,
      });
  }
  return out;
}

/** What a sign-off vouches for: the figures and their treatment (not whether a sample's row is frozen yet, which its lock changes). */
export const rowsFingerprint = (v: Pick<SummaryView, "rows" | "totals" | "materiality">) =>
  createHash("sha256")
    .update(
      JSON.stringify({
        rows: v.rows.map(({ frozen: _frozen, ...r }) => r),
        totals: v.totals,
        materiality: v.materiality,
      }),
    )
    .digest("hex");

/** The summary as it stands now (live), whether or not it is locked. */
export async function buildLiveSummary(db: Knex, { engagementId }: { engagementId: number }): Promise<SummaryView> {
  const engagement = await getEngagementById(db, { engagementId });
  if (!engagement) throw notFound("No such engagement");
  const [firm, settings, entries, corrections, notes, trail, feed] = await Promise.all([
    getFirmNameById(db, { firmId: engagement.firmId }),
    getSummaryByEngagementId(db, { engagementId }),
    listEntriesByEngagementId(db, { engagementId }),
    listCorrectionsByEngagementId(db, { engagementId }),
    listSummaryNotes(db, { engagementId }),
    listSummaryTrail(db, { engagementId }),
    contributions(db, engagementId),
  ]);
  const materiality = {
    overall: engagement.overallMateriality,
    performance: engagement.performanceMateriality,
    clearlyTrivial: settings.clearlyTrivial,
    approachingShare: settings.approachingShare,
    currency: engagement.currency,
  };
  const inputs: RowInput[] = [
    ...feed.flatMap((f) => sampleRows(f.c, corrections, engagementId, f.frozen)),
    ...entries.map((e) => entryRow(e, engagementId)),
  ];
  const { rows, totals, status } = aggregate(inputs, materiality);
  const samples: SummarySampleLine[] = feed.map(({ c, frozen, locked }) => ({
    sampleId: c.sampleId,
    reference: sampleReference(c.sampleId),
    name: c.name,
    link: `/engagements/${engagementId}/samples/${c.sampleId}`,
    method: c.method,
    state: c.state,
    reason: c.reason,
    locked,
    frozen,
  }));
  const rowsSha256 = rowsFingerprint({ rows, totals, materiality });
  const staleSignOffs = settings.signedRowsSha256 !== null && settings.signedRowsSha256 !== rowsSha256;
  const openNotes = notes.filter((n) => n.status !== "cleared").length;
  const roleLabel = (role: string) => ROLE_LABELS[role as EngagementRole] ?? role;
  const sign = (s: typeof settings.preparer) =>
    s && !staleSignOffs ? { name: s.name, role: roleLabel(s.role), at: s.at } : null;
  const review: SummaryReview = {
    preparer: sign(settings.preparer),
    reviewer: sign(settings.reviewer),
    staleSignOffs,
    lock: settings.lock
      ? {
          name: settings.lock.name,
          at: settings.lock.at,
          workpaperSha256: settings.lock.workpaperSha256,
          workpaperBytes: settings.lock.workpaperBytes,
          reference: settings.lock.reference,
        }
      : null,
    openNotes,
    reviewerBlocker:
      summaryReviewerSignOffBlocker({
        preparerSigned: settings.preparer !== null,
        rowsChanged: staleSignOffs,
        openNotes,
      })?.message ?? null,
    lockable: lockability(samples, openNotes, sign(settings.reviewer) !== null),
  };
  return {
    engagement: {
      id: engagement.id,
      clientName: engagement.clientName,
      name: engagement.name,
      periodEnd: engagement.periodEnd,
      currency: engagement.currency,
    },
    firmName: firm ?? "",
    workpaperReference: summaryReferenceFor(engagementId),
    generatedAt: new Date().toISOString(),
    materiality,
    rows,
    totals,
    status,
    samples,
    entries: entries.map((e) => ({
      id: e.id,
      version: e.version,
      reference: entryReference(e.id),
      createdByName: e.createdByName,
      createdAt: e.createdAt,
      updatedAt: e.updatedAt,
    })),
    review,
    notes,
    trail,
    rowsSha256,
    conventions: CONVENTIONS,
    caution: SUMMARY_CAUTION,
  };
}

function lockability(samples: SummarySampleLine[], openNotes: number, reviewed: boolean) {
  const reasons: string[] = [];
  const unlocked = samples.filter((s) => s.state === "contributes" && !s.locked);
  if (unlocked.length)
    reasons.push(
      `Every sample feeding the summary must be locked first: ${unlocked.map((s) => s.reference).join(", ")} ${unlocked.length === 1 ? "is" : "are"} not.`,
    );
  if (openNotes) reasons.push(`${openNotes} review note${openNotes === 1 ? " is" : "s are"} not cleared.`);
  if (!reviewed) reasons.push("A manager or partner must sign off as reviewer.");
  return { ok: reasons.length === 0, reasons };
}

/** What the page, API, workbook and PDF print: the view frozen at lock while locked, else the live one. */
export async function loadSummaryView(db: Knex, { engagementId }: { engagementId: number }): Promise<SummaryView> {
  const settings = await getSummaryByEngagementId(db, { engagementId });
  if (settings.lock && settings.lockedView) {
    const frozen = settings.lockedView;
    const { objectKey: _k, ...lock } = settings.lock;
    return {
      ...frozen,
      review: {
        ...frozen.review,
        lock,
        reviewerBlocker: "The summary is locked.",
        lockable: { ok: false, reasons: ["The summary is locked."] },
      },
    };
  }
  return buildLiveSummary(db, { engagementId });
}
