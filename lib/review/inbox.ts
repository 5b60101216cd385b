import "server-only";
import type { Knex } from "knex";
import {
  listNotesToAnswerByUserId,
  listNotesToClearByUserId,
  listSamplesToLockByUserId,
  listSamplesToReviewByUserId,
  type WaitingSample,
} from "@/lib/data/review-inbox";

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

/**
 * Every unlocked sample, across the user's engagements, waiting for them: as a reviewer (manager or
 * partner on the engagement) a preparer's sign-off to review, a reviewed sample to lock, answered
 * notes they raised to clear; as a preparer (staff or senior) open notes to answer.
 */
export async function getInboxByUserId(db: Knex, { userId }: { userId: number }): Promise<Inbox> {
  const [toReview, toLock, toAnswer, toClear] = await Promise.all([
    listSamplesToReviewByUserId(db, { userId }),
    listSamplesToLockByUserId(db, { userId }),
    listNotesToAnswerByUserId(db, { userId }),
    listNotesToClearByUserId(db, { userId }),
  ]);
  const entries: InboxEntry[] = [];
  const add = (rows: WaitingSample[], reason: InboxReason) => {
    for (const r of rows) entries.push({ ...r, reason });
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
