import "server-only";
import type { Knex } from "knex";
import type { EngagementRole } from "@/lib/auth/roles";

// What waits for a person across their engagements' unlocked samples (read by lib/review/inbox.ts).

export interface WaitingSample {
  engagementId: number;
  clientName: string;
  engagementName: string;
  sampleId: number;
  sampleName: string;
  /** Notes behind it (0 for a sign-off or a lock). */
  notes: number;
  since: string;
}

const REVIEWER_ROLES: EngagementRole[] = ["manager", "partner"];
const PREPARER_ROLES: EngagementRole[] = ["staff", "senior"];

/** Unlocked samples of the engagements where the user holds one of the roles. */
function unlockedSamplesOf(db: Knex | Knex.Transaction, userId: number, roles: EngagementRole[]) {
  return db("samples as s")
    .join("engagement_members as m", (j) =>
      j.on("m.engagement_id", "s.engagement_id").andOn("m.user_id", db.raw("?", [userId])),
    )
    .join("engagements as e", "e.id", "s.engagement_id")
    .whereIn("m.role", roles)
    .whereNull("s.locked_at")
    .select(
      "s.id as sample_id",
      "s.name as sample_name",
      "e.id as engagement_id",
      "e.client_name",
      "e.name as engagement_name",
    );
}

function toWaiting(rows: Record<string, unknown>[]): WaitingSample[] {
  return rows.map((r) => ({
    engagementId: Number(r.engagement_id),
    clientName: String(r.client_name),
    engagementName: String(r.engagement_name),
    sampleId: Number(r.sample_id),
    sampleName: String(r.sample_name),
    notes: Number(r.notes ?? 0),
    since: new Date(r.since instanceof Date ? r.since : String(r.since)).toISOString(),
  }));
}

/** As a manager or partner: samples the preparer signed off and no reviewer has yet. */
export async function listSamplesToReviewByUserId(db: Knex | Knex.Transaction, { userId }: { userId: number }) {
  const rows = await unlockedSamplesOf(db, userId, REVIEWER_ROLES)
    .whereNotNull("s.preparer_signed_at")
    .whereNull("s.reviewer_signed_at")
    .select("s.preparer_signed_at as since");
  return toWaiting(rows);
}

/** As a manager or partner: reviewed samples still to lock. */
export async function listSamplesToLockByUserId(db: Knex | Knex.Transaction, { userId }: { userId: number }) {
  const rows = await unlockedSamplesOf(db, userId, REVIEWER_ROLES)
    .whereNotNull("s.reviewer_signed_at")
    .select("s.reviewer_signed_at as since");
  return toWaiting(rows);
}

/** As staff or senior: samples with open notes raised by someone else, since the oldest. */
export async function listNotesToAnswerByUserId(db: Knex | Knex.Transaction, { userId }: { userId: number }) {
  const rows = await unlockedSamplesOf(db, userId, PREPARER_ROLES)
    .join("review_notes as n", "n.sample_id", "s.id")
    .where("n.status", "open")
    .whereNot("n.raised_by", userId)
    .groupBy("s.id", "s.name", "e.id", "e.client_name", "e.name")
    .select(db.raw("count(*) as notes"), db.raw("min(n.raised_at) as since"));
  return toWaiting(rows);
}

/** As a manager or partner: samples with answered notes the user raised, since the oldest answer. */
export async function listNotesToClearByUserId(db: Knex | Knex.Transaction, { userId }: { userId: number }) {
  const rows = await unlockedSamplesOf(db, userId, REVIEWER_ROLES)
    .join("review_notes as n", "n.sample_id", "s.id")
    .where({ "n.status": "answered", "n.raised_by": userId })
    .groupBy("s.id", "s.name", "e.id", "e.client_name", "e.name")
    .select(db.raw("count(*) as notes"), db.raw("min(n.answered_at) as since"));
  return toWaiting(rows);
}
