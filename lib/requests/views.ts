import "server-only";
import type { Knex } from "knex";
import { getEngagementById } from "@/lib/data/engagements";
import { notFound } from "@/lib/errors";
import { listRequestItemsByListId } from "@/lib/data/request-items";
import type { RequestListRow } from "@/lib/data/request-lists";

/** What the audit team sees of a list: everything, book values included. */
export async function teamListView(db: Knex, list: RequestListRow) {
  return { list, items: await listRequestItemsByListId(db, { listId: list.id, withBookValues: true }) };
}

/**
 * What the client contact sees of a list: the request itself, the items' references and
 * descriptions, their statuses and files — book values only when the list shows them, and nothing
 * of the sample's results, evaluation, review notes or the team's comments.
 */
export async function clientListView(db: Knex, list: RequestListRow) {
  const [engagement, items] = await Promise.all([
    getEngagementById(db, { engagementId: list.engagementId }),
    listRequestItemsByListId(db, { listId: list.id, withBookValues: list.showBookValues }),
  ]);
  if (!engagement) throw notFound("No such request list");
  return {
    list: {
      id: list.id,
      title: list.title,
      message: list.message,
      dueDate: list.dueDate,
      status: list.status,
      closedReason: list.closedReason,
      showBookValues: list.showBookValues,
      sentBy: list.createdByName,
      createdAt: list.createdAt,
      engagement: { clientName: engagement.clientName, name: engagement.name, currency: engagement.currency },
    },
    items: items.map(({ sampleItemId: _s, files, ...item }) => ({
      ...item,
      files: files.map(({ decidedByName: _d, evidenceId: _e, ...file }) => file),
    })),
  };
}

export type ClientListView = Awaited<ReturnType<typeof clientListView>>;
export type TeamListView = Awaited<ReturnType<typeof teamListView>>;
