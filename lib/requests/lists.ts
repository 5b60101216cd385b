import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { getCurrentDraw, type SampleRecord } from "@/lib/data/samples";
import { AppError, conflict, fieldError } from "@/lib/errors";
import { assertSampleUnlocked } from "@/lib/samples/guard";
import type { CreateRequestList } from "@/lib/validation/requests";
import { getMembershipRole } from "@/lib/data/members";
import {
  closeRequestListsByIds,
  insertRequestList,
  lockOpenRequestListIdsBySampleId,
  type RequestListRow,
} from "@/lib/data/request-lists";
import { insertRequestItems } from "@/lib/data/request-items";
import { listLiveItemIdsByDrawId } from "@/lib/data/sample-items";
import { utcDay } from "./status";

/**
 * Creates a request list from the sample's current draw: the chosen items (or all that are not
 * void), each asking for the same things, addressed to a client contact of the engagement.
 * Refused when the sample is locked (409), not drawn (409), or the contact or an item is not valid (400 naming it).
 */
export async function createRequestList(
  db: Knex,
  { sample, actorId, input }: { sample: SampleRecord; actorId: number; input: CreateRequestList },
) {
  if (input.dueDate < utcDay())
    throw fieldError("dueDate", "the due date is in the past", "The due date is in the past");
  return db.transaction(async (trx) => {
    await assertSampleUnlocked(trx, sample.id);
    const draw = await getCurrentDraw(trx, { sampleId: sample.id });
    if (!draw) throw conflict("Draw the sample before asking the client for evidence on its items.");
    const contactRole = await getMembershipRole(trx, {
      engagementId: sample.engagementId,
      userId: input.contactUserId,
    });
    if (contactRole !== "client")
      throw fieldError(
        "contactUserId",
        "that person is not a client contact of this engagement",
        "Not a client contact of this engagement: invite them first",
      );
    const drawnIds = await listLiveItemIdsByDrawId(trx, { drawId: draw.id });
    const chosen = input.items === "all" ? drawnIds : [...new Set(input.items)];
    const stray = chosen.filter((id) => !drawnIds.includes(id));
    if (stray.length)
      throw fieldError(
        "items",
        `item ${stray[0]} is not a live item of this sample's current draw`,
        `Item ${stray[0]} is not a live item of this sample`,
      );
    const ordered = drawnIds.filter((id) => chosen.includes(id));
    const listId = await insertRequestList(trx, {
      engagementId: sample.engagementId,
      sampleId: sample.id,
      title: input.title,
      message: input.message ?? null,
      contactUserId: input.contactUserId,
      dueDate: input.dueDate,
      showBookValues: input.showBookValues,
      createdBy: actorId,
    });
    await insertRequestItems(trx, {
      listId,
      sampleItemIds: ordered,
      needs: input.needs,
      needsNote: input.needsNote ?? null,
    });
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId: sample.engagementId,
      sampleId: sample.id,
      entity: "request_list",
      entityId: listId,
      action: "create",
      after: {
        title: input.title,
        contactUserId: input.contactUserId,
        dueDate: input.dueDate,
        showBookValues: input.showBookValues,
        items: ordered.length,
        needs: input.needs,
        needsNote: input.needsNote ?? null,
      },
    });
    return listId;
  });
}

/**
 * A locked sample closes its open request lists (inside the lock's transaction); each closing is in
 * the audit log. Returns the ids it closed (their contacts are told after the commit).
 */
export async function closeRequestListsOfSample(
  trx: Knex.Transaction,
  {
    sampleId,
    engagementId,
    actorId,
    reason,
  }: { sampleId: number; engagementId: number; actorId: number; reason: string },
): Promise<number[]> {
  const open = await lockOpenRequestListIdsBySampleId(trx, { sampleId });
  if (open.length === 0) return [];
  await closeRequestListsByIds(trx, { listIds: open, reason });
  for (const id of open) {
    await recordAudit(trx, {
      actorUserId: actorId,
      engagementId,
      sampleId,
      entity: "request_list",
      entityId: id,
      action: "close",
      before: { status: "open" },
      after: { status: "closed", reason },
    });
  }
  return open;
}

export const CLOSED_BY_LOCK = "The sample was locked: its workpaper is final.";

/** The message a client gets when writing to a closed list. */
export function closedListError(list: Pick<RequestListRow, "closedReason">) {
  return new AppError(
    409,
    "request_list_closed",
    `This request list is closed${list.closedReason ? ` (${list.closedReason.replace(/\.$/, "")})` : ""}: the audit team no longer takes files on it. Contact them if you have more to send.`,
  );
}
