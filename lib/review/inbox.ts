import "server-only";
import type { Knex } from "knex";

/** Why a sample waits for the signed-in user. */
export type InboxReason = "review" | "lock" | "answer" | "clear";

export interface InboxEntry {
  engagementId: number;
  clientName: string;
  engagementName: string;
  sampleId: number;
  sampleName: string;
  reason: InboxReason;
  /** Notes behind the reason (open notes to answer, answered notes to clear); 0 for review and lock. */
  notes: number;
  /** Since when it waits: the sign-off, or the oldest such note. */
  since: string;
}

export interface Inbox {
  entries: InboxEntry[];
  counts: Record<InboxReason, number> & { total: number };
}

const REVIEWER_ROLES = ["manager", "partner"];
const PREPARER_ROLES = ["staff", "senior"];
const iso = (v: unknown) => new Date(v as string).toISOString();

/**
 * Every unlocked sample, across the user's engagements, waiting for them: as a reviewer (manager or
 * partner on the engagement) a preparer's sign-off to review, a reviewed sample to lock, answered
 * notes they raised to clear; as a preparer (staff or senior) open notes to answer.
 */
export async function getInboxByUserId(db: Knex, { userId }: { userId: number }): Promise<Inbox> {
  const mine = (q: Knex.QueryBuilder, roles: string[]) =>
    q
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
  const [toReview, toLock, toAnswer, toClear] = await Promise.all([
    mine(db("samples as s"), REVIEWER_ROLES)
      .whereNotNull("s.preparer_signed_at")
      .whereNull("s.reviewer_signed_at")
      .select("s.preparer_signed_at as since"),
    mine(db("samples as s"), REVIEWER_ROLES)
      .whereNotNull("s.reviewer_signed_at")
      .select("s.reviewer_signed_at as since"),
    mine(db("samples as s"), PREPARER_ROLES)
      .join("review_notes as n", "n.sample_id", "s.id")
      .where("n.status", "open")
      .whereNot("n.raised_by", userId)
      .groupBy("s.id", "s.name", "e.id", "e.client_name", "e.name")
      .select(db.raw("count(*) as notes"), db.raw("min(n.raised_at) as since")),
    mine(db("samples as s"), REVIEWER_ROLES)
      .join("review_notes as n", "n.sample_id", "s.id")
      .where({ "n.status": "answered", "n.raised_by": userId })
      .groupBy("s.id", "s.name", "e.id", "e.client_name", "e.name")
      .select(db.raw("count(*) as notes"), db.raw("min(n.answered_at) as since")),
  ]);
  const entries: InboxEntry[] = [];
  const add = (rows: Record<string, unknown>[], reason: InboxReason) => {
    for (const r of rows)
      entries.push({
        engagementId: Number(r.engagement_id),
        clientName: String(r.client_name),
        engagementName: String(r.engagement_name),
        sampleId: Number(r.sample_id),
        sampleName: String(r.sample_name),
        reason,
        notes: Number(r.notes ?? 0),
        since: iso(r.since),
      });
  };
  add(toReview, "review");
  add(toClear, "clear");
  add(toAnswer, "answer");
  add(toLock, "lock");
  entries.sort((a, b) => a.since.localeCompare(b.since));
  const count = (reason: InboxReason) => entries.filter((e) => e.reason === reason).length;
  const counts = {
    review: count("review"),
    lock: count("lock"),
    answer: count("answer"),
    clear: count("clear"),
    total: entries.length,
  };
  return { entries, counts };
}
