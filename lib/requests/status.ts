import type { RequestItemStatus } from "@/lib/validation/requests";

export type RequestEvent = "client-upload" | "file-accepted" | "file-returned";

/**
 * An item's request status after an event (pure). A client upload makes it "provided" (even after
 * "needs more"); an accepted file makes it "accepted", which no later event undoes; a returned
 * file makes it "needs more" unless another of the client's files still awaits the team.
 * @throws RangeError when the client uploads to an item already accepted.
 */
export function itemStatusAfter(
  current: RequestItemStatus,
  event: RequestEvent,
  { pendingLeft }: { pendingLeft: number },
): RequestItemStatus {
  if (event === "client-upload") {
    if (current === "accepted") throw new RangeError("status: this item was accepted; nothing more is needed for it");
    return "provided";
  }
  if (current === "accepted" || event === "file-accepted") return "accepted";
  return pendingLeft > 0 ? "provided" : "needs-more";
}

/** Still waiting on the client: nothing provided yet, or sent back. */
export const awaitsClient = (status: RequestItemStatus) => status === "requested" || status === "needs-more";

/** Overdue on `today` (YYYY-MM-DD): an open list past its due date with the item still awaiting the client. */
export function isOverdue(
  { listOpen, dueDate, status }: { listOpen: boolean; dueDate: string; status: RequestItemStatus },
  today: string,
): boolean {
  return listOpen && dueDate < today && awaitsClient(status);
}

/** Today's date in UTC as YYYY-MM-DD (the job's day). */
export const utcDay = (at: Date = new Date()) => at.toISOString().slice(0, 10);
